// The API's errors: a service refuses with a DomainError (server/domain-errors.ts: a kind of
// refusal, no status); the HTTP layer itself (guards, body limits, throttles) with an HttpError and
// its status. The one error handler answers both as { error: { code, message, details? } }.
import type { NextFunction, Request, Response } from 'express';
import { z } from 'zod';
import { DomainError, fieldsNeedFixing, type Refusal } from './domain-errors';

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

// the HTTP layer refuses in the same words as the services
export { conflict, notFound } from './domain-errors';

/** The status each kind of refusal answers with: the one place a service's refusal meets HTTP. */
const STATUS_OF: Record<Refusal, number> = {
  invalid: 400,
  unsupported: 415,
  unauthenticated: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  declined: 402,
  too_many: 429,
  upstream: 502,
  not_set_up: 503,
};

/** The error as HTTP answers it: a service's refusal becomes an HttpError with its status (what
 * server rendering throws, so a loader sees the status the browser's request would get). */
export function asHttpError(err: unknown): unknown {
  return err instanceof DomainError ? new HttpError(STATUS_OF[err.refusal], err.code, err.message, err.details) : err;
}

/** Field-by-field details from a zod error: [{ path: 'items.0.sizeId', message }]. */
export function validationError(error: z.ZodError, where?: string): DomainError {
  return fieldsNeedFixing(
    error.issues.map((i) => ({
      path: [where, ...i.path].filter((p) => p !== undefined && p !== '').join('.'),
      message: i.message,
    })),
  );
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
  if (err instanceof HttpError || err instanceof DomainError) {
    const status = err instanceof HttpError ? err.status : STATUS_OF[err.refusal];
    res.status(status).json({ error: { code: err.code, message: err.message, details: err.details } });
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
  // into the request's own log line (pino-http's req.log: its request id, level error), so a 500 can
  // be traced from the answer's log line to its stack; outside a logged request, to stderr
  const log = (req as { log?: { error(obj: object, msg: string): void } }).log;
  if (log) log.error({ err }, 'unexpected error');
  else console.error(err);
  res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on our side' } });
}
