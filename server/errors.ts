/** One error type with a stable code; the error middleware turns it into API.md's error shape. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: { path: string; message: string }[],
    readonly headers?: Record<string, string>,
  ) {
    super(message);
  }
}

export const Invalid = (message: string, details?: { path: string; message: string }[]) => new ApiError(400, 'invalid_input', message, details);
export const Unauthenticated = (message = 'Sign in to continue.') => new ApiError(401, 'not_signed_in', message);
export const Forbidden = (message = 'Your role does not allow this.') => new ApiError(403, 'forbidden', message);
export const NotFound = (what: string) => new ApiError(404, 'not_found', `${what} was not found.`);
export const Conflict = (message: string, code = 'conflict') => new ApiError(409, code, message);
export const TooMany = (retryAfterS: number, message = 'Too many attempts. Wait a little and try again.') =>
  new ApiError(429, 'rate_limited', message, undefined, { 'Retry-After': String(Math.max(1, Math.ceil(retryAfterS))) });
export const Unavailable = (message = 'Parapet cannot reach its database right now. It reconnects by itself; try again in a few seconds.', retryAfterS = 5) =>
  new ApiError(503, 'database_unavailable', message, undefined, { 'Retry-After': String(retryAfterS) });
