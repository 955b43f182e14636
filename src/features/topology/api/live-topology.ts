import type { QueryClient } from '@tanstack/react-query';
import { topologyKeys } from '../../../lib/query-keys';
import { patchTopologyNodes, type TopologyNodePatch } from './topology';

export interface TopologyPatcher {
  /** Notes a node's change; it reaches the map's cache with the next animation frame. */
  patch(nodeId: number, patch: TopologyNodePatch): void;
  stop(): void;
}

/**
 * Between two applies at least this long: each apply costs the browser a style, layout and paint pass
 * whatever the number of nodes in it (the storm's CPU profile spent two thirds outside script; applying
 * in every frame fell seconds behind a 300/s storm on a loaded machine), so a few applies of many nodes
 * cost far less than sixty of a few, and still show within a fifth of a second.
 */
export const MIN_APPLY_GAP_MS = 150;

/**
 * Live node changes for the map, buffered and applied in an animation frame (never more than once per
 * frame, nor within MIN_APPLY_GAP_MS of the last); the graph redraws only the nodes that changed. A
 * hidden tab runs no frames, so its changes wait (one entry per node, never more) until it is shown.
 */
export function topologyPatcher(queryClient: QueryClient, minGapMs = MIN_APPLY_GAP_MS): TopologyPatcher {
  let pending = new Map<number, TopologyNodePatch>();
  let frame: number | null = null;
  let lastApplied = -Infinity;
  // A graph read from the server while events arrive may predate some of them: the changes heard since
  // that read began are applied again to what it answers, so a refetch (a reconnect) never rolls a node back.
  let heardSinceFetch: Map<number, TopologyNodePatch> | null = null;
  const unsubscribe = queryClient.getQueryCache().subscribe((event) => {
    if (event.type !== 'updated' || event.query.queryHash !== JSON.stringify(topologyKeys.graph())) return;
    if (event.action.type === 'fetch') heardSinceFetch = new Map();
    else if (event.action.type === 'success' && !event.action.manual && heardSinceFetch) {
      const heard = heardSinceFetch;
      heardSinceFetch = null;
      queueMicrotask(() => patchTopologyNodes(queryClient, heard));
    } else if (event.action.type === 'error') heardSinceFetch = null;
  });
  const apply = (now: number) => {
    if (now - lastApplied < minGapMs) {
      frame = requestAnimationFrame(apply);
      return;
    }
    frame = null;
    lastApplied = now;
    const batch = pending;
    pending = new Map();
    patchTopologyNodes(queryClient, batch);
  };
  return {
    patch(nodeId, patch) {
      pending.set(nodeId, { ...pending.get(nodeId), ...patch });
      heardSinceFetch?.set(nodeId, { ...heardSinceFetch.get(nodeId), ...patch });
      frame ??= requestAnimationFrame(apply);
    },
    stop() {
      unsubscribe();
      if (frame !== null) cancelAnimationFrame(frame);
      frame = null;
      pending = new Map();
    },
  };
}
