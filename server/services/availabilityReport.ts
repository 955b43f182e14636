import { QueryTypes, type Sequelize } from 'sequelize';
import { availabilityPct, type Interval, observedBetween, type ObservedTime } from '../../shared/health/availability';
import type { AvailabilityReportDto, AvailabilityRow } from '../../shared/schemas/report';
import { monthRange, zonedToUtc } from '../../shared/time/monthRange';
import { Invalid } from '../errors';
import { type Actor, isAdmin } from '../policies/actor';

interface NodeRow {
  id: number;
  name: string;
  neighbourhoodId: number;
  neighbourhood: string;
  firstSeenAt: Date | null;
}
interface OutageRow {
  id: number;
  nodeId: number;
  startedAt: Date;
  endedAt: Date | null;
  acknowledgedAt: Date | null;
}

const seconds = (a: Date, b: Date) => Math.round((b.getTime() - a.getTime()) / 1000);
const row = (parts: ObservedTime[], outageCount: number): AvailabilityRow => {
  const observedS = parts.reduce((s, p) => s + p.observedS, 0);
  const downS = parts.reduce((s, p) => s + p.downS, 0);
  return { availabilityPct: availabilityPct(parts), observedS: Math.round(observedS), downS: Math.round(downS), outageCount };
};

/** Availability for one calendar month in the network's time zone, over the nodes an operator looks after. */
export async function availabilityReport(sequelize: Sequelize, actor: Actor, month: string, now: Date): Promise<AvailabilityReportDto> {
  const [settings] = await sequelize.query<{ timeZone: string }>('SELECT time_zone AS "timeZone" FROM network_settings WHERE id = 1', {
    type: QueryTypes.SELECT,
  });
  const timeZone = settings?.timeZone ?? 'UTC';
  const range = monthRange(month, timeZone);
  if (range.start.getTime() >= now.getTime())
    throw Invalid(`${month} has not begun yet in ${timeZone}. Choose this month or an earlier one.`, [
      { path: 'month', message: 'month must not be in the future' },
    ]);
  const to = new Date(Math.min(range.end.getTime(), now.getTime()));
  const nodes = await sequelize.query<NodeRow>(
    `SELECT n.id, n.name, n.neighbourhood_id AS "neighbourhoodId", h.name AS neighbourhood, n.first_seen_at AS "firstSeenAt"
       FROM nodes n JOIN neighbourhoods h ON h.id = n.neighbourhood_id
      WHERE $1 OR n.neighbourhood_id = ANY($2::int[]) ORDER BY lower(h.name), lower(n.name)`,
    { bind: [isAdmin(actor), actor.neighbourhoodIds], type: QueryTypes.SELECT },
  );
  const outages = await sequelize.query<OutageRow>(
    `SELECT id, node_id AS "nodeId", started_at AS "startedAt", ended_at AS "endedAt", acknowledged_at AS "acknowledgedAt"
       FROM outages WHERE node_id = ANY($1::int[]) AND started_at < $3 AND (ended_at IS NULL OR ended_at > $2) ORDER BY started_at`,
    { bind: [nodes.map((n) => n.id), range.start, to], type: QueryTypes.SELECT },
  );
  const intervals = new Map<number, Interval[]>();
  for (const o of outages)
    intervals.set(o.nodeId, [...(intervals.get(o.nodeId) ?? []), { start: new Date(o.startedAt), end: o.endedAt ? new Date(o.endedAt) : null }]);
  const seen = (n: NodeRow) => (n.firstSeenAt ? new Date(n.firstSeenAt) : null);
  const observed = (n: NodeRow, from: Date, until: Date) => observedBetween(intervals.get(n.id) ?? [], from, until, seen(n));
  const nodeRows = nodes.map((n) => ({ n, t: observed(n, range.start, to), count: intervals.get(n.id)?.length ?? 0 }));
  const hoodIds = [...new Set(nodes.map((n) => n.neighbourhoodId))];
  const byId = new Map(nodes.map((n) => [n.id, n]));

  return {
    month,
    timeZone,
    from: range.start.toISOString(),
    to: to.toISOString(),
    overall: row(
      nodeRows.map((r) => r.t),
      outages.length,
    ),
    neighbourhoods: hoodIds.map((id) => {
      const members = nodeRows.filter((r) => r.n.neighbourhoodId === id);
      return {
        id,
        name: members[0].n.neighbourhood,
        ...row(
          members.map((m) => m.t),
          members.reduce((s, m) => s + m.count, 0),
        ),
      };
    }),
    nodes: nodeRows.map(({ n, t, count }) => ({
      id: n.id,
      name: n.name,
      neighbourhoodId: n.neighbourhoodId,
      neighbourhood: n.neighbourhood,
      ...row([t], count),
    })),
    outages: outages.map((o) => {
      const start = new Date(o.startedAt);
      const end = o.endedAt ? new Date(o.endedAt) : null;
      const node = byId.get(o.nodeId)!;
      return {
        id: o.id,
        nodeId: o.nodeId,
        node: node.name,
        neighbourhood: node.neighbourhood,
        startedAt: start.toISOString(),
        endedAt: end?.toISOString() ?? null,
        acknowledgedAt: o.acknowledgedAt ? new Date(o.acknowledgedAt).toISOString() : null,
        timeToAcknowledgeS: o.acknowledgedAt ? seconds(start, new Date(o.acknowledgedAt)) : null,
        timeToRecoverS: end ? seconds(start, end) : null,
        downInMonthS: Math.round(observedBetween([{ start, end }], range.start, to, seen(node)).downS),
      };
    }),
    days: localDays(month, timeZone, to).map(({ date, start, end }) => ({ date, availabilityPct: availabilityPct(nodes.map((n) => observed(n, start, end))) })),
  };
}

/** The month's local days as [start, end) instants, cut at `until`. */
function localDays(month: string, timeZone: string, until: Date) {
  const [y, m] = month.split('-').map(Number);
  const days: { date: string; start: Date; end: Date }[] = [];
  for (let d = 1; d <= 31; d++) {
    const start = zonedToUtc(y, m, d, timeZone);
    if (start.getTime() >= until.getTime() || new Date(Date.UTC(y, m - 1, d)).getUTCMonth() !== m - 1) break;
    const end = new Date(Math.min(zonedToUtc(y, m, d + 1, timeZone).getTime(), until.getTime()));
    days.push({ date: `${month}-${String(d).padStart(2, '0')}`, start, end });
  }
  return days;
}
