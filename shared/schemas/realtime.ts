import type { NodeState } from '../enums';

// The small events the server pushes over socket.io: what changed (ids, new state, time), never whole records.

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

/** Something was added to an outage's timeline (a host's step); pages showing it read it again. */
export interface OutageTimelineEvent {
  outageId: number;
  nodeId: number;
  neighbourhoodId: number;
  hostUserId: number | null;
  at: string;
  kind: 'host-step';
}
