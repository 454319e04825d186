// What a service says when it refuses: the kind of refusal in the café's terms, never an HTTP
// status. The one error handler (server/errors.ts) turns each kind into its status; the same
// errors reach a test or a script unchanged. `code` is the API's error code the screens read.
import type { ErrorCode } from './errors';

export type Refusal =
  /** the input breaks a rule (400) */
  | 'invalid'
  /** a file of a type we don't take (415) */
  | 'unsupported'
  /** who is asking could not be confirmed (401) */
  | 'unauthenticated'
  /** this person may not do this (403) */
  | 'forbidden'
  | 'not_found'
  /** the state changed or does not allow it now (409) */
  | 'conflict'
  /** the card was declined (402) */
  | 'declined'
  /** too many tries; wait (429) */
  | 'too_many'
  /** a service we depend on did not answer (502) */
  | 'upstream'
  /** this café has not set the service up (503) */
  | 'not_set_up';

export class DomainError extends Error {
  constructor(
    readonly refusal: Refusal,
    readonly code: ErrorCode,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
  }
}

export const invalid = (message: string, details?: unknown) => new DomainError('invalid', 'validation_failed', message, details);
/** A field-by-field refusal: [{ path, message }]. */
export const fieldsNeedFixing = (details: { path: string; message: string }[]) => invalid('Some fields need fixing', details);
export const unsupported = (message: string, details?: unknown) => new DomainError('unsupported', 'validation_failed', message, details);
export const unauthenticated = (message: string, details?: unknown) => new DomainError('unauthenticated', 'unauthenticated', message, details);
export const forbidden = (message: string) => new DomainError('forbidden', 'forbidden', message);
export const notFound = (what: string) => new DomainError('not_found', 'not_found', `${what} not found`);
/** Not found, in a message of its own. */
export const gone = (message: string) => new DomainError('not_found', 'not_found', message);
export const conflict = (message: string, details?: unknown, code: ErrorCode = 'conflict') => new DomainError('conflict', code, message, details);
export const declined = (message: string, details?: unknown) => new DomainError('declined', 'payment_declined', message, details);
export const tooMany = (message: string, details?: unknown) => new DomainError('too_many', 'rate_limited', message, details);
export const upstreamFailed = (message: string, details?: unknown, code: ErrorCode = 'payment_unavailable') =>
  new DomainError('upstream', code, message, details);
export const notSetUp = (message: string) => new DomainError('not_set_up', 'unavailable', message);
