import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { invitationAcceptSchema, invitationCreateSchema } from '../../shared/schemas/account';
import type { Config } from '../config';
import { accountMailLimit } from '../middlewares/accountMailLimit';
import { Invalid } from '../errors';
import { requireRole } from '../middlewares/requireRole';
import { actorOf, requireUser } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { authorize } from '../policies/authorize';
import { siteAbilities } from '../policies/site';
import { operatesAny } from '../policies/actor';
import { mayListPeople } from '../policies/user';
import { presentUser } from '../presenters/user';
import { acceptInvitation, invite } from '../services/accountLinks';
import { readableSite } from '../services/references';

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
    requireRole(operatesAny, 'Only admins invite people, and operators invite hosts for their sites.'),
    validate('body', invitationCreateSchema),
    accountMailLimit(config, 'invitation'),
    async (req, res) => {
      const actor = actorOf(req);
      const { siteId, ...input } = res.locals.body;
      let hostOf = null;
      if (siteId !== undefined) {
        const site = await readableSite(actor, siteId);
        authorize(siteAbilities(actor, site).update, 'Only admins and the operators of its neighbourhood choose this site’s host.');
        hostOf = { site, onlyNewPeople: !mayListPeople(actor) };
      }
      if (!mayListPeople(actor)) {
        if (input.role !== 'host')
          throw Invalid('Operators invite hosts only; ask an admin for other roles.', [{ path: 'role', message: 'role must be host' }]);
        if (!hostOf) throw Invalid('Say which of your sites the new host will host.', [{ path: 'siteId', message: 'siteId is required' }]);
      }
      const { user, expiresAt } = await invite(sequelize, config, input, actor.name, hostOf);
      res.status(201).json({ data: { ...presentUser(user, [], actor), invitationExpiresAt: expiresAt.toISOString() } });
    },
  );

  return router;
}
