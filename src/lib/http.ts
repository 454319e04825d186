// The browser's JSON client for /api. Errors arrive in one shape and become ApiError.
import { PASSIVE_REQUEST_HEADER } from '@/reads';
export interface ErrorDetail {
  path: string;
  message: string;
}

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: ErrorDetail[],
    /** How long the server asked to be left alone (its Retry-After), when it said. */
    readonly retryAfterMs?: number,
  ) {
    super(message);
  }
}

/**
 * A Retry-After header as ms from `now`, or undefined when there is none or it can't be read.
 * RFC 9110 §10.2.3: Retry-After = HTTP-date / delay-seconds. An HTTP-date is always UTC and starts
 * with the day's name in all three forms a recipient must accept (§5.6.7); the obsolete asctime
 * form doesn't say GMT, and Date.parse would take it as local time. Requiring the name first also
 * keeps Date.parse's leniency ("1.5" is a date to it) out.
 */
export function retryAfterMs(header: string | null, now: number): number | undefined {
  const value = header?.trim();
  if (!value) return undefined;
  if (/^\d+$/.test(value)) return Number(value) * 1000;
  if (!/^[A-Za-z]{3}/.test(value)) return undefined;
  const at = Date.parse(value.endsWith('GMT') ? value : `${value} GMT`);
  return Number.isNaN(at) ? undefined : Math.max(0, at - now);
}

/** To sign-in, coming back here after; not from sign-in itself or a welcome link (both signed out). */
export function goToSignIn() {
  if (typeof window === 'undefined' || leaving) return;
  if (!window.location.pathname.startsWith('/signin') && !window.location.pathname.startsWith('/welcome')) {
    leavePage(`/signin?next=${encodeURIComponent(window.location.pathname + window.location.search)}`);
  }
}

let leaving = false;
/** A page change has begun: live sockets should not reconnect, screens should not refetch. */
export const isLeaving = () => leaving;
/** Load another page. A request still in flight from the old session (after a PIN switch) may
 * answer 401 meanwhile; it must not turn this navigation into one to sign-in. */
export function leavePage(url: string) {
  leaving = true;
  window.location.assign(url);
}

/** End the session and load sign-in. Leaving is marked first: until the page changes, a screen's
 * own request may answer 401, and that must not send the person to sign-in with ?next= back here. */
export async function signOut() {
  leaving = true;
  await http('DELETE', '/session').catch(() => undefined);
  window.location.assign('/signin');
}

/**
 * While a person switch is asked for, the screen reads nothing more: the server may already hold
 * the new person's session, whose role can't read this screen (a 403 that means nothing). Released
 * if the switch is refused.
 */
export function holdReads(on: boolean) {
  leaving = on;
}

/** "?a=1&b=x" from the defined values, in the given order. */
export function queryString(params: object): string {
  const search = new URLSearchParams();
  for (const [k, v] of Object.entries(params)) if (v !== undefined && v !== null && v !== '') search.set(k, String(v));
  const text = search.toString();
  return text ? `?${text}` : '';
}

/** A screen's own background refresh: not a person at work, so it doesn't keep an idle session alive. */
export { PASSIVE_REQUEST_HEADER };

export async function http<T>(method: string, path: string, body?: unknown, opts: { passive?: boolean } = {}): Promise<T> {
  // the page is changing: a read now would only be answered for the session that replaces it
  if (leaving && method === 'GET') throw new ApiError(0, 'leaving', 'The page is changing');
  let res: Response;
  try {
    res = await fetch(`/api${path}`, {
      method,
      credentials: 'same-origin',
      headers: {
        accept: 'application/json',
        ...(body === undefined ? {} : { 'content-type': 'application/json' }),
        ...(opts.passive ? { [PASSIVE_REQUEST_HEADER]: '1' } : {}),
      },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
  } catch {
    throw new ApiError(0, 'offline', 'No connection to the Jugline server');
  }
  if (res.status === 204) return undefined as T;
  const data = await res.json().catch(() => null);
  if (!res.ok) {
    // The session ended (idle or 8 h limit): to sign-in and back. /session answers 401 to a wrong
    // password or PIN, which the form shows itself.
    if (res.status === 401 && !path.startsWith('/session')) goToSignIn();
    const e = data?.error ?? {};
    throw new ApiError(
      res.status,
      e.code ?? 'internal',
      e.message ?? `Request failed (${res.status})`,
      e.details,
      retryAfterMs(res.headers.get('retry-after'), Date.now()),
    );
  }
  return data as T;
}
