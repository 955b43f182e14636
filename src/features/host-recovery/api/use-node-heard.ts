import { useEffect, useState } from 'react';
import { openRecoverySocket, type LiveSocket } from '../../../lib/socket';

export interface Heard {
  /** When the server last received a report from the node, as it told this page. */
  at: string | null;
  connected: boolean;
}

/** Listens, without a session, for the host's node reporting again: any report or a move to online ends the wait. */
export function useNodeHeard(token: string, nodeId: number | undefined): Heard {
  const [heard, setHeard] = useState<Heard>({ at: null, connected: false });
  useEffect(() => {
    if (!token || nodeId === undefined) return;
    let socket: LiveSocket | null = null;
    let left = false;
    void openRecoverySocket(token).then((opened) => {
      if (left) {
        opened.disconnect();
        return;
      }
      socket = opened;
      const seen = (at: string) => setHeard((h) => ({ ...h, at: h.at && h.at > at ? h.at : at }));
      opened.on('connect', () => setHeard((h) => ({ ...h, connected: true })));
      opened.on('disconnect', () => setHeard((h) => ({ ...h, connected: false })));
      opened.on('node:figures', (e) => e.nodeId === nodeId && seen(e.at));
      opened.on('node:state', (e) => e.nodeId === nodeId && (e.state === 'online' || e.state === 'degraded') && seen(e.at));
    });
    return () => {
      left = true;
      socket?.removeAllListeners();
      socket?.disconnect();
    };
  }, [token, nodeId]);
  return heard;
}

/** Whole seconds since `at`, ticking once a second while shown. */
export function useSecondsSince(at: string | null): number | null {
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    if (!at) return;
    const timer = window.setInterval(() => setNow(Date.now()), 1000);
    return () => window.clearInterval(timer);
  }, [at]);
  return at ? Math.max(0, Math.round((now - new Date(at).getTime()) / 1000)) : null;
}
