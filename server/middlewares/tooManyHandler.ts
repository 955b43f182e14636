import type { NextFunction, Request, Response } from 'express';
import { TooMany } from '../errors';

/**
 * The one handler every express-rate-limit limiter uses: a 429 through the error handler, with
 * Retry-After the seconds until the counter's window resets (or a whole window if the store did not say).
 */
export function tooManyHandler(windowMs: number, message: string) {
  return (req: Request, _res: Response, next: NextFunction) => {
    const resetAt = (req as Request & { rateLimit?: { resetTime?: Date } }).rateLimit?.resetTime?.getTime() ?? Date.now() + windowMs;
    next(TooMany((resetAt - Date.now()) / 1000, message));
  };
}
