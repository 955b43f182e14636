import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { NodeState } from '../../shared/enums';
import type { recordTransition } from './nodeHealth';

export interface DownMove {
  nodeId: number;
  neighbourhoodId: number;
  hostUserId: number | null;
  /** Never `offline`: a move that closes an outage (and mails) goes through recordTransition. */
  from: NodeState;
  to: 'offline' | 'stranded';
  reason: string;
  /** When the outage began (the first missed report), for moves to offline. */
  outageStartedAt?: Date;
}
type Events = Awaited<ReturnType<typeof recordTransition>>;

/**
 * The silence check's moves of many nodes at once, in the caller's transaction and in a fixed
 * number of statements whatever their count: the nodes' new state, one transition row each, and
 * an outage for each node going offline (none when one is already open). Same rows and events as
 * recordTransition gives one by one for these moves; moves out of offline are refused.
 */
export async function recordDownMoves(sequelize: Sequelize, moves: DownMove[], at: Date, transaction: Transaction): Promise<Events[]> {
  if (!moves.length) return [];
  if (moves.some((m) => m.from === 'offline')) throw new Error('recordDownMoves: a move out of offline closes an outage; use recordTransition');
  const ids = moves.map((m) => m.nodeId);
  const tos = moves.map((m) => m.to);
  const reasons = moves.map((m) => m.reason);
  await sequelize.query(
    `UPDATE nodes n SET state = m.state, state_since = $4, health_streak = 0, health_reason = m.reason
       FROM unnest($1::int[], $2::text[], $3::text[]) AS m(id, state, reason) WHERE n.id = m.id`,
    { bind: [ids, tos, reasons, at], transaction },
  );
  await sequelize.query(
    `INSERT INTO node_transitions (node_id, from_state, to_state, reason, at)
     SELECT m.id, m.from_state, m.to_state, m.reason, $5
       FROM unnest($1::int[], $2::text[], $3::text[], $4::text[]) WITH ORDINALITY AS m(id, from_state, to_state, reason, k) ORDER BY m.k`,
    { bind: [ids, moves.map((m) => m.from), tos, reasons, at], transaction },
  );
  const offline = moves.filter((m) => m.to === 'offline');
  const opened = new Map<number, number>();
  if (offline.length) {
    const rows = await sequelize.query<{ id: number; nodeId: number }>(
      `INSERT INTO outages (node_id, started_at)
       SELECT m.id, m.started_at FROM unnest($1::int[], $2::timestamptz[]) WITH ORDINALITY AS m(id, started_at, k) ORDER BY m.k
       ON CONFLICT (node_id) WHERE ended_at IS NULL DO NOTHING RETURNING id, node_id AS "nodeId"`,
      { bind: [offline.map((m) => m.nodeId), offline.map((m) => m.outageStartedAt ?? at)], type: QueryTypes.SELECT, transaction },
    );
    for (const r of rows) opened.set(r.nodeId, r.id);
  }
  return moves.map((m) => {
    const base = { nodeId: m.nodeId, neighbourhoodId: m.neighbourhoodId, hostUserId: m.hostUserId, at: at.toISOString() };
    const ev: Events = { state: { ...base, state: m.to, previousState: m.from, reason: m.reason } };
    const outageId = m.to === 'offline' ? opened.get(m.nodeId) : undefined;
    if (outageId !== undefined) ev.outage = { ...base, outageId, kind: 'opened' };
    return ev;
  });
}

/** The open outage of each node that has one. */
export async function openOutagesOf(sequelize: Sequelize, nodeIds: number[], transaction: Transaction): Promise<Map<number, number>> {
  if (!nodeIds.length) return new Map();
  const rows = await sequelize.query<{ id: number; nodeId: number }>(
    'SELECT id, node_id AS "nodeId" FROM outages WHERE node_id = ANY($1::int[]) AND ended_at IS NULL',
    { bind: [nodeIds], type: QueryTypes.SELECT, transaction },
  );
  return new Map(rows.map((r) => [r.nodeId, r.id]));
}
