import { Router } from 'express';
import { fn, col } from 'sequelize';
import { NODE_STATES, type NodeState } from '../../shared/enums';
import { actorOf } from '../middlewares/requireUser';
import { Neighbourhood, Node, Site } from '../models';
import { neighbourhoodScope } from '../policies/neighbourhood';
import { nodeScope } from '../policies/node';
import { siteScope } from '../policies/site';

/** Counts by state over what the caller may read. */
export function overviewRoutes() {
  const router = Router();
  router.get('/', async (req, res) => {
    const actor = actorOf(req);
    const [byState, siteCount, neighbourhoodCount] = await Promise.all([
      Node.findAll({ where: nodeScope(actor), attributes: ['state', [fn('count', col('id')), 'n']], group: ['state'], raw: true }) as unknown as Promise<
        { state: NodeState; n: string }[]
      >,
      Site.count({ where: siteScope(actor) }),
      Neighbourhood.count({ where: neighbourhoodScope(actor) }),
    ]);
    const countsByState = Object.fromEntries(NODE_STATES.map((s) => [s, 0])) as Record<NodeState, number>;
    for (const row of byState) countsByState[row.state] = Number(row.n);
    const nodeCount = Object.values(countsByState).reduce((a, b) => a + b, 0);
    res.json({ data: { countsByState, nodeCount, siteCount, neighbourhoodCount, openOutages: [] } });
  });
  return router;
}
