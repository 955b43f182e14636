import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { passwordResetCompleteSchema, passwordResetRequestSchema } from '../../shared/schemas/account';
import type { Config } from '../config';
import { accountMailLimit } from '../middlewares/accountMailLimit';
import { validate } from '../middlewares/validate';
import { completePasswordReset, requestPasswordReset } from '../services/accountLinks';

/** Anyone may ask; the answer is the same whether or not the address has an account. */
export function passwordResetRoutes(config: Config, sequelize: Sequelize) {
  const router = Router();
  const minutes = Math.round(config.passwordResetTtlMs / 60_000);

  router.post('/', validate('body', passwordResetRequestSchema), accountMailLimit(config, 'password-reset'), async (_req, res) => {
    const started = performance.now();
    await requestPasswordReset(sequelize, config, res.locals.body.email);
    // Known and unknown addresses answer after the same minimum time, so the clock does not tell them apart.
    const left = config.passwordResetMinMs - (performance.now() - started);
    if (left > 0) await new Promise((resolve) => setTimeout(resolve, left));
    res.status(202).json({
      data: {
        message: `If that address belongs to an active Parapet account, a link to choose a new password is on its way. It works once, within ${minutes} minutes.`,
      },
    });
  });

  router.post('/complete', validate('body', passwordResetCompleteSchema), async (_req, res) => {
    await completePasswordReset(sequelize, config, res.locals.body.token, res.locals.body.password);
    res.json({ data: { message: 'Your new password is set, and every earlier session is signed out. Sign in with the new password.' } });
  });

  return router;
}
