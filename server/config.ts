import { randomBytes } from 'node:crypto';
import { z } from 'zod';

const bool = z.enum(['true', 'false', '1', '0', 'yes', 'no']).transform((v) => v === 'true' || v === '1' || v === 'yes');

const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'test', 'production']).default('development'),
  HOST: z.string().default('127.0.0.1'),
  PORT: z.coerce.number().int().min(0).max(65535).default(4300),
  DATABASE_URL: z.string().url('DATABASE_URL must be a postgres:// URL'),
  DATABASE_POOL_MAX: z.coerce.number().int().min(1).max(100).default(10),
  SESSION_SECRET: z.string().min(16, 'SESSION_SECRET must be at least 16 characters').optional(),
  SESSION_IDLE_MINUTES: z.coerce
    .number()
    .int()
    .min(1)
    .default(8 * 60),
  SESSION_ABSOLUTE_HOURS: z.coerce
    .number()
    .min(0.001)
    .default(7 * 24),
  COOKIE_SECURE: bool.default(false),
  TRUST_PROXY: z.string().default('false'),
  SIGNIN_LIMIT_PER_ACCOUNT_ADDRESS: z.coerce.number().int().min(1).default(10),
  SIGNIN_LIMIT_PER_ADDRESS: z.coerce.number().int().min(1).default(100),
  SIGNIN_LIMIT_WINDOW_S: z.coerce
    .number()
    .int()
    .min(1)
    .default(15 * 60),
  SIGNIN_LIMIT_PER_ACCOUNT: z.coerce.number().int().min(1).default(100),
  SIGNIN_ACCOUNT_WINDOW_S: z.coerce.number().int().min(1).default(3600),
  KNOWN_DEVICE_DAYS: z.coerce.number().int().min(1).max(400).default(90),
  PASSWORD_CHANGE_LIMIT: z.coerce.number().int().min(1).default(5),
  PASSWORD_RESET_MIN_MS: z.coerce.number().int().min(0).max(10_000).default(400),
  PARAPET_DEMO: bool.default(false),
  SMTP_HOST: z.string().default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().min(1).max(65535).default(1025),
  MAIL_FROM: z.string().default('Parapet <parapet@parapet.example>'),
  MAILDEV_WEB_URL: z.string().optional(),
  SMTP_SECURE: bool.default(false),
  SMTP_USER: z.string().optional(),
  SMTP_PASS: z.string().optional(),
  SMTP_TIMEOUT_MS: z.coerce.number().int().min(100).default(10_000),
  ALERT_GRACE_S: z.coerce.number().int().min(0).optional(),
  REMINDER_INTERVAL_S: z.coerce
    .number()
    .int()
    .min(1)
    .default(4 * 3600),
  FLAP_MAX_PER_HOUR: z.coerce.number().int().min(1).default(4),
  OUTBOX_MAX_ATTEMPTS: z.coerce.number().int().min(1).max(50).default(6),
  OUTBOX_BACKOFF_BASE_MS: z.coerce.number().int().min(0).default(30_000),
  OUTBOX_BATCH_SIZE: z.coerce.number().int().min(1).max(500).default(25),
  DIGEST_HOUR_LOCAL: z.coerce.number().int().min(0).max(23).default(8),
  DEGRADED_DIGEST_AFTER_S: z.coerce
    .number()
    .int()
    .min(60)
    .default(3 * 3600),
  MAIL_LINK_DAYS: z.coerce.number().int().min(1).max(365).default(60),
  INVITATION_TTL_HOURS: z.coerce
    .number()
    .int()
    .min(1)
    .max(24 * 30)
    .default(72),
  PASSWORD_RESET_TTL_MINUTES: z.coerce
    .number()
    .int()
    .min(5)
    .max(24 * 60)
    .default(60),
  ACCOUNT_MAIL_LIMIT_PER_ADDRESS: z.coerce.number().int().min(1).default(3),
  ACCOUNT_MAIL_LIMIT_WINDOW_S: z.coerce.number().int().min(1).default(3600),
  PUBLIC_URL: z.string().optional(),
  CLIENT_DIST: z.string().default('dist'),
  PARAPET_DEMO_PASSWORD: z.string().default('parapet-demo'),
  LOG_REQUESTS: bool.default(false),
  PUBLIC_STATUS_CACHE_S: z.coerce.number().int().min(0).max(3600).default(30),
  DATA_DIR: z.string().min(1).default('.data/uploads'),
  PHOTO_MAX_BYTES: z.coerce
    .number()
    .int()
    .min(1024)
    .default(8 * 1024 * 1024),
  CSV_IMPORT_MAX_BYTES: z.coerce
    .number()
    .int()
    .min(1024)
    .default(2 * 1024 * 1024),
  CSV_IMPORT_MAX_ROWS: z.coerce.number().int().min(1).default(5000),
  INGEST_RATE_LIMIT_PER_MIN: z.coerce.number().int().min(1).default(120),
  INGEST_BODY_LIMIT: z.string().default('64kb'),
  INGEST_GROUP_WINDOW_MS: z.coerce.number().int().min(0).max(1000).default(4),
  INGEST_GROUP_MAX_REPORTS: z.coerce.number().int().min(1).max(10_000).default(300),
  INGEST_CACHE_MS: z.coerce.number().int().min(0).max(60_000).default(3000),
  HEALTH_CHECK_INTERVAL_MS: z.coerce.number().int().min(50).default(10_000),
  ROOT_CAUSE_WINDOW_S: z.coerce.number().int().min(0).max(3600).default(120),
  JOBS_ENABLED: bool.default(true),
  JOB_TIMINGS_LOG: bool.default(false),
  RAW_RETENTION_DAYS: z.coerce.number().int().min(1).default(14),
  ROLLUP_RETENTION_DAYS: z.coerce.number().int().min(1).default(400),
  PARTITION_DAYS_AHEAD: z.coerce.number().int().min(1).max(60).default(7),
  SOCKET_ADAPTER: z.enum(['postgres', 'memory']).default('postgres'),
  FIGURES_THROTTLE_MS: z.coerce.number().int().min(0).default(2000),
  DATABASE_PROBE_INTERVAL_MS: z.coerce.number().int().min(50).max(60_000).default(1000),
  OUTAGE_MAIL_RETRY_MAX_MS: z.coerce.number().int().min(0).max(60_000).default(30_000),
  LINK_OBSERVED_WINDOW_S: z.coerce
    .number()
    .int()
    .min(1)
    .max(86_400)
    .default(15 * 60),
  LINK_SILENT_AFTER_S: z.coerce
    .number()
    .int()
    .min(60)
    .max(30 * 86_400)
    .default(86_400),
  RADIO_MOVE_SHOW_DAYS: z.coerce.number().int().min(1).max(365).default(7),
  AIR_VIEW_CACHE_MS: z.coerce.number().int().min(0).max(60_000).default(5000),
  RECOVERY_LINK_HOURS: z.coerce
    .number()
    .int()
    .min(1)
    .max(14 * 24)
    .default(48),
});

