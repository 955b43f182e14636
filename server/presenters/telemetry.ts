import type { NodeAvailabilityDto, NodeSeriesDto, SeriesRange } from '../../shared/schemas/telemetry';
import type { SeriesRow } from '../services/nodeTelemetry';
import { iso } from './common';

export function presentNodeSeries(s: { range: SeriesRange; bucketS: number; points: SeriesRow[] }): NodeSeriesDto {
  return {
    range: s.range,
    bucketS: s.bucketS,
    points: s.points.map((p) => ({
      t: iso(p.t)!,
      availabilityPct: p.availabilityPct,
      signalAvgDbm: p.signalAvgDbm,
      signalMinDbm: p.signalMinDbm,
      noiseAvgDbm: p.noiseAvgDbm,
      snrAvgDb: p.snrAvgDb,
      throughputAvgMbps: p.throughputAvgMbps,
      latencyAvgMs: p.latencyAvgMs,
    })),
  };
}

export const presentNodeAvailability = (a: NodeAvailabilityDto): NodeAvailabilityDto => ({ h24: a.h24, d7: a.d7, d30: a.d30, d90: a.d90 });
