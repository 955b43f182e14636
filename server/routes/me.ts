import { Router } from 'express';
import { rateLimit } from 'express-rate-limit';
import type { Sequelize } from 'sequelize';
import { meUpdateSchema, passwordChangeSchema } from '../../shared/schemas/account';
import { verifyPassword } from '../auth/passwords';
import type { Config } from '../config';
import { Invalid } from '../errors';
import { actorOf } from '../middlewares/requireUser';
import { tooManyHandler } from '../middlewares/tooManyHandler';
import { validate } from '../middlewares/validate';
import { presentMe } from '../presenters/user';
import { assertPasswordFor } from '../services/accountLinks';
import { changeOwnPassword, findPerson, updateOwnAccount } from '../services/people';

const me = (id: number) => findPerson(id, 'Your account');

/** Each person's own account: contact details and password. The role is the admins' to change. */
export function meRoutes(sequelize: Sequelize, config: Config) {
  const router = Router();
  // Wrong current passwords per person: a borrowed, signed-in browser cannot guess the password at leisure.
  const attempts = rateLimit({
    windowMs: config.signInLimitWindowMs,
    limit: config.passwordChangeLimit,
    keyGenerator: (req) => `password-change:${actorOf(req).id}`,
    skipSuccessfulRequests: true,
    requestWasSuccessful: (_req, res) => res.locals.wrongCurrentPassword !== true,
    validate: { keyGeneratorIpFallback: false },
    handler: tooManyHandler(config.signInLimitWindowMs, 'Too many wrong current passwords. Wait a few minutes, or sign out and use "Forgot password?".'),
  });

  router.get('/', async (req, res) => {
    res.json({ data: presentMe(await me(actorOf(req).id)) });
  });

  router.patch('/', validate('body', meUpdateSchema), async (req, res) => {
    const user = await me(actorOf(req).id);
    await updateOwnAccount(user, res.locals.body);
    res.json({ data: presentMe(user) });
  });

  router.post('/password', attempts, validate('body', passwordChangeSchema), async (req, res) => {
    const user = await me(actorOf(req).id);
    const { currentPassword, newPassword } = res.locals.body;
    if (!(await verifyPassword(user.passwordHash, currentPassword))) {
      res.locals.wrongCurrentPassword = true;
      throw Invalid('The current password is not right. Type it again, or sign out and use "Forgot password?".', [
        { path: 'currentPassword', message: 'currentPassword does not match your current password' },
      ]);
    }
    if (currentPassword === newPassword) {
      throw Invalid('The new password is the same as the current one. Choose a different one.', [
        { path: 'newPassword', message: 'newPassword must differ from the current password' },
      ]);
    }
    assertPasswordFor(config, user, newPassword, 'newPassword');
    await changeOwnPassword(sequelize, user, newPassword, req.sessionID);
    res.status(204).end();
  });

  return router;
}
