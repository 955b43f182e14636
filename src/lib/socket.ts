import { useSyncExternalStore } from 'react';
import type { Socket } from 'socket.io-client';

import type { NodeFiguresEvent, NodeStateEvent, OutageEvent, OutageTimelineEvent } from '../../shared/schemas/realtime';

export type { NodeFiguresEvent, NodeStateEvent, OutageEvent, OutageTimelineEvent };

interface ServerEvents {
  'node:state': (event: NodeStateEvent) => void;
  'node:figures': (event: NodeFiguresEvent) => void;
  outage: (event: OutageEvent) => void;
  /** The person's role or neighbourhoods changed: what they may read is different now. */
  'access:changed': (event: { userId: number; role: string; neighbourhoodIds: number[] }) => void;
  'outage:timeline': (event: OutageTimelineEvent) => void;
}

export type LiveSocket = Socket<ServerEvents, Record<string, never>>;

/** `connecting` before the first answer, `live` while connected, `reconnecting` after a drop, `closed` when signed out. */
export type LiveStatus = 'connecting' | 'live' | 'reconnecting' | 'closed';

let socket: LiveSocket | null = null;
let owner: number | null = null;
let status: LiveStatus = 'closed';
const listeners = new Set<() => void>();

function setStatus(next: LiveStatus) {
  if (next === status) return;
  status = next;
  listeners.forEach((listener) => listener());
}

// The socket.io client (about 13 KB) is not needed to draw a page: it loads after the page's own scripts.
let client: Promise<typeof import('socket.io-client')> | null = null;
const loadClient = () => (client ??= import('socket.io-client'));

/**
 * The one live connection of the signed-in person. The session cookie authenticates it; a
 * different person signing in on this browser gets a fresh connection, never the last one's.
 * Null when the person signed out (or another signed in) while the client was loading.
 */
export async function openSocket(userId: number): Promise<LiveSocket | null> {
  if (socket && owner === userId) return socket;
  closeSocket();
  owner = userId;
  setStatus('connecting');
  const { io } = await loadClient();
  if (owner !== userId) return null;
  if (socket) return socket; // another caller for the same person finished first
  const next: LiveSocket = io({ withCredentials: true, reconnectionDelayMax: 10_000 });
  next.on('connect', () => setStatus('live'));
  next.on('disconnect', (reason) => setStatus(reason === 'io client disconnect' ? 'closed' : 'reconnecting'));
  next.on('connect_error', () => setStatus('reconnecting'));
  socket = next;
  return next;
}

/** Ends the connection at sign-out, so nothing more arrives for a person who has left. */
export function closeSocket() {
  owner = null;
  if (socket) {
    socket.removeAllListeners();
    socket.disconnect();
    socket = null;
  }
  setStatus('closed');
}

function subscribe(listener: () => void) {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

export function useLiveStatus(): LiveStatus {
  return useSyncExternalStore(subscribe, () => status);
}

/**
 * A connection of its own for the host's recovery page: no session, the signed link from the mail
 * admits it to the events of that one node. Closed by the caller when the page goes away.
 */
export async function openRecoverySocket(token: string): Promise<LiveSocket> {
  const { io } = await loadClient();
  return io({ query: { recovery: token }, reconnectionDelayMax: 10_000 });
}
