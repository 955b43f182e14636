import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { NodeState } from '../../shared/enums';
import type { Config } from '../config';
import { writeOnlineAlerts } from './alerts';
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
}

/** Whether a state change opens or closes an outage (going offline, or leaving offline); the others only record the move. */
export const touchesOutage = (from: NodeState, to: NodeState) => (from === 'offline') !== (to === 'offline');

export interface TransitionEvents {
  state: NodeStateEvent;
  outage?: OutageEvent;
}

/** The live event of a state change. */
export function stateEvent(t: TransitionInput): NodeStateEvent {
  return {
    nodeId: t.nodeId,
    neighbourhoodId: t.neighbourhoodId,
    hostUserId: t.hostUserId,
    state: t.to,
    previousState: t.from,
    at: t.at.toISOString(),
    reason: t.reason,
  };
}

/**
 * Records a state change inside the caller's transaction: the transition row, and the outage it
 * opens (going offline) or closes (leaving offline), and the back-online mail in the outbox.
 * The offline mail is not written here: the transaction's owner calls `writeDueOfflineAlerts`
 * before it commits, once what sits behind the outage is attached. Returns the events to emit after commit.
 */
export async function recordTransition(sequelize: Sequelize, config: Config, t: TransitionInput, transaction: Transaction) {
  const events: TransitionEvents = { state: stateEvent(t) };
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
  // Back-online mail is written in this same transaction (the outbox), so it exists exactly when the outage closed;
  // none when the outage closed because a maintenance window began.
  if (events.outage?.kind === 'closed' && t.to !== 'maintenance') await writeOnlineAlerts(sequelize, config, events.outage.outageId, t.at, transaction);
  return events;
}

export function emitTransition(events: TransitionEvents) {
  domainEvents.emit('node-state', events.state);
  if (events.outage) domainEvents.emit('outage', events.outage);
}
