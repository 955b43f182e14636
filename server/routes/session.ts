import { Router, type Request } from 'express';
import { rateLimit } from 'express-rate-limit';
import type passport from 'passport';
import { signInSchema } from '../../shared/schemas/session';
import type { Config } from '../config';
import { ApiError } from '../errors';
import { isKnownDevice, rememberDevice } from '../auth/knownDevice';
import { markSignedIn } from '../auth/session';
import { csrfTokenFor } from '../middlewares/csrf';
import { tooManyHandler } from '../middlewares/tooManyHandler';
import { parseOrThrow } from '../middlewares/validate';
import type { Actor } from '../policies/actor';
import { presentSessionUser } from '../presenters/user';

const emailOf = (req: Request) =>
  String((req.body as { email?: unknown })?.email ?? '')
    .trim()
    .toLowerCase();

function signInLimiter(windowMs: number, limit: number, key: (req: Request) => string, skip?: (req: Request) => boolean) {
  return rateLimit({
    windowMs,
    limit,
    skipSuccessfulRequests: true, // only failed attempts count
    keyGenerator: key,
    skip,
    validate: { keyGeneratorIpFallback: false },
    handler: tooManyHandler(windowMs, 'Too many failed sign-ins. Wait a few minutes and try again.'),
  });
}

export function sessionRoutes(config: Config, pp: typeof passport) {
  const router = Router();
  // Three counters of failures: one address guessing many accounts; one account guessed from one address
  // (fast; a stranger locks out only themself); and one account guessed from anywhere (slower), which
  // a browser that signed in to that account before does not feel, so its owner is never locked out.
  const perAddress = signInLimiter(config.signInLimitWindowMs, config.signInLimitPerAddress, (req) => `addr:${req.ip}`);
  const perAccountAddress = signInLimiter(config.signInLimitWindowMs, config.signInLimitPerAccountAddress, (req) => `pair:${emailOf(req)}|${req.ip}`);
  const perAccount = signInLimiter(
    config.signInAccountWindowMs,
    config.signInLimitPerAccount,
    (req) => `acct:${emailOf(req)}`,
    (req) => isKnownDevice(req, config, emailOf(req)),
  );

  router.get('/', (req, res) => {
    res.json({ user: req.user ? presentSessionUser(req.user as Actor) : null, csrfToken: csrfTokenFor(req) });
  });

  router.post('/', perAddress, perAccountAddress, perAccount, (req, res, next) => {
    const input = parseOrThrow(signInSchema, req.body, 'sign-in');
    req.body = input;
    pp.authenticate('local', (err: unknown, actor: Actor | false) => {
      if (err) return next(err);
      if (!actor) return next(new ApiError(401, 'wrong_credentials', 'That e-mail and password do not match an active account.'));
      // passport regenerates the session id here, so a planted id is useless after sign-in.
      req.login(actor, (loginErr) => {
        if (loginErr) return next(loginErr);
        markSignedIn(req, config);
        rememberDevice(res, config, actor.email);
        res.json({ user: presentSessionUser(actor), csrfToken: csrfTokenFor(req) });
      });
    })(req, res, next);
  });

  router.delete('/', (req, res, next) => {
    req.logout((err) => {
      if (err) return next(err);
      req.session.destroy((destroyErr) => {
        if (destroyErr) return next(destroyErr);
        res.clearCookie('parapet.sid');
        res.status(204).end();
      });
    });
  });

  return router;
}
