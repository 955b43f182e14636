import { Router } from 'express';
import type { Config } from '../config';
import { ApiError } from '../errors';
import { actorOf } from '../middlewares/requireUser';
import { isAdmin } from '../policies/actor';
import { authorize } from '../policies/authorize';

/** In development, where the address of the local mail fake's inbox is, so an admin can open it from the console. */
export function mailInboxRoutes(config: Config) {
  const router = Router();
  router.get('/', (req, res) => {
    authorize(isAdmin(actorOf(req)), 'Only admins open the test inbox.');
    if (config.env === 'production' || !config.maildevWebUrl) {
      throw new ApiError(404, 'not_found', 'There is no test inbox here: it exists only in development, with MAILDEV_WEB_URL set.');
    }
    res.json({ data: { url: config.maildevWebUrl } });
  });
  return router;
}
