import { AsyncLocalStorage } from 'node:async_hooks';
import type { NextFunction, Request, Response } from 'express';
import type { Model, ModelStatic, Transaction } from 'sequelize';
import { Link, Neighbourhood, Node, Radio, Site, User } from '../models';
import { auditDiff } from './auditDiff';
import { type ChangeRecord, recordChanges, rememberHookEntry } from './changeHistory';

// Every change to the inventory and to people is recorded once, here, by model hooks; the person
// acting comes from the request (AsyncLocalStorage), so route handlers need not pass it along.
// Heartbeats and health rules write with plain SQL or outside a request, so they never pass through.

interface AuditStore {
  actorId: number | null;
}
const store = new AsyncLocalStorage<AuditStore>();

/** Express middleware, after the session: changes made while handling this request are signed with its actor. */
export function auditContext(req: Request, _res: Response, next: NextFunction) {
  store.run({ actorId: (req.user as { id?: number } | undefined)?.id ?? null }, next);
}

/** Audited tables and the fields that are state, not inventory (written by health rules, never by people). */
export const AUDITED: Record<string, { model: () => ModelStatic<Model>; ignore: string[] }> = {
  sites: { model: () => Site, ignore: [] },
  nodes: {
    model: () => Node,
    ignore: ['state', 'stateSince', 'lastSeenAt', 'firstSeenAt', 'lastSeq', 'lastReport', 'healthStreak', 'healthReason', 'drift'],
  },
  radios: { model: () => Radio, ignore: [] },
  links: { model: () => Link, ignore: [] },
  neighbourhoods: { model: () => Neighbourhood, ignore: [] },
  users: { model: () => User, ignore: [] },
};
export type AuditedTable = keyof typeof AUDITED;
export const AUDITED_TABLES = Object.keys(AUDITED);

type Action = 'create' | 'update' | 'delete';
interface HookOptions {
  transaction?: Transaction | null;
}

async function write(table: string, action: Action, instance: Model, options: HookOptions) {
  const ctx = store.getStore();
  if (!ctx) return; // not a person's change (health rules, jobs)
  // Attributes only: an instance loaded with its parent (a radio with its node) must not log the parent.
  const attributes = Object.keys((instance.constructor as ModelStatic<Model>).getAttributes());
  const pick = (row: Record<string, unknown>) => Object.fromEntries(attributes.map((a) => [a, row[a]]));
  const now = pick(instance.get({ plain: false }) as Record<string, unknown>);
  const before =
    action === 'create'
      ? null
      : action === 'delete'
        ? now
        : pick((instance as unknown as { _previousDataValues: Record<string, unknown> })._previousDataValues);
  const after = action === 'delete' ? null : now;
  const diff = auditDiff(before, after, AUDITED[table].ignore);
  if (!diff) return;
  const change: ChangeRecord = { tableName: table, recordId: String(instance.get('id')), action, changedBy: ctx.actorId, ...diff };
  const [id] = await recordChanges(instance.sequelize, [change], options.transaction ?? undefined);
  if (options.transaction && id !== undefined) rememberHookEntry(options.transaction, change, id);
}

let installed = false;
/** Adds the hooks once per process (models are classes, shared by every Sequelize instance bound to them). */
export function installAuditHooks() {
  if (installed) return;
  for (const [table, { model }] of Object.entries(AUDITED)) {
    const m = model();
    m.addHook('afterCreate', 'audit', (i: Model, o: HookOptions) => write(table, 'create', i, o));
    m.addHook('afterUpdate', 'audit', (i: Model, o: HookOptions) => write(table, 'update', i, o));
    m.addHook('afterDestroy', 'audit', (i: Model, o: HookOptions) => write(table, 'delete', i, o));
    m.addHook('afterBulkCreate', 'audit', async (rows: Model[], o: HookOptions) => {
      for (const i of rows) await write(table, 'create', i, o);
    });
  }
  installed = true;
}

/** For changes made with bulk statements (assignments, bulk moves), which hooks do not see. */
export async function recordChange(
  transaction: Transaction | undefined,
  table: string,
  recordId: number | string,
  before: Record<string, unknown> | null,
  after: Record<string, unknown> | null,
  reason?: string,
) {
  const ctx = store.getStore();
  const diff = auditDiff(before, after);
  if (!diff) return;
  await recordChanges(
    User.sequelize!,
    [{ tableName: table, recordId, action: before && after ? 'update' : after ? 'create' : 'delete', changedBy: ctx?.actorId ?? null, reason, ...diff }],
    transaction,
  );
}
