import type { NextFunction, Request, Response } from 'express';
import type { z } from 'zod';
import { MAX_ID } from '../../shared/schemas/common';
import { Invalid, NotFound } from '../errors';

/** Turns zod issues into API.md's `details`, with dotted paths like `radios.0.signalDbm`. */
export function issuesToDetails(error: z.ZodError, prefix: (string | number)[] = []) {
  return error.issues.map((i) => {
    const path = [...prefix, ...i.path].map(String).join('.');
    const last = String(i.path[i.path.length - 1] ?? '');
    // Some schemas already name the field in their message; do not name it twice.
    const named = last !== '' && i.message.startsWith(`${last} `);
    const message = !path ? i.message : named ? `${path}${i.message.slice(last.length)}` : `${path} ${i.message}`;
    return { path, message };
  });
}

export function parseOrThrow<S extends z.ZodType>(schema: S, value: unknown, what = 'request'): z.infer<S> {
  const result = schema.safeParse(value);
  if (!result.success) {
    const details = issuesToDetails(result.error);
    // Some messages are whole sentences already; the summary adds its own full stop, once.
    const first = (details[0]?.message ?? 'is invalid').replace(/[.\s]+$/, '');
    const more = details.length > 1 ? ` (and ${details.length - 1} more)` : '';
    throw Invalid(`The ${what} is invalid: ${first}${more}.`, details);
  }
  return result.data;
}

type Where = 'body' | 'query' | 'params';

/** Validates one part of the request; the parsed value is stored on res.locals[where]. */
export function validate(where: Where, schema: z.ZodType) {
  return (req: Request, res: Response, next: NextFunction) => {
    // A path id beyond any id that can exist names a record that is not there: 404, like any other.
    if (where === 'params' && Object.values(req.params).some((v) => typeof v === 'string' && /^\d{10,}$/.test(v) && Number(v) > MAX_ID))
      throw NotFound('That record');
    const source = where === 'body' ? (req.body ?? {}) : where === 'query' ? req.query : req.params;
    res.locals[where] = parseOrThrow(schema, source, where === 'body' ? 'request body' : where === 'query' ? 'query' : 'address');
    next();
  };
}