export interface Config {
  env: 'development' | 'test' | 'production';
  host: string;
  port: number;
  databaseUrl: string;
  databasePoolMax: number;
  sessionSecret: string;
  sessionIdleMs: number;
  /** A session ends this long after sign-in, however busy it is. */
  sessionAbsoluteMs: number;
  cookieSecure: boolean;
  trustProxy: boolean | number | string;
  /** Failed sign-ins per (account, address) within signInLimitWindowMs: a stranger locks out only themself. */
  signInLimitPerAccountAddress: number;
  signInLimitPerAddress: number;
  signInLimitWindowMs: number;
  /** Failed sign-ins per account from anywhere within signInAccountWindowMs; browsers that signed in to it before are exempt. */
  signInLimitPerAccount: number;
  signInAccountWindowMs: number;
  knownDeviceMs: number;
  /** Wrong current passwords per person within signInLimitWindowMs when changing the password. */
  passwordChangeLimit: number;
  /** Every reset request takes at least this long, whether or not the address has an account. */
  passwordResetMinMs: number;
  /** Set by start.sh for the demo: only then is the published demo password accepted as a new password. */
  demoMode: boolean;
  smtpHost: string;
  smtpPort: number;
  mailFrom: string;
  maildevWebUrl: string | null;
  smtpSecure: boolean;
  smtpUser: string | null;
  smtpPass: string | null;
  smtpTimeoutMs: number;
  /** Seconds from a node's last report before its first outage mail; null = the moment it goes offline. */
  alertGraceS: number | null;
  reminderIntervalS: number;
  /** Outage mails per node and person in any hour before one summary replaces the rest. */
  flapMaxPerHour: number;
  outboxMaxAttempts: number;
  outboxBackoffBaseMs: number;
  outboxBatchSize: number;
  /** Local hour (network time zone) of the daily digest of degraded nodes. */
  digestHourLocal: number;
  degradedDigestAfterS: number;
  /** How long preference and unsubscribe links in mail stay valid. */
  mailLinkDays: number;
  /** How long an invitation link and a password-reset link stay valid. */
  invitationTtlMs: number;
  passwordResetTtlMs: number;
  /** Invitation and reset mails per e-mail address within the window (per instance). */
  accountMailLimitPerAddress: number;
  accountMailLimitWindowMs: number;
  publicUrl: string;
  clientDist: string;
  demoPassword: string;
  logRequests: boolean;
  /** Seconds one computation of the public status page is served to everyone. */
  publicStatusCacheS: number;
  /** Where uploaded files live (photos under `photos/`). */
  dataDir: string;
  photoMaxBytes: number;
  csvImportMaxBytes: number;
  csvImportMaxRows: number;
  ingestRateLimitPerMin: number;
  ingestBodyLimit: string;
  /** Group commit: concurrent reports wait at most this long, or until this many are queued, and are stored in one statement. */
  ingestGroupWindowMs: number;
  ingestGroupMaxReports: number;
  /** How long ingest trusts its cached token, threshold and inventory lookups (a revoked token stops within this on every instance). */
  ingestCacheMs: number;
  /** How often the silence check, roll-ups and partition upkeep run. */
  healthCheckIntervalMs: number;
  /** Nodes whose last reports lie this close together are judged as one silence (root cause and stranded behind it). */
  rootCauseWindowS: number;
  jobsEnabled: boolean;
  /** Log how long each silence-check tick took (for load runs). */
  jobTimingsLog: boolean;
  rawRetentionDays: number;
  rollupRetentionDays: number;
  partitionDaysAhead: number;
  socketAdapter: 'postgres' | 'memory';
  figuresThrottleMs: number;
  /** While PostgreSQL is unreachable, how often one probe asks whether it is back. */
  databaseProbeIntervalMs: number;
  /** Longest wait between tries of an outage mail (other mail backs off up to six hours). */
  outageMailRetryMaxMs: number;
  /** A link is observed while a report named its peer within this many seconds. */
  linkObservedWindowS: number;
  /** A link whose ends have known MACs and that nobody observed for this long is "planned but silent". */
  linkSilentAfterS: number;
  /** How long a radio seen moving between nodes stays on the overview and node pages. */
  radioMoveShowDays: number;
  /** How long the map and the overview share one computed air view (inventory edits through this process forget it at once). */
  airViewCacheMs: number;
  /** How long the host recovery link in outage mail stays valid. */
  recoveryLinkHours: number;
  /** The clock every rule reads; tests replace it. */
  now: () => Date;
}

