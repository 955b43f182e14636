import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { NodeState } from '../../shared/enums';
import { type Attribution, attributeSilence, type WatchedNode } from '../../shared/health/rootCause';
import type { Config } from '../config';
import { CLIENTS_SQL, refreshBlastCounts } from './blastRadius';
import { recordTransition } from './nodeHealth';
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
  const rows = await sequelize.query<{ id: number; isUplink: boolean; state: NodeState; lastSeenAt: Date | null; reportIntervalS: number; offlineWindowS: number }>(
    `SELECT id, is_uplink AS "isUplink", state, last_seen_at AS "lastSeenAt", report_interval_s AS "reportIntervalS",
            report_interval_s * coalesce((thresholds->>'offlineAfterIntervals')::int, $1) AS "offlineWindowS"
       FROM nodes`,
    { bind: [offlineAfterIntervals], type: QueryTypes.SELECT, transaction },
  );
  return new Map<number, WatchedNode>(rows.map((r) => [r.id, { ...r, lastSeenAtMs: r.lastSeenAt ? new Date(r.lastSeenAt).getTime() : null }]));
}

/** Which silent node explains which: with no uplink marked, every silent node stands alone. */
export async function attribute(sequelize: Sequelize, silent: SilentNode[], now: Date, windowS: number, offlineAfterIntervals: number, transaction: Transaction): Promise<Attribution> {
  const ids = silent.map((s) => s.nodeId);
  const topology = await currentTopology(sequelize, transaction);
  if (!topology.graph.uplinkIds.length) return { roots: ids, stranded: [], deferred: [] };
  return attributeSilence(topology, await watchedNodes(sequelize, offlineAfterIntervals, transaction), ids, now.getTime(), windowS);
}

async function openOutageOf(sequelize: Sequelize, nodeId: number, transaction: Transaction) {
  const [row] = await sequelize.query<{ id: number }>('SELECT id FROM outages WHERE node_id = $1 AND ended_at IS NULL', { bind: [nodeId], type: QueryTypes.SELECT, transaction });
  return row?.id ?? null;
}

/**
 * Moves this check's silent nodes: roots go offline with an outage each; nodes cut off behind a
 * root become stranded and join its outage's blast radius; a cut that holds an uplink is one
 * partition notice to admins. The roots' outage mail comes after, from the check's writeDueOfflineAlerts.
 */
export async function judgeSilentNodes(
  sequelize: Sequelize, config: Config, silent: SilentNode[], now: Date, windowS: number, offlineAfterIntervals: number, transaction: Transaction,
) {
  const events: Events[] = [];
  if (!silent.length) return events;
  const a = await attribute(sequelize, silent, now, windowS, offlineAfterIntervals, transaction);
  const byId = new Map(silent.map((s) => [s.nodeId, s]));
  const outageOfRoot = new Map<number, number>();
  const opened: number[] = [];
  for (const id of a.roots) {
    const node = byId.get(id)!;
    await sequelize.query(`UPDATE nodes SET state = 'offline', state_since = $2, health_streak = 0, health_reason = 'missed its reports' WHERE id = $1`, { bind: [id, now], transaction });
    const move = { ...node, from: node.state, to: 'offline' as const, reason: 'missed its reports', at: now, outageStartedAt: new Date(node.outageStartedAt) };
    const ev = await recordTransition(sequelize, config, move, transaction);
    events.push(ev);
    const outageId = ev.outage?.outageId ?? (await openOutageOf(sequelize, id, transaction));
    if (outageId) outageOfRoot.set(id, outageId);
    if (ev.outage?.kind === 'opened') opened.push(ev.outage.outageId);
  }
  const touched = new Set<number>();
  const partitionUplinks: number[] = [];
  let partitionNodes = 0;
  for (const s of a.stranded) {
    const node = byId.get(s.nodeId)!;
    let outageId: number | null = null;
    if (s.cause === 'outage') {
      outageId = outageOfRoot.get(s.rootNodeId) ?? (await openOutageOf(sequelize, s.rootNodeId, transaction));
      if (!outageId) continue; // the root came back in the meantime: judged again next check
      outageOfRoot.set(s.rootNodeId, outageId);
      touched.add(outageId);
    }
    if (s.cause === 'partition') {
      partitionNodes++;
      if (s.rootNodeId === s.nodeId) partitionUplinks.push(s.nodeId);
    }
    const [root] = await sequelize.query<{ name: string }>('SELECT name FROM nodes WHERE id = $1', { bind: [s.rootNodeId], type: QueryTypes.SELECT, transaction });
    const reason = s.cause === 'partition' ? 'Parapet lost sight of the network at its uplink' : `cut off behind ${root?.name ?? 'an upstream node'}`;
    await sequelize.query(`UPDATE nodes SET state = 'stranded', state_since = $2, health_streak = 0, health_reason = $3 WHERE id = $1`, { bind: [s.nodeId, now, reason], transaction });
    await sequelize.query(
      `INSERT INTO stranded_nodes (node_id, root_node_id, outage_id, cause, neighbourhood_id, clients, stranded_at)
       SELECT n.id, $2, $3, $4, n.neighbourhood_id, ${CLIENTS_SQL('n')}, $5 FROM nodes n WHERE n.id = $1
       ON CONFLICT (node_id) WHERE ended_at IS NULL DO NOTHING`,
      { bind: [s.nodeId, s.rootNodeId, outageId, s.cause, now], transaction },
    );
    events.push(await recordTransition(sequelize, config, { ...node, from: node.state, to: 'stranded', reason, at: now }, transaction));
  }
  for (const outageId of touched) await refreshBlastCounts(sequelize, outageId, transaction);
  // The new roots' offline mail (listing what sits behind them) is written by the check's writeDueOfflineAlerts;
  // older roots, already mailed, only add upstream notices.
  for (const outageId of touched) if (!opened.includes(outageId)) await writeUpstreamNotices(sequelize, config, outageId, now, transaction);
  if (partitionUplinks.length) await writePartitionNotice(sequelize, config, partitionUplinks, partitionNodes, now, transaction);
  return events;
}
