import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { invitationAcceptSchema, invitationCreateSchema } from '../../shared/schemas/account';
import type { Config } from '../config';
import { accountMailLimit } from '../middlewares/accountMailLimit';
import { actorOf, requireUser } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { authorize } from '../policies/authorize';
import { mayListPeople } from '../policies/user';
import { presentUser } from '../presenters/user';
import { acceptInvitation, invite } from '../services/accountLinks';

/** Admins invite; the invited person accepts with the link from the mail, before they can sign in. */
export function invitationRoutes(config: Config, sequelize: Sequelize) {
  const router = Router();

  router.post('/accept', validate('body', invitationAcceptSchema), async (_req, res) => {
    const user = await acceptInvitation(sequelize, config, res.locals.body.token, res.locals.body.password);
    res.json({ data: { email: user.email, name: user.name, message: 'Your password is set. Sign in with your e-mail address and the new password.' } });
  });

  router.post(
    '/',
    requireUser,
    (req, _res, next) => {
      authorize(mayListPeople(actorOf(req)), 'Only admins invite people.');
      next();
    },
    validate('body', invitationCreateSchema),
    accountMailLimit(config, 'invitation'),
    async (req, res) => {
      const actor = actorOf(req);
      const { user, expiresAt } = await invite(sequelize, config, res.locals.body, actor.name);
      res.status(201).json({ data: { ...presentUser(user, [], actor), invitationExpiresAt: expiresAt.toISOString() } });
    },
  );

  return router;
}
