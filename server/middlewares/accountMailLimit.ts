import type { Request, Response } from 'express';
import { rateLimit } from 'express-rate-limit';
import type { Config } from '../config';
import { tooManyHandler } from './tooManyHandler';

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
    handler: tooManyHandler(
      config.accountMailLimitWindowMs,
      `Too many ${what} mails for this address. Wait a while, then check the inbox for the last one before asking again.`,
    ),
  });
}
