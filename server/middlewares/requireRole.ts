import type { NextFunction, Request, Response } from 'express';
import { Unauthenticated } from '../errors';
import type { Actor } from '../policies/actor';
import { authorize } from '../policies/authorize';

/**
 * A gate for routes that belong to some roles only (planning, settings, the outbox): a caller whose
 * role may never use the route hears 403 before anything about their input, since no body would help.
 */
export function requireRole(predicate: (actor: Actor) => boolean, message: string) {
  return (req: Request, _res: Response, next: NextFunction) => {
    if (!req.user) return next(Unauthenticated());
    authorize(predicate(req.user as Actor), message);
    next();
  };
}
