import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { NodeState } from '../../shared/enums';
import { alertsAfterTransition } from './alerts';
import { domainEvents, type NodeStateEvent, type OutageEvent } from './events';

export interface TransitionInput {
  nodeId: number;
  neighbourhoodId: number;
  hostUserId: number | null;
  from: NodeState;
  to: NodeState;
  reason: string;
  at: Date;
  /** When the outage began, if this transition opens one (the first missed report). */
  outageStartedAt?: Date;
  /** The caller writes the outage mail itself, later in the same transaction (after attaching what sits behind it). */
  holdAlerts?: boolean;
}

/**
 * Records a state change inside the caller's transaction: the transition row, and the outage it
 * opens (going offline) or closes (leaving offline), and the outage mail for it in the outbox.
 * Returns the events to emit after commit.
 */
export async function recordTransition(sequelize: Sequelize, t: TransitionInput, transaction: Transaction) {
  const events: { state: NodeStateEvent; outage?: OutageEvent } = {
    state: { nodeId: t.nodeId, neighbourhoodId: t.neighbourhoodId, hostUserId: t.hostUserId, state: t.to, previousState: t.from, at: t.at.toISOString(), reason: t.reason },
  };
  await sequelize.query('INSERT INTO node_transitions (node_id, from_state, to_state, reason, at) VALUES ($1, $2, $3, $4, $5)', {
    bind: [t.nodeId, t.from, t.to, t.reason, t.at],
    transaction,
  });
  const base = { nodeId: t.nodeId, neighbourhoodId: t.neighbourhoodId, hostUserId: t.hostUserId, at: t.at.toISOString() };
  if (t.to === 'offline' && t.from !== 'offline') {
    const rows = await sequelize.query<{ id: number }>(
      `INSERT INTO outages (node_id, started_at) VALUES ($1, $2) ON CONFLICT (node_id) WHERE ended_at IS NULL DO NOTHING RETURNING id`,
      { bind: [t.nodeId, t.outageStartedAt ?? t.at], type: QueryTypes.SELECT, transaction },
    );
    if (rows[0]) events.outage = { ...base, outageId: rows[0].id, kind: 'opened' };
  } else if (t.from === 'offline' && t.to !== 'offline') {
    const rows = await sequelize.query<{ id: number }>(
      `UPDATE outages SET ended_at = greatest($2, started_at), updated_at = $2 WHERE node_id = $1 AND ended_at IS NULL RETURNING id`,
      { bind: [t.nodeId, t.at], type: QueryTypes.SELECT, transaction },
    );
    if (rows[0]) events.outage = { ...base, outageId: rows[0].id, kind: 'closed' };
  }
  // Outage mail is written in this same transaction (the outbox), so it exists exactly when the outage does.
  if (!t.holdAlerts) await alertsAfterTransition(sequelize, t, events.outage, transaction);
  return events;
}

export function emitTransition(events: Awaited<ReturnType<typeof recordTransition>>) {
  domainEvents.emit('node-state', events.state);
  if (events.outage) domainEvents.emit('outage', events.outage);
}
