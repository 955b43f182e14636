import { Router } from 'express';
import { preferencesUpdateSchema } from '../../shared/schemas/alerts';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { preferencesOf, updatePreferences } from '../services/preferences';

/** The signed-in person's own mail preferences. */
export function preferenceRoutes() {
  const router = Router();
  router.get('/', async (req, res) => {
    res.json({ data: await preferencesOf(actorOf(req)) });
  });
  router.patch('/', validate('body', preferencesUpdateSchema), async (req, res) => {
    res.json({ data: await updatePreferences(actorOf(req), res.locals.body) });
  });
  return router;
}
