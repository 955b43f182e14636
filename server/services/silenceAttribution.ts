import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { NodeState } from '../../shared/enums';
import { type Attribution, attributeSilence, type WatchedNode } from '../../shared/health/rootCause';
import type { Config } from '../config';
import { CLIENTS_SQL, refreshBlastCounts } from './blastRadius';
import { type DownMove, openOutagesOf, recordDownMoves } from './downMoves';
import type { recordTransition } from './nodeHealth';
import { currentTopology } from './topologyGraph';
import { writePartitionNotice, writeUpstreamNotices } from './upstreamNotices';

export interface SilentNode {
  nodeId: number;
  neighbourhoodId: number;
  hostUserId: number | null;
  state: NodeState;
  outageStartedAt: Date;
}
type Events = Awaited<ReturnType<typeof recordTransition>>;

async function watchedNodes(sequelize: Sequelize, offlineAfterIntervals: number, transaction: Transaction) {
  const rows = await sequelize.query<{
    id: number;
    isUplink: boolean;
    state: NodeState;
    lastSeenAt: Date | null;
    reportIntervalS: number;
    offlineWindowS: number;
  }>(
    `SELECT id, is_uplink AS "isUplink", state, last_seen_at AS "lastSeenAt", report_interval_s AS "reportIntervalS",
            report_interval_s * coalesce((thresholds->>'offlineAfterIntervals')::int, $1) AS "offlineWindowS"
       FROM nodes`,
    { bind: [offlineAfterIntervals], type: QueryTypes.SELECT, transaction },
  );
  return new Map<number, WatchedNode>(rows.map((r) => [r.id, { ...r, lastSeenAtMs: r.lastSeenAt ? new Date(r.lastSeenAt).getTime() : null }]));
}

/** Which silent node explains which: with no uplink marked, every silent node stands alone. */
export async function attribute(
  sequelize: Sequelize,
  silent: SilentNode[],
  now: Date,
  windowS: number,
  offlineAfterIntervals: number,
  transaction: Transaction,
): Promise<Attribution> {
  const ids = silent.map((s) => s.nodeId);
  const topology = await currentTopology(sequelize, transaction);
  if (!topology.graph.uplinkIds.length) return { roots: ids, stranded: [], deferred: [] };
  return attributeSilence(topology, await watchedNodes(sequelize, offlineAfterIntervals, transaction), ids, now.getTime(), windowS);
}

/**
 * Moves this check's silent nodes: roots go offline with an outage each; nodes cut off behind a
 * root become stranded and join its outage's blast radius; a cut that holds an uplink is one
 * partition notice to admins. The roots' outage mail comes after, from the check's writeDueOfflineAlerts.
 */
export async function judgeSilentNodes(
  sequelize: Sequelize,
  config: Config,
  silent: SilentNode[],
  now: Date,
  windowS: number,
  offlineAfterIntervals: number,
  transaction: Transaction,
) {
  const events: Events[] = [];
  if (!silent.length) return events;
  const a = await attribute(sequelize, silent, now, windowS, offlineAfterIntervals, transaction);
  const byId = new Map(silent.map((s) => [s.nodeId, s]));
  // Set-based: a fixed number of statements per check, however many nodes went quiet.
  const rootMoves = a.roots.map((id) => {
    const node = byId.get(id)!;
    return { ...node, from: node.state, to: 'offline' as const, reason: 'missed its reports', outageStartedAt: new Date(node.outageStartedAt) };
  });
  const rootEvents = await recordDownMoves(sequelize, rootMoves, now, transaction);
  events.push(...rootEvents);
  const opened = rootEvents.flatMap((ev) => (ev.outage?.kind === 'opened' ? [ev.outage.outageId] : []));
  const upstreamIds = [...new Set(a.stranded.map((s) => s.rootNodeId))];
  const outageOfRoot = await openOutagesOf(
    sequelize,
    upstreamIds.filter((id) => a.stranded.some((s) => s.rootNodeId === id && s.cause === 'outage')),
    transaction,
  );
  const names = new Map(
    upstreamIds.length
      ? (
          await sequelize.query<{ id: number; name: string }>('SELECT id, name FROM nodes WHERE id = ANY($1::int[])', {
            bind: [upstreamIds],
            type: QueryTypes.SELECT,
            transaction,
          })
        ).map((r) => [r.id, r.name])
      : [],
  );
  const touched = new Set<number>();
  const partitionUplinks: number[] = [];
  let partitionNodes = 0;
  const strandMoves: (DownMove & { rootNodeId: number; outageId: number | null; cause: string })[] = [];
  for (const s of a.stranded) {
    const node = byId.get(s.nodeId)!;
    let outageId: number | null = null;
    if (s.cause === 'outage') {
      outageId = outageOfRoot.get(s.rootNodeId) ?? null;
      if (!outageId) continue; // the root came back in the meantime: judged again next check
      touched.add(outageId);
    }
    if (s.cause === 'partition') {
      partitionNodes++;
      if (s.rootNodeId === s.nodeId) partitionUplinks.push(s.nodeId);
    }
    const reason =
      s.cause === 'partition' ? 'Parapet lost sight of the network at its uplink' : `cut off behind ${names.get(s.rootNodeId) ?? 'an upstream node'}`;
    strandMoves.push({ ...node, from: node.state, to: 'stranded', reason, rootNodeId: s.rootNodeId, outageId, cause: s.cause });
  }
  const strandEvents = await recordDownMoves(sequelize, strandMoves, now, transaction);
  if (strandMoves.length) {
    await sequelize.query(
      `INSERT INTO stranded_nodes (node_id, root_node_id, outage_id, cause, neighbourhood_id, clients, stranded_at)
       SELECT n.id, m.root_id, m.outage_id, m.cause, n.neighbourhood_id, ${CLIENTS_SQL('n')}, $5
         FROM unnest($1::int[], $2::int[], $3::int[], $4::text[]) WITH ORDINALITY AS m(id, root_id, outage_id, cause, k)
         JOIN nodes n ON n.id = m.id
        ORDER BY m.k
       ON CONFLICT (node_id) WHERE ended_at IS NULL DO NOTHING`,
      {
        bind: [
          strandMoves.map((m) => m.nodeId),
          strandMoves.map((m) => m.rootNodeId),
          strandMoves.map((m) => m.outageId),
          strandMoves.map((m) => m.cause),
          now,
        ],
        transaction,
      },
    );
  }
  events.push(...strandEvents);
  for (const outageId of touched) await refreshBlastCounts(sequelize, outageId, transaction);
  // The new roots' offline mail (listing what sits behind them) is written by the check's writeDueOfflineAlerts;
  // older roots, already mailed, only add upstream notices.
  for (const outageId of touched) if (!opened.includes(outageId)) await writeUpstreamNotices(sequelize, config, outageId, now, transaction);
  if (partitionUplinks.length) await writePartitionNotice(sequelize, config, partitionUplinks, partitionNodes, now, transaction);
  return events;
}
