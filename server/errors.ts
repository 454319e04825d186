// One error type for the whole API; the error handler turns it into
// { error: { code, message, details? } } with its status.
import type { NextFunction, Request, Response } from 'express';
import { z } from 'zod';

export type ErrorCode =
  | 'validation_failed'
  | 'unauthenticated'
  | 'forbidden'
  | 'not_found'
  | 'conflict'
  | 'open_tickets'
  | 'unavailable'
  | 'payload_too_large'
  | 'payment_declined'
  | 'rate_limited'
  | 'payment_unavailable'
  | 'internal';

export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: ErrorCode,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
  }
}

// which database errors mean "busy, try again" is a dialect difference (db/dialect.ts)
import { isDatabaseBusy } from './db/dialect';
export { isDatabaseBusy };

/** What a busy database answers with: the other program's transaction is likely over by then. */
export const BUSY_RETRY_AFTER_SECONDS = 5;

export const notFound = (what: string) => new HttpError(404, 'not_found', `${what} not found`);
export const conflict = (message: string, details?: unknown) => new HttpError(409, 'conflict', message, details);

/** Field-by-field details from a zod error: [{ path: 'items.0.sizeId', message }]. */
export function validationError(error: z.ZodError, where?: string): HttpError {
  const details = error.issues.map((i) => ({
    path: [where, ...i.path].filter((p) => p !== undefined && p !== '').join('.'),
    message: i.message,
  }));
  return new HttpError(400, 'validation_failed', 'Some fields need fixing', details);
}

export function parse<T extends z.ZodType>(schema: T, value: unknown, where?: string): z.infer<T> {
  const result = schema.safeParse(value);
  if (!result.success) throw validationError(result.error, where);
  return result.data;
}

export function errorHandler(err: unknown, req: Request, res: Response, _next: NextFunction): void {
  if (res.headersSent) return;
  if (isDatabaseBusy(err)) {
    // Nothing of a refused request is kept: without its session, express-session neither saves
    // nor touches it as the response ends (its `unset: 'keep'`), so no write waits on the lock.
    (req as { session?: unknown }).session = undefined;
    res.set('Retry-After', String(BUSY_RETRY_AFTER_SECONDS));
    res.status(503).json({ error: { code: 'unavailable', message: 'The database is busy; try again in a moment' } });
    return;
  }
  if (err instanceof HttpError) {
    res.status(err.status).json({ error: { code: err.code, message: err.message, details: err.details } });
    return;
  }
  // body-parser errors carry a status and a type
  const e = err as { status?: number; type?: string; message?: string };
  if (e?.type === 'entity.parse.failed') {
    res.status(400).json({ error: { code: 'validation_failed', message: 'The body is not valid JSON' } });
    return;
  }
  if (e?.type === 'entity.too.large') {
    res.status(413).json({ error: { code: 'payload_too_large', message: 'The body is too large' } });
    return;
  }
  // Other request errors from body-parser or the router (an unsupported charset or encoding: 415;
  // a :param that is not valid percent-encoding: 400) are the client's, not ours.
  if (typeof e?.status === 'number' && e.status >= 400 && e.status < 500) {
    const message = e.status === 415 ? 'The body must be UTF-8 JSON' : 'The request could not be read';
    res.status(e.status).json({ error: { code: 'validation_failed', message } });
    return;
  }
  console.error(err);
  res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on our side' } });
}
