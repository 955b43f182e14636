import type { NextFunction, Request, Response } from 'express';
import { BaseError, ConnectionError, ForeignKeyConstraintError, UniqueConstraintError, ValidationError } from 'sequelize';
import { isPlanningError } from '../../shared/radio/errors';
import { ApiError, Conflict, Invalid, Unavailable } from '../errors';

/** Maps database errors that reach the handler to the client errors they really are. */
function fromDatabase(err: BaseError): ApiError | null {
  if (err instanceof ConnectionError) return Unavailable();
  if (err instanceof UniqueConstraintError) return Conflict('That name is already taken here. Choose another.', 'duplicate');
  if (err instanceof ForeignKeyConstraintError)
    return Conflict('This record is still referenced by others (or refers to one that is gone). Remove those first.', 'in_use');
  if (err instanceof ValidationError) return Invalid(err.message);
  const pgCode = (err as { parent?: { code?: string } }).parent?.code;
  if (pgCode === '23514') return Invalid('A value is outside the range the database allows.');
  if (pgCode === '22P02') return Invalid('A value has the wrong format.');
  // Input the schemas let through but PostgreSQL cannot hold: a client error, never a 500.
  if (pgCode === '22003') return Invalid('A number is larger than Parapet can store. Check the value and send a smaller one.');
  if (pgCode === '22008' || pgCode === '22007') return Invalid('A date or time is outside the range Parapet can store. Check the year.');
  if (pgCode === '22001' || pgCode === '54000') return Invalid('A text value is too long. Shorten it and try again.');
  if (pgCode === '22021' || pgCode === '22P05')
    return Invalid('A text value holds characters that cannot be stored (such as a NUL byte). Remove them and try again.');
  if (pgCode && ['57P01', '57P03', '08006', '08001', '53300'].includes(pgCode)) return Unavailable();
  return null;
}

function isConnectionFailure(err: unknown): boolean {
  const code = (err as { code?: string })?.code;
  return code === 'ECONNREFUSED' || code === 'ECONNRESET' || code === 'ETIMEDOUT' || code === '57P01';
}

export function errorHandler(err: unknown, req: Request, res: Response, _next: NextFunction) {
  let apiError: ApiError | null = null;
  if (err instanceof ApiError) apiError = err;
  else if (isPlanningError(err)) apiError = new ApiError(err.status, err.code, err.message);
  else if (err instanceof BaseError) apiError = fromDatabase(err);
  else if (isConnectionFailure(err)) apiError = Unavailable();
  else if ((err as { type?: string })?.type === 'entity.too.large') apiError = new ApiError(413, 'too_large', 'The request body is too large.');
  else if ((err as { type?: string })?.type === 'entity.parse.failed') apiError = Invalid('The request body is not valid JSON.');
  else if ((err as { status?: number })?.status === 400) apiError = Invalid('The request could not be read.');

  if (!apiError) {
    console.error(`[${res.locals.requestId ?? '-'}] unexpected error on ${req.method} ${req.originalUrl}:`, err);
    res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on our side. It has been logged.' } });
    return;
  }
  if (apiError.headers) res.set(apiError.headers);
  const body: { code: string; message: string; details?: unknown } = { code: apiError.code, message: apiError.message };
  if (apiError.details?.length) body.details = apiError.details;
  res.status(apiError.status).json({ error: body });
}
