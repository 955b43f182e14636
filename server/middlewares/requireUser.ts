import type { NextFunction, Request, Response } from 'express';
import { Unauthenticated } from '../errors';
import type { Actor } from '../policies/actor';

export function requireUser(req: Request, _res: Response, next: NextFunction) {
  if (!req.user) return next(Unauthenticated());
  next();
}

/** The signed-in actor; only call behind requireUser. */
export const actorOf = (req: Request): Actor => req.user as Actor;
