import { QueryTypes, type Sequelize } from 'sequelize';
import { availabilityPct, observedInWindow, WINDOWS_S } from '../../shared/health/availability';
import { countStates, DOWN_STATES, outageSentence, statusSentence } from '../../shared/health/publicWords';
import type { NodeState } from '../../shared/enums';
import type { PublicStatusDto } from '../../shared/schemas/publicStatus';
import { localClock } from '../../shared/time/monthRange';

interface NodeRow {
  id: number;
  neighbourhoodId: number;
  state: NodeState;
  isUplink: boolean;
  firstSeenAt: Date | null;
}
interface OutageRow {
  nodeId: number;
  startedAt: Date;
  endedAt: Date | null;
}

/** Reads only counts, states and times: the query itself never selects a name of a site, node or person. */
export async function computePublicStatus(sequelize: Sequelize, now: Date): Promise<PublicStatusDto> {
  const since30d = new Date(now.getTime() - WINDOWS_S.d30 * 1000);
  const [settings] = await sequelize.query<{ name: string; timeZone: string }>('SELECT name, time_zone AS "timeZone" FROM network_settings WHERE id = 1', {
    type: QueryTypes.SELECT,
  });
  const hoods = await sequelize.query<{ id: number; name: string }>('SELECT id, name FROM neighbourhoods WHERE retired_at IS NULL ORDER BY lower(name)', {
    type: QueryTypes.SELECT,
  });
  const nodes = await sequelize.query<NodeRow>(
    `SELECT n.id, n.neighbourhood_id AS "neighbourhoodId", n.state, n.is_uplink AS "isUplink", n.first_seen_at AS "firstSeenAt"
       FROM nodes n JOIN neighbourhoods h ON h.id = n.neighbourhood_id WHERE h.retired_at IS NULL`,
    { type: QueryTypes.SELECT },
  );
  const outages = await sequelize.query<OutageRow>(
    `SELECT node_id AS "nodeId", started_at AS "startedAt", ended_at AS "endedAt" FROM outages
      WHERE started_at < $1 AND (ended_at IS NULL OR ended_at > $2)`,
    { bind: [now, since30d], type: QueryTypes.SELECT },
  );
  const timeZone = settings?.timeZone ?? 'UTC';
  const byNode = new Map<number, OutageRow[]>();
  for (const o of outages) byNode.set(o.nodeId, [...(byNode.get(o.nodeId) ?? []), o]);
  const intervalsOf = (id: number) => (byNode.get(id) ?? []).map((o) => ({ start: new Date(o.startedAt), end: o.endedAt ? new Date(o.endedAt) : null }));
  const seen = (n: NodeRow) => (n.firstSeenAt ? new Date(n.firstSeenAt) : null);

  return {
    network: { name: settings?.name ?? 'Community network', timeZone },
    generatedAt: now.toISOString(),
    neighbourhoods: hoods.map((h) => {
      const members = nodes.filter((n) => n.neighbourhoodId === h.id);
      const open = members
        .filter((n) => DOWN_STATES.includes(n.state))
        .flatMap((n) => (byNode.get(n.id) ?? []).filter((o) => !o.endedAt).map((o) => ({ node: n, startedAt: new Date(o.startedAt) })))
        .sort((a, b) => a.startedAt.getTime() - b.startedAt.getTime());
      const counts = countStates(members.map((n) => n.state));
      const pct = (windowS: number) => availabilityPct(members.map((n) => observedInWindow(intervalsOf(n.id), windowS, now, seen(n))));
      return {
        name: h.name,
        counts,
        sentence: statusSentence(counts, open[0] ? localClock(open[0].startedAt, timeZone, now) : null),
        availability: { h24Pct: pct(WINDOWS_S.h24), d30Pct: pct(WINDOWS_S.d30) },
        openOutages: open.map(({ node, startedAt }) => {
          const state = node.state as 'offline' | 'stranded';
          const sinceClock = localClock(startedAt, timeZone, now);
          return { state, since: startedAt.toISOString(), sentence: outageSentence({ neighbourhood: h.name, state, isUplink: node.isUplink, sinceClock }) };
        }),
      };
    }),
  };
}

/**
 * One computation shared by everyone for `ttlMs`: requests that arrive while it runs wait for the
 * same promise, so a crowd refreshing the page costs the database one read per period.
 */
export function sharedFor<T>(ttlMs: number, now: () => Date, compute: () => Promise<T>) {
  let cached: { value: T; at: number } | null = null;
  let inflight: Promise<T> | null = null;
  return async (): Promise<T> => {
    const t = now().getTime();
    if (cached && t - cached.at < ttlMs) return cached.value;
    inflight ??= compute()
      .then((value) => {
        cached = { value, at: t };
        return value;
      })
      .finally(() => {
        inflight = null;
      });
    return inflight;
  };
}
