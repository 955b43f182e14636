import { useQueryClient, type QueryClient, type QueryKey } from '@tanstack/react-query';
import { useEffect } from 'react';
import type { NodeDto } from '../../shared/schemas/node';
import { patchNodeRecord } from '../features/nodes/api/telemetry';
import { topologyPatcher } from '../features/topology/api/live-topology';
import { neighbourhoodKeys, nodeKeys, nodeTelemetryKeys, outageKeys, overviewKeys, topologyKeys } from '../lib/query-keys';
import {
  closeSocket,
  openSocket,
  type LiveSocket,
  type NodeFiguresEvent,
  type NodeStateEvent,
  type OutageEvent,
  type OutageTimelineEvent,
} from '../lib/socket';

// Events are gathered for a moment and applied together: a burst of reports then costs one
// refetch per list, and still shows well within a second. The map's nodes go once per frame.
const FLUSH_MS = 150;

type NodeChange = (node: NodeDto) => NodeDto;

interface Pending {
  nodes: Map<number, NodeChange[]>;
  refetchNodes: Set<number>;
  invalidate: Map<string, QueryKey>;
}

const empty = (): Pending => ({ nodes: new Map(), refetchNodes: new Set(), invalidate: new Map() });

function flush(queryClient: QueryClient, pending: Pending) {
  for (const [nodeId, changes] of pending.nodes) {
    patchNodeRecord(queryClient, nodeId, (node) => changes.reduce((current, change) => change(current), node));
  }
  for (const nodeId of pending.refetchNodes) void queryClient.invalidateQueries({ queryKey: nodeKeys.detail(nodeId), exact: true });
  for (const queryKey of pending.invalidate.values()) void queryClient.invalidateQueries({ queryKey });
}

/** How each event changes the cache: patch what is cheap to patch, refetch what is counted or listed. */
function collector(queryClient: QueryClient) {
  let pending = empty();
  let timer: number | null = null;
  const topology = topologyPatcher(queryClient);
  const schedule = () => {
    timer ??= window.setTimeout(() => {
      timer = null;
      const batch = pending;
      pending = empty();
      flush(queryClient, batch);
    }, FLUSH_MS);
  };
  const invalidate = (queryKey: QueryKey) => pending.invalidate.set(JSON.stringify(queryKey), queryKey);
  const changeNode = (nodeId: number, change: NodeChange) => pending.nodes.set(nodeId, [...(pending.nodes.get(nodeId) ?? []), change]);

  return {
    state(e: NodeStateEvent) {
      // A move to online or degraded comes from a report, so the node was seen at that moment.
      const seen = e.state === 'online' || e.state === 'degraded';
      topology.patch(e.nodeId, seen ? { state: e.state, lastSeenAt: e.at } : { state: e.state });
      changeNode(e.nodeId, (node) => ({ ...node, state: e.state, stateSince: e.at, healthReason: e.reason, lastSeenAt: seen ? e.at : node.lastSeenAt }));
      invalidate(overviewKeys.all);
      invalidate(nodeKeys.lists());
      invalidate(neighbourhoodKeys.all);
      schedule();
    },
    figures(e: NodeFiguresEvent) {
      const cached = queryClient.getQueryData<NodeDto>(nodeKeys.detail(e.nodeId));
      if (cached && !cached.lastReport)
        pending.refetchNodes.add(e.nodeId); // a first report: radios and drift come with the record
      else
        changeNode(e.nodeId, (node) => ({
          ...node,
          lastSeenAt: e.at,
          lastReport: {
            ...node.lastReport,
            signalDbm: e.signalDbm,
            snrDb: e.snrDb,
            throughputMbps: e.throughputMbps,
            latencyMs: e.latencyMs,
            receivedAt: e.at,
          },
        }));
      schedule();
    },
    outage(e: OutageEvent) {
      topology.patch(e.nodeId, { openOutageId: e.kind === 'opened' ? e.outageId : null });
      invalidate(outageKeys.all);
      invalidate(overviewKeys.all);
      invalidate(nodeTelemetryKeys.availability(e.nodeId));
      schedule();
    },
    timeline(e: OutageTimelineEvent) {
      invalidate(outageKeys.detail(e.outageId));
      schedule();
    },
    stop() {
      if (timer !== null) window.clearTimeout(timer);
      topology.stop();
    },
  };
}

/** Applies the connection's events to the cache until the returned function is called. */
function listen(socket: LiveSocket, queryClient: QueryClient): () => void {
  const apply = collector(queryClient);
  let connectedBefore = socket.connected;
  const onConnect = () => {
    // Events sent while the connection was down are lost: read afresh what they would have changed.
    if (connectedBefore) {
      for (const queryKey of [topologyKeys.all, overviewKeys.all, nodeKeys.all, outageKeys.all, neighbourhoodKeys.all])
        void queryClient.invalidateQueries({ queryKey });
    }
    connectedBefore = true;
  };
  socket.on('connect', onConnect);
  socket.on('node:state', apply.state);
  socket.on('node:figures', apply.figures);
  socket.on('outage', apply.outage);
  // Every cached answer was read with the old access (the session's role too): read them all afresh.
  const onAccessChanged = () => void queryClient.invalidateQueries();
  socket.on('access:changed', onAccessChanged);
  socket.on('outage:timeline', apply.timeline);
  return () => {
    socket.off('access:changed', onAccessChanged);
    apply.stop();
    socket.off('connect', onConnect);
    socket.off('node:state', apply.state);
    socket.off('node:figures', apply.figures);
    socket.off('outage', apply.outage);
    socket.off('outage:timeline', apply.timeline);
  };
}

/**
 * Keeps the signed-in person's cached pages current from the live connection, and closes the
 * connection when they sign out (this hook's component unmounts with the signed-in layout).
 */
export function useLiveUpdates(userId: number) {
  const queryClient = useQueryClient();
  useEffect(() => {
    let stop: (() => void) | null = null;
    let left = false;
    void openSocket(userId).then((socket) => {
      if (!socket || left) return;
      stop = listen(socket, queryClient);
    });
    return () => {
      left = true;
      stop?.();
    };
  }, [userId, queryClient]);

  // Closing belongs to leaving the signed-in area, not to a re-render.
  useEffect(() => () => closeSocket(), []);
}
