import type { Request, Response } from 'express';
import { rateLimit } from 'express-rate-limit';
import type { Config } from '../config';
import { TooMany } from '../errors';

/**
 * Invitation and reset mail per e-mail address (run after validation, so the address is normalised).
 * Counted whether or not the address has an account, so a 429 reveals nothing about it.
 */
export function accountMailLimit(config: Config, what: string) {
  return rateLimit({
    windowMs: config.accountMailLimitWindowMs,
    limit: config.accountMailLimitPerAddress,
    keyGenerator: (_req: Request, res: Response) => `${what}:${String(res.locals.body?.email ?? '')}`,
    validate: { keyGeneratorIpFallback: false },
    handler: (req, _res, next) => {
      const resetAt = (req as typeof req & { rateLimit?: { resetTime?: Date } }).rateLimit?.resetTime?.getTime() ?? Date.now() + config.accountMailLimitWindowMs;
      next(TooMany((resetAt - Date.now()) / 1000, `Too many ${what} mails for this address. Wait a while, then check the inbox for the last one before asking again.`));
    },
  });
}
