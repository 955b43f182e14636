import { Router } from 'express';
import { Op, col, fn, literal } from 'sequelize';
import { NODE_STATES, type NodeState } from '../../shared/enums';
import { actorOf } from '../middlewares/requireUser';
import { Neighbourhood, Node, Outage, Site } from '../models';
import { neighbourhoodScope } from '../policies/neighbourhood';
import { nodeScope } from '../policies/node';
import { siteScope } from '../policies/site';
import type { Config } from '../config';
import { isAdmin } from '../policies/actor';
import { maskMove, radioMoves } from '../services/airObservations';
import { recentAirView } from '../services/airViewCache';
import { linksWithPrediction } from '../services/topologyGraph';

const sequelizeJsonNotEmpty = () => literal('jsonb_array_length(coalesce("Node"."drift", \'[]\'::jsonb)) > 0');

/** The five live links with the least predicted fade margin among the nodes the caller may read. */
async function weakest(actor: Parameters<typeof nodeScope>[0]) {
  const nodes = await Node.findAll({ where: nodeScope(actor), attributes: ['id', 'name'] });
  const names = new Map(nodes.map((n) => [n.id, n.name]));
  const links = await linksWithPrediction(Node.sequelize!, [...names.keys()]);
  return links
    .filter((l) => l.status === 'live' && l.fadeMarginDb !== null)
    .sort((a, b) => a.fadeMarginDb! - b.fadeMarginDb! || a.id - b.id)
    .slice(0, 5)
    .map((l) => ({
      id: l.id,
      nodeAId: l.nodeAId,
      nodeAName: names.get(l.nodeAId)!,
      nodeBId: l.nodeBId,
      nodeBName: names.get(l.nodeBId)!,
      fadeMarginDb: l.fadeMarginDb,
      predictedSignalDbm: l.predictedSignalDbm,
      measuredSignalDbm: l.measuredSignalDbm,
    }));
}

/** What the air says for the overview: links listed but unheard for a day, pairs heard but unlisted, radios that moved. */
async function airFindings(config: Config, actor: Parameters<typeof nodeScope>[0]) {
  const nodes = await Node.findAll({ where: nodeScope(actor), attributes: ['id', 'name'] });
  const ids = nodes.map((n) => n.id);
  const names = new Map(nodes.map((n) => [n.id, n.name]));
  const now = config.now();
  const scope = isAdmin(actor) ? null : ids;
  const [air, moves, links] = await Promise.all([
    recentAirView(Node.sequelize!, now, { observedWindowS: config.linkObservedWindowS, silentAfterS: config.linkSilentAfterS }, scope, config.airViewCacheMs),
    radioMoves(Node.sequelize!, new Date(now.getTime() - config.radioMoveShowDays * 86_400_000), scope, 20),
    linksWithPrediction(Node.sequelize!, ids),
  ]);
  const silentLinks = links
    .filter((l) => air.byLink.get(l.id)?.plannedButSilent)
    .map((l) => ({
      id: l.id,
      name: l.name,
      status: l.status,
      nodeAId: l.nodeAId,
      nodeAName: names.get(l.nodeAId)!,
      nodeBId: l.nodeBId,
      nodeBName: names.get(l.nodeBId)!,
      lastObservedAt: air.byLink.get(l.id)!.lastObservedAt,
    }));
  return { silentLinks, discoveredLinkCount: air.discoveredLinks.length, radioMoves: moves.map((m) => maskMove(m, ids)) };
}

/** Counts by state, open outages (widest blast radius first) and drifting nodes, over what the caller may read. */
export function overviewRoutes(config: Config) {
  const router = Router();
  router.get('/', async (req, res) => {
    const actor = actorOf(req);
    const [byState, siteCount, neighbourhoodCount, open, drifting] = await Promise.all([
      Node.findAll({ where: nodeScope(actor), attributes: ['state', [fn('count', col('id')), 'n']], group: ['state'], raw: true }) as unknown as Promise<
        { state: NodeState; n: string }[]
      >,
      Site.count({ where: siteScope(actor) }),
      Neighbourhood.count({ where: neighbourhoodScope(actor) }),
      Outage.findAll({
        where: { endedAt: null },
        include: [{ model: Node, as: 'node', required: true, where: nodeScope(actor) }],
        order: [
          ['blastNodeCount', 'DESC'],
          ['blastClients', 'DESC'],
          ['startedAt', 'DESC'],
        ],
        limit: 20,
      }),
      Node.findAll({ where: { [Op.and]: [nodeScope(actor), { drift: { [Op.ne]: null } }, sequelizeJsonNotEmpty()] }, order: [['name', 'ASC']], limit: 20 }),
    ]);
    const countsByState = Object.fromEntries(NODE_STATES.map((s) => [s, 0])) as Record<NodeState, number>;
    for (const row of byState) countsByState[row.state] = Number(row.n);
    const nodeCount = Object.values(countsByState).reduce((a, b) => a + b, 0);
    const openOutages = open.map((o) => ({
      id: o.id,
      nodeId: o.nodeId,
      nodeName: o.node!.name,
      neighbourhoodId: o.node!.neighbourhoodId,
      startedAt: o.startedAt.toISOString(),
      acknowledged: Boolean(o.acknowledgedAt),
      blastNodeCount: o.blastNodeCount,
      blastClients: o.blastClients,
    }));
    const driftNodes = drifting.map((n) => ({ id: n.id, name: n.name, drift: n.drift ?? [] }));
    const weakestLinks = actor.role === 'host' ? [] : await weakest(actor);
    const air = actor.role === 'host' ? { silentLinks: [], discoveredLinkCount: 0, radioMoves: [] } : await airFindings(config, actor);
    res.json({ data: { countsByState, nodeCount, siteCount, neighbourhoodCount, openOutages, driftNodes, weakestLinks, ...air } });
  });
  return router;
}
