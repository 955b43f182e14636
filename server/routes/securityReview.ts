import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { actorOf } from '../middlewares/requireUser';
import { authorize } from '../policies/authorize';
import { mayPlan } from '../policies/planning';
import { presentSecurityReview } from '../presenters/planning';
import { securityReviewFor } from '../services/securityReview';

/** The security review of the radios the caller manages; keys never leave the server. */
export function securityReviewRoutes(sequelize: Sequelize) {
  const router = Router();
  router.get('/', async (req, res) => {
    const actor = actorOf(req);
    authorize(mayPlan(actor), 'The security review is for operators and admins.');
    res.json({ data: presentSecurityReview(await securityReviewFor(sequelize, actor)) });
  });
  return router;
}
