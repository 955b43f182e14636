import { randomUUID } from 'node:crypto';
import request from 'supertest';
import type { Sequelize } from 'sequelize';
import { afterAll, beforeAll, expect } from 'vitest';
import type { Role } from '../../shared/enums';
import { createApp } from '../../server/app';
import { loadConfig, type Config } from '../../server/config';
import { createSequelize } from '../../server/db/sequelize';
import { hashPassword } from '../../server/auth/passwords';
import { User } from '../../server/models';

export const PASSWORD = 'correct-horse-battery-staple';
let passwordHash: Promise<string> | null = null;

export interface TestContext {
  app: ReturnType<typeof createApp>['app'];
  sequelize: Sequelize;
  config: Config;
}

/** A real app on the migrated test database, emptied before the file's tests run. */
export function useApi(overrides: Partial<Config> = {}): TestContext {
  const ctx = {} as TestContext;
  let close: () => Promise<void>;
  beforeAll(async () => {
    ctx.config = loadConfig(
      { ...process.env, NODE_ENV: 'test', SIGNIN_LIMIT_PER_ACCOUNT: '1000', SIGNIN_LIMIT_PER_ACCOUNT_ADDRESS: '1000', SIGNIN_LIMIT_PER_ADDRESS: '10000' },
      overrides,
    );
    ctx.sequelize = createSequelize(ctx.config.databaseUrl, 4);
    const made = createApp({ config: ctx.config, sequelize: ctx.sequelize });
    ctx.app = made.app;
    close = made.close;
    await truncateAll(ctx.sequelize);
  });
  afterAll(async () => {
    await close?.();
    await ctx.sequelize?.close();
  });
  return ctx;
}

export async function truncateAll(sequelize: Sequelize) {
  const [rows] = await sequelize.query(
    `SELECT tablename FROM pg_tables WHERE schemaname = 'public' AND tablename NOT IN ('sequelize_meta', 'network_settings')`,
  );
  const names = (rows as { tablename: string }[]).map((r) => `"${r.tablename}"`).join(', ');
  if (names) await sequelize.query(`TRUNCATE ${names} RESTART IDENTITY CASCADE`);
}

export const unique = (prefix: string) => `${prefix}-${randomUUID().slice(0, 8)}`;

export async function buildUser(overrides: Partial<{ role: Role; email: string; name: string; active: boolean; phone: string }> = {}) {
  passwordHash ??= hashPassword(PASSWORD);
  return User.create({
    email: overrides.email ?? `${unique('person')}@example.test`,
    name: overrides.name ?? unique('Person'),
    role: overrides.role ?? 'operator',
    active: overrides.active ?? true,
    phone: overrides.phone ?? null,
    passwordHash: await passwordHash,
  });
}

export type Agent = ReturnType<typeof request.agent> & { csrf: string; userId: number };

/** A signed-in browser-like client that sends the CSRF token on every call made through `send`. */
export async function signIn(ctx: TestContext, user: User): Promise<Agent> {
  const agent = request.agent(ctx.app) as Agent;
  const res = await agent.post('/api/v1/session').send({ email: user.email, password: PASSWORD });
  if (res.status !== 200) throw new Error(`sign-in failed for ${user.email}: ${res.status} ${JSON.stringify(res.body)}`);
  agent.csrf = res.body.csrfToken;
  agent.userId = user.id;
  return agent;
}

type Method = 'post' | 'patch' | 'put' | 'delete' | 'get';
export function call(agent: Agent | ReturnType<typeof request>, method: Method, url: string, body?: unknown) {
  const req = (agent as ReturnType<typeof request.agent>)[method](url);
  if ('csrf' in agent && method !== 'get') req.set('X-CSRF-Token', (agent as Agent).csrf);
  return body === undefined ? req : req.send(body as object);
}

/** The 401 body every signed-out call gets. */
export const SIGNED_OUT = { code: 'not_signed_in', message: 'Sign in to continue.' };

/** The ids of a list answer, in order. */
export const ids = (body: { data: { id: number }[] }) => body.data.map((r) => r.id);

/** Issues a node's ingest token as an admin would, for tests that post heartbeats. */
export async function ingestTokenFor(ctx: TestContext, nodeId: number) {
  const admin = await signIn(ctx, await buildUser({ role: 'admin' }));
  const res = await call(admin, 'post', `/api/v1/nodes/${nodeId}/ingest-token`);
  expect(res.status).toBe(201);
  return res.body.token as string;
}

/** Posts a report or a batch with a node's bearer token. */
export const postReports = (ctx: TestContext, token: string, body: unknown) =>
  request(ctx.app)
    .post('/api/v1/heartbeats')
    .set('Authorization', `Bearer ${token}`)
    .send(body as object);
