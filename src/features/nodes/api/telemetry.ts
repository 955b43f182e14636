import type { ClockTrouble } from '../../../../shared/health/clock';
import { keepPreviousData, useMutation, useQuery, type QueryClient } from '@tanstack/react-query';
import type { NodeDto } from '../../../../shared/schemas/node';
import type { NodeAvailabilityDto as NodeAvailability, NodeSeriesDto as NodeSeries, SeriesRange } from '../../../../shared/schemas/telemetry';
import { api } from '../../../lib/api';
import { nodeKeys, nodeTelemetryKeys } from '../../../lib/query-keys';

export { SERIES_RANGES } from '../../../../shared/enums';
export type { NodeAvailability, NodeSeries, SeriesRange };
export type { SeriesPointDto as SeriesPoint } from '../../../../shared/schemas/telemetry';

/** The newest report's figures as the server keeps them on the node (`lastReport`). */
export interface LastReport {
  signalDbm: number | null;
  snrDb: number | null;
  throughputMbps: number | null;
  latencyMs: number | null;
  uptimeS: number | null;
  firmware: string | null;
  radios: ReportedRadio[];
  receivedAt: string | null;
  sentAt: string | null;
  seq: number | null;
  /** The kernel boot the report came from, when the agent sends it. */
  bootId: string | null;
  /** Set when the node's clock was plainly wrong; its sentAt was stored as unknown. */
  clockTrouble: { kind: ClockTrouble; reportedSentAt: string } | null;
}

export interface ReportedRadio {
  iface: string;
  band?: string;
  channel?: number;
  channelWidthMHz?: number;
  ssid?: string;
  signalDbm?: number;
  noiseDbm?: number;
  txRateMbps?: number;
  rxRateMbps?: number;
  clients?: number;
}

const CLOCK_TROUBLES: ClockTrouble[] = ['unreadable', 'too-early', 'ahead'];
function clockTroubleOf(value: unknown): LastReport['clockTrouble'] {
  const v = value as { kind?: unknown; reportedSentAt?: unknown } | null;
  if (!v || typeof v.reportedSentAt !== 'string' || !CLOCK_TROUBLES.includes(v.kind as ClockTrouble)) return null;
  return { kind: v.kind as ClockTrouble, reportedSentAt: v.reportedSentAt };
}

const num = (value: unknown) => (typeof value === 'number' && Number.isFinite(value) ? value : null);
const text = (value: unknown) => (typeof value === 'string' ? value : null);

/** Reads the loosely typed `lastReport` field defensively: an older node may lack any figure. */
export function lastReportOf(node: Pick<NodeDto, 'lastReport'>): LastReport | null {
  const r = node.lastReport;
  if (!r) return null;
  return {
    signalDbm: num(r.signalDbm),
    snrDb: num(r.snrDb),
    throughputMbps: num(r.throughputMbps),
    latencyMs: num(r.latencyMs),
    uptimeS: num(r.uptimeS),
    firmware: text(r.firmware),
    radios: Array.isArray(r.radios) ? (r.radios as ReportedRadio[]).filter((x) => typeof x?.iface === 'string') : [],
    receivedAt: text(r.receivedAt),
    sentAt: text(r.sentAt),
    seq: num(r.seq),
    bootId: text(r.bootId),
    clockTrouble: clockTroubleOf(r.clockTrouble),
  };
}

export function useNodeSeries(nodeId: number, range: SeriesRange, options: { enabled?: boolean } = {}) {
  return useQuery({
    queryKey: nodeTelemetryKeys.series(nodeId, range),
    queryFn: () => api.get<{ data: NodeSeries }>(`/nodes/${nodeId}/series`, { range }).then((body) => body.data),
    placeholderData: keepPreviousData,
    // Roll-ups are written once a minute; refreshing more often would only repeat the answer.
    refetchInterval: 60_000,
    enabled: options.enabled ?? true,
  });
}

export function useNodeAvailability(nodeId: number) {
  return useQuery({
    queryKey: nodeTelemetryKeys.availability(nodeId),
    queryFn: () => api.get<{ data: NodeAvailability }>(`/nodes/${nodeId}/availability`).then((body) => body.data),
  });
}

/** Issues a fresh ingest token (the old one stops working); the answer is the only time it is shown. */
export function useIssueIngestToken(nodeId: number) {
  return useMutation({
    mutationFn: () => api.post<{ token: string }>(`/nodes/${nodeId}/ingest-token`).then((body) => body.token),
  });
}

/** Patches one node's cached record in place; returns whether there was one to patch. */
export function patchNodeRecord(queryClient: QueryClient, nodeId: number, patch: (node: NodeDto) => NodeDto): boolean {
  let found = false;
  queryClient.setQueryData<NodeDto>(nodeKeys.detail(nodeId), (old) => {
    if (!old) return old;
    found = true;
    return patch(old);
  });
  return found;
}
