import { EventEmitter } from 'node:events';
import type { NodeState } from '../../shared/enums';

/** What changed, small: ids, new state, key figures, time. The realtime layer fans these out to rooms. */
export interface NodeStateEvent {
  nodeId: number;
  neighbourhoodId: number;
  hostUserId: number | null;
  state: NodeState;
  previousState: NodeState;
  at: string;
  reason: string;
}
export interface NodeFiguresEvent {
  nodeId: number;
  neighbourhoodId: number;
  hostUserId: number | null;
  at: string;
  signalDbm: number | null;
  snrDb: number | null;
  throughputMbps: number | null;
  latencyMs: number | null;
}
export interface OutageEvent {
  outageId: number;
  nodeId: number;
  neighbourhoodId: number;
  hostUserId: number | null;
  kind: 'opened' | 'closed';
  at: string;
}

interface EventMap {
  'node-state': [NodeStateEvent];
  'node-figures': [NodeFiguresEvent];
  outage: [OutageEvent];
}

/** In-process bus, emitted after commit; every instance's realtime layer listens to its own bus. */
export const domainEvents = new EventEmitter<EventMap>();
domainEvents.setMaxListeners(50);
