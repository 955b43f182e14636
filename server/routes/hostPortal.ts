import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import type { Config } from '../config';
import { actorOf } from '../middlewares/requireUser';
import { presentHostedSites } from '../presenters/hostedSites';
import { hostedSitesOf } from '../services/hostedSites';

/** Mounted at /me/nodes: the sites the caller hosts (whatever their role) and their nodes, in plain words. */
export function hostPortalRoutes(config: Config, sequelize: Sequelize) {
  const router = Router();

  router.get('/', async (req, res) => {
    const now = config.now();
    const actor = actorOf(req);
    const hosted = await hostedSitesOf(sequelize, actor, now);
    res.json({ data: presentHostedSites(actor, hosted, now), timeZone: hosted.timeZone });
  });

  return router;
}
