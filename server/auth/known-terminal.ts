// The "known terminal" cookie (OWASP "Slow Down Online Guessing Attacks with Device Cookies"): a
// browser that has signed in as a person gets a cookie signed with the server's secret naming it
// and the people who signed in on it. An attempt from it for one of those people is judged by the
// terminal's own count of failures, not slowed by a flood of guesses for the name from elsewhere.
// The cookie holds a random id and a keyed hash per name (no names in clear); it goes only to the
// sign-in path.
import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';
import type { Request, Response } from 'express';

export const KNOWN_TERMINAL_COOKIE = 'jugline.known';
export const KNOWN_TERMINAL_PATH = '/api/session';
/** People remembered per terminal: a shared Counter tablet sees a handful. */
const MAX_NAMES = 8;
const KEEP_MS = 180 * 24 * 60 * 60_000;
const TAG_CHARS = 11; // 8 bytes of HMAC, base64url
const VALUE = new RegExp(`^([A-Za-z0-9_-]{22})\\.((?:[A-Za-z0-9_-]{${TAG_CHARS}}){1,${MAX_NAMES}})\\.([A-Za-z0-9_-]{43})$`);

interface Terminal {
  id: string;
  tags: string[];
}

function cookieValue(header: string | undefined): string | undefined {
  for (const part of (header ?? '').split(';')) {
    const eq = part.indexOf('=');
    if (eq > 0 && part.slice(0, eq).trim() === KNOWN_TERMINAL_COOKIE) return part.slice(eq + 1).trim();
  }
  return undefined;
}

export function knownTerminals(secret: string) {
  const mac = (purpose: string, text: string) => createHmac('sha256', secret).update(`jugline ${purpose}\u0000${text}`).digest('base64url');
  const tagOf = (name: string) => mac('known-name', name).slice(0, TAG_CHARS);
  const sign = (id: string, tags: string[]) => mac('known-terminal', `${id}.${tags.join('')}`);

  function read(req: Request): Terminal | null {
    const match = VALUE.exec(cookieValue(req.headers.cookie) ?? '');
    if (!match) return null;
    const [, id, joined, signature] = match;
    const tags = joined.match(new RegExp(`.{${TAG_CHARS}}`, 'g')) ?? [];
    const expected = Buffer.from(sign(id, tags));
    const given = Buffer.from(signature);
    return given.length === expected.length && timingSafeEqual(given, expected) ? { id, tags } : null;
  }

  return {
    /** The terminal's id when this browser has signed in as `name` (trimmed, lower case) before. */
    idFor(req: Request, name: string): string | null {
      const terminal = read(req);
      return terminal?.tags.includes(tagOf(name)) ? terminal.id : null;
    },
    /** After a sign-in as `name`: remember the name on this terminal (newest first). */
    remember(req: Request, res: Response, name: string): void {
      const terminal = read(req) ?? { id: randomBytes(16).toString('base64url'), tags: [] };
      const tag = tagOf(name);
      const tags = [tag, ...terminal.tags.filter((t) => t !== tag)].slice(0, MAX_NAMES);
      res.cookie(KNOWN_TERMINAL_COOKIE, `${terminal.id}.${tags.join('')}.${sign(terminal.id, tags)}`, {
        httpOnly: true,
        sameSite: 'lax',
        secure: req.secure,
        path: KNOWN_TERMINAL_PATH,
        maxAge: KEEP_MS,
      });
    },
  };
}
