import { randomBytes } from 'node:crypto';
import { z } from 'zod';

const bool = z
  .enum(['true', 'false', '1', '0', 'yes', 'no'])
  .transform((v) => v === 'true' || v === '1' || v === 'yes');

const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'test', 'production']).default('development'),
  HOST: z.string().default('127.0.0.1'),
  PORT: z.coerce.number().int().min(0).max(65535).default(4300),
  DATABASE_URL: z.string().url('DATABASE_URL must be a postgres:// URL'),
  DATABASE_POOL_MAX: z.coerce.number().int().min(1).max(100).default(10),
  SESSION_SECRET: z.string().min(16, 'SESSION_SECRET must be at least 16 characters').optional(),
  SESSION_IDLE_MINUTES: z.coerce.number().int().min(1).default(8 * 60),
  COOKIE_SECURE: bool.default(false),
  TRUST_PROXY: z.string().default('false'),
  SIGNIN_LIMIT_PER_ACCOUNT: z.coerce.number().int().min(1).default(10),
  SIGNIN_LIMIT_PER_ADDRESS: z.coerce.number().int().min(1).default(100),
  SIGNIN_LIMIT_WINDOW_S: z.coerce.number().int().min(1).default(15 * 60),
  SMTP_HOST: z.string().default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().min(1).max(65535).default(1025),
  MAIL_FROM: z.string().default('Parapet <parapet@parapet.example>'),
  MAILDEV_WEB_URL: z.string().optional(),
  PUBLIC_URL: z.string().optional(),
  CLIENT_DIST: z.string().default('dist'),
  PARAPET_DEMO_PASSWORD: z.string().default('parapet-demo'),
  LOG_REQUESTS: bool.default(false),
  INGEST_RATE_LIMIT_PER_MIN: z.coerce.number().int().min(1).default(120),
  INGEST_BODY_LIMIT: z.string().default('64kb'),
  HEALTH_CHECK_INTERVAL_MS: z.coerce.number().int().min(50).default(10_000),
  JOBS_ENABLED: bool.default(true),
  RAW_RETENTION_DAYS: z.coerce.number().int().min(1).default(14),
  ROLLUP_RETENTION_DAYS: z.coerce.number().int().min(1).default(400),
  PARTITION_DAYS_AHEAD: z.coerce.number().int().min(1).max(60).default(7),
  SOCKET_ADAPTER: z.enum(['postgres', 'memory']).default('postgres'),
  FIGURES_THROTTLE_MS: z.coerce.number().int().min(0).default(2000),
});

export interface Config {
  env: 'development' | 'test' | 'production';
  host: string;
  port: number;
  databaseUrl: string;
  databasePoolMax: number;
  sessionSecret: string;
  sessionIdleMs: number;
  cookieSecure: boolean;
  trustProxy: boolean | number | string;
  signInLimitPerAccount: number;
  signInLimitPerAddress: number;
  signInLimitWindowMs: number;
  smtpHost: string;
  smtpPort: number;
  mailFrom: string;
  maildevWebUrl: string | null;
  publicUrl: string;
  clientDist: string;
  demoPassword: string;
  logRequests: boolean;
  ingestRateLimitPerMin: number;
  ingestBodyLimit: string;
  /** How often the silence check, roll-ups and partition upkeep run. */
  healthCheckIntervalMs: number;
  jobsEnabled: boolean;
  rawRetentionDays: number;
  rollupRetentionDays: number;
  partitionDaysAhead: number;
  socketAdapter: 'postgres' | 'memory';
  figuresThrottleMs: number;
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
    cookieSecure: e.COOKIE_SECURE,
    trustProxy: parseTrustProxy(e.TRUST_PROXY),
    signInLimitPerAccount: e.SIGNIN_LIMIT_PER_ACCOUNT,
    signInLimitPerAddress: e.SIGNIN_LIMIT_PER_ADDRESS,
    signInLimitWindowMs: e.SIGNIN_LIMIT_WINDOW_S * 1000,
    smtpHost: e.SMTP_HOST,
    smtpPort: e.SMTP_PORT,
    mailFrom: e.MAIL_FROM,
    maildevWebUrl: e.MAILDEV_WEB_URL ?? null,
    publicUrl: e.PUBLIC_URL ?? `http://${e.HOST}:${e.PORT}`,
    clientDist: e.CLIENT_DIST,
    demoPassword: e.PARAPET_DEMO_PASSWORD,
    logRequests: e.LOG_REQUESTS,
    ingestRateLimitPerMin: e.INGEST_RATE_LIMIT_PER_MIN,
    ingestBodyLimit: e.INGEST_BODY_LIMIT,
    healthCheckIntervalMs: e.HEALTH_CHECK_INTERVAL_MS,
    jobsEnabled: e.JOBS_ENABLED,
    rawRetentionDays: e.RAW_RETENTION_DAYS,
    rollupRetentionDays: e.ROLLUP_RETENTION_DAYS,
    partitionDaysAhead: e.PARTITION_DAYS_AHEAD,
    socketAdapter: e.SOCKET_ADAPTER,
    figuresThrottleMs: e.FIGURES_THROTTLE_MS,
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