/** All settings come from the environment, validated once; tests pass overrides. */
export function loadConfig(env: Record<string, string | undefined> = process.env, overrides: Partial<Config> = {}): Config {
  const parsed = envSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`).join('\n');
    throw new Error(`Parapet's settings are invalid:\n${lines}`);
  }
  const e = parsed.data;
  if (!e.SESSION_SECRET && e.NODE_ENV === 'production') throw new Error('SESSION_SECRET is required in production');
  return {
    env: e.NODE_ENV,
    host: e.HOST,
    port: e.PORT,
    databaseUrl: e.DATABASE_URL,
    databasePoolMax: e.DATABASE_POOL_MAX,
    sessionSecret: e.SESSION_SECRET ?? randomBytes(32).toString('hex'),
    sessionIdleMs: e.SESSION_IDLE_MINUTES * 60_000,
    sessionAbsoluteMs: Math.round(e.SESSION_ABSOLUTE_HOURS * 3_600_000),
    cookieSecure: e.COOKIE_SECURE,
    trustProxy: parseTrustProxy(e.TRUST_PROXY),
    signInLimitPerAccountAddress: e.SIGNIN_LIMIT_PER_ACCOUNT_ADDRESS,
    signInLimitPerAddress: e.SIGNIN_LIMIT_PER_ADDRESS,
    signInLimitWindowMs: e.SIGNIN_LIMIT_WINDOW_S * 1000,
    signInLimitPerAccount: e.SIGNIN_LIMIT_PER_ACCOUNT,
    signInAccountWindowMs: e.SIGNIN_ACCOUNT_WINDOW_S * 1000,
    knownDeviceMs: e.KNOWN_DEVICE_DAYS * 86_400_000,
    passwordChangeLimit: e.PASSWORD_CHANGE_LIMIT,
    passwordResetMinMs: e.PASSWORD_RESET_MIN_MS,
    demoMode: e.PARAPET_DEMO,
    smtpHost: e.SMTP_HOST,
    smtpPort: e.SMTP_PORT,
    mailFrom: e.MAIL_FROM,
    maildevWebUrl: e.MAILDEV_WEB_URL ?? null,
    smtpSecure: e.SMTP_SECURE,
    smtpUser: e.SMTP_USER ?? null,
    smtpPass: e.SMTP_PASS ?? null,
    smtpTimeoutMs: e.SMTP_TIMEOUT_MS,
    alertGraceS: e.ALERT_GRACE_S ?? null,
    reminderIntervalS: e.REMINDER_INTERVAL_S,
    flapMaxPerHour: e.FLAP_MAX_PER_HOUR,
    outboxMaxAttempts: e.OUTBOX_MAX_ATTEMPTS,
    outboxBackoffBaseMs: e.OUTBOX_BACKOFF_BASE_MS,
    outboxBatchSize: e.OUTBOX_BATCH_SIZE,
    digestHourLocal: e.DIGEST_HOUR_LOCAL,
    degradedDigestAfterS: e.DEGRADED_DIGEST_AFTER_S,
    mailLinkDays: e.MAIL_LINK_DAYS,
    invitationTtlMs: e.INVITATION_TTL_HOURS * 3_600_000,
    passwordResetTtlMs: e.PASSWORD_RESET_TTL_MINUTES * 60_000,
    accountMailLimitPerAddress: e.ACCOUNT_MAIL_LIMIT_PER_ADDRESS,
    accountMailLimitWindowMs: e.ACCOUNT_MAIL_LIMIT_WINDOW_S * 1000,
    publicUrl: e.PUBLIC_URL ?? `http://${e.HOST}:${e.PORT}`,
    clientDist: e.CLIENT_DIST,
    demoPassword: e.PARAPET_DEMO_PASSWORD,
    logRequests: e.LOG_REQUESTS,
    publicStatusCacheS: e.PUBLIC_STATUS_CACHE_S,
    dataDir: e.DATA_DIR,
    photoMaxBytes: e.PHOTO_MAX_BYTES,
    csvImportMaxBytes: e.CSV_IMPORT_MAX_BYTES,
    csvImportMaxRows: e.CSV_IMPORT_MAX_ROWS,
    ingestRateLimitPerMin: e.INGEST_RATE_LIMIT_PER_MIN,
    ingestBodyLimit: e.INGEST_BODY_LIMIT,
    ingestGroupWindowMs: e.INGEST_GROUP_WINDOW_MS,
    ingestGroupMaxReports: e.INGEST_GROUP_MAX_REPORTS,
    ingestCacheMs: e.INGEST_CACHE_MS,
    healthCheckIntervalMs: e.HEALTH_CHECK_INTERVAL_MS,
    rootCauseWindowS: e.ROOT_CAUSE_WINDOW_S,
    jobsEnabled: e.JOBS_ENABLED,
    jobTimingsLog: e.JOB_TIMINGS_LOG,
    rawRetentionDays: e.RAW_RETENTION_DAYS,
    rollupRetentionDays: e.ROLLUP_RETENTION_DAYS,
    partitionDaysAhead: e.PARTITION_DAYS_AHEAD,
    socketAdapter: e.SOCKET_ADAPTER,
    figuresThrottleMs: e.FIGURES_THROTTLE_MS,
    databaseProbeIntervalMs: e.DATABASE_PROBE_INTERVAL_MS,
    outageMailRetryMaxMs: e.OUTAGE_MAIL_RETRY_MAX_MS,
    linkObservedWindowS: e.LINK_OBSERVED_WINDOW_S,
    linkSilentAfterS: e.LINK_SILENT_AFTER_S,
    radioMoveShowDays: e.RADIO_MOVE_SHOW_DAYS,
    airViewCacheMs: e.AIR_VIEW_CACHE_MS,
    recoveryLinkHours: e.RECOVERY_LINK_HOURS,
    now: () => new Date(),
    ...overrides,
  };
}

/** Express's `trust proxy`: false, true, a hop count, or addresses like "loopback". */
function parseTrustProxy(v: string): boolean | number | string {
  if (v === 'false' || v === '') return false;
  if (v === 'true') return true;
  if (/^\d+$/.test(v)) return Number(v);
  return v;
}
