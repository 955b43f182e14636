import { EventEmitter } from 'node:events';
import type { NodeFiguresEvent, NodeStateEvent, OutageEvent, OutageTimelineEvent } from '../../shared/schemas/realtime';

export type { NodeFiguresEvent, NodeStateEvent, OutageEvent, OutageTimelineEvent };

/** People whose role, assignments or active flag changed; emitted after commit. */
export interface AccessChangedEvent {
  userIds: number[];
}

interface EventMap {
  'access-changed': [AccessChangedEvent];
  'node-state': [NodeStateEvent];
  'node-figures': [NodeFiguresEvent];
  outage: [OutageEvent];
  'outage-timeline': [OutageTimelineEvent];
}

/** In-process bus, emitted after commit; every instance's realtime layer listens to its own bus. */
export const domainEvents = new EventEmitter<EventMap>();
domainEvents.setMaxListeners(50);
