import { QueryTypes, type Sequelize } from 'sequelize';
import { availabilityPct, type ObservedTime, observedInWindow, WINDOWS_S } from '../../shared/health/availability';

export interface AvailabilityPair {
  h24Pct: number | null;
  d30Pct: number | null;
}

/** Availability over 24 h and 30 d for each node and pooled over all of them, from the outages (one query). */
export async function availabilityOf(sequelize: Sequelize, nodes: { id: number; firstSeenAt: Date | null }[], now: Date) {
  const ids = nodes.map((n) => n.id);
  const since = new Date(now.getTime() - WINDOWS_S.d30 * 1000);
  const outages = ids.length
    ? await sequelize.query<{ nodeId: number; start: Date; end: Date | null }>(
        `SELECT node_id AS "nodeId", started_at AS start, ended_at AS "end" FROM outages
          WHERE node_id = ANY($1::int[]) AND started_at < $2 AND (ended_at IS NULL OR ended_at > $3)`,
        { bind: [ids, now, since], type: QueryTypes.SELECT },
      )
    : [];
  const parts = (windowS: number) =>
    new Map<number, ObservedTime>(
      nodes.map((n) => {
        const intervals = outages.filter((o) => o.nodeId === n.id).map((o) => ({ start: new Date(o.start), end: o.end ? new Date(o.end) : null }));
        return [n.id, observedInWindow(intervals, windowS, now, n.firstSeenAt ? new Date(n.firstSeenAt) : null)];
      }),
    );
  const h24 = parts(WINDOWS_S.h24);
  const d30 = parts(WINDOWS_S.d30);
  return {
    byNode: (id: number): AvailabilityPair => ({ h24Pct: availabilityPct(h24.get(id)!), d30Pct: availabilityPct(d30.get(id)!) }),
    pooled: { h24Pct: availabilityPct([...h24.values()]), d30Pct: availabilityPct([...d30.values()]) } as AvailabilityPair,
  };
}
