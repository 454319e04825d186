// The owner's team screen: staff accounts, roles, invitations, PINs; the welcome link that sets a
// password; and the PIN switch of a shared terminal (which lives here, beside the PINs it checks).
// The handlers of their commands (src/commands.ts).
import type { Request, RequestHandler } from 'express';
import { rateLimit, type Store } from 'express-rate-limit';
import { chooseCafe, publicUser } from '@server/auth/cafe-in-view';
import type { Limits } from '@server/auth/shared-limits';
import type { SessionUser } from '@/domain/types';
import type { CommandHandlers } from '@server/commands';
import { HttpError } from '@server/errors';
import { DomainError } from '@server/domain-errors';
import { acceptLink, sendLink } from './invitations';
import { checkPinSwitch, setOwnPin, setPin } from './pins';
import { addPerson, updatePerson } from './team';
import { signOutEverywhere } from './sessions';

/** Wrong PINs from one address in 15 minutes, whoever they were for. */
export const WRONG_PINS_PER_ADDRESS = 20;
/** Wrong passwords when setting one's own PIN, per person per hour. */
export const WRONG_PASSWORDS_PER_PERSON = 10;

const originOf = (req: Request) => `${req.protocol}://${req.get('host')}`;

/** Signs the request's session in as `user` under a new session id (passport regenerates it). */
const logIn = (req: Request, user: SessionUser) => new Promise<void>((resolve, reject) => req.logIn(user, (err) => (err ? reject(err) : resolve())));

function throttle(opts: { windowMs: number; limit: number; key?: (req: Request) => string; message: string; store: Store }): RequestHandler {
  return rateLimit({
    store: opts.store,
    windowMs: opts.windowMs,
    limit: opts.limit,
    // only the refusals a route marks as a wrong secret count; a good one or a typo'd body doesn't
    skipSuccessfulRequests: true,
    requestWasSuccessful: (_req, res) => !res.locals.wrongSecret,
    ...(opts.key ? { keyGenerator: opts.key } : {}),
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, _res, next) => next(new HttpError(429, 'rate_limited', opts.message)),
  });
}

/** The team's commands, the PIN switch and the welcome link (src/commands.ts); the throttles count in `limits`. */
export function teamCommands(
  limits: Limits,
): CommandHandlers<'addPerson' | 'updatePerson' | 'sendLink' | 'setPin' | 'setOwnPin' | 'switchPerson' | 'chooseCafe' | 'acceptLink'> {
  const pinsFromAddress = throttle({
    windowMs: 15 * 60_000,
    limit: WRONG_PINS_PER_ADDRESS,
    message: 'Too many wrong PINs from this terminal. Wait 15 minutes, or sign in with a password.',
    store: limits.rateLimitStore('wrong-pins'),
  });
  const ownPasswordTries = throttle({
    windowMs: 60 * 60_000,
    limit: WRONG_PASSWORDS_PER_PERSON,
    key: (req) => `user:${req.user?.id ?? 'none'}`,
    message: 'Too many wrong passwords. Wait an hour, or ask the owner to set your PIN.',
    store: limits.rateLimitStore('wrong-own-passwords'),
  });

  return {
    addPerson: ({ deps, user, req }, body) => addPerson(deps, user, body, originOf(req)),
    updatePerson: async ({ deps, user, params }, body) => ({ member: await updatePerson(deps, user, params.id, body) }),
    sendLink: ({ deps, user, params, req }, { purpose }) => sendLink(deps, user, params.id, purpose, originOf(req)),
    setPin: ({ deps, user, params }, { pin }) => setPin(deps, user.locationId, params.id, pin),
    // any signed-in person, for their own PIN
    setOwnPin: {
      before: [ownPasswordTries],
      handle: async ({ deps, user, res }, body) => {
        try {
          await setOwnPin(deps, user, body.password, body.pin);
        } catch (err) {
          if (err instanceof DomainError && err.refusal === 'unauthenticated') res.locals.wrongSecret = true;
          throw err;
        }
      },
    },
    // Only from a terminal already signed in to the same café; never from a signed-out one.
    switchPerson: {
      before: [pinsFromAddress],
      handle: async ({ deps, user, req, res }, body) => {
        const outcome = await checkPinSwitch(deps, user, body);
        if (!outcome.ok) {
          if (outcome.wrongPin) res.locals.wrongSecret = true;
          const retryAt = (outcome.error.details as { retryAt?: string } | undefined)?.retryAt;
          if (retryAt) res.set('Retry-After', String(Math.max(1, Math.ceil((Date.parse(retryAt) - deps.clock().getTime()) / 1000))));
          throw outcome.error;
        }
        const oldSid = req.sessionID;
        await logIn(req, outcome.user);
        deps.sessions.emit('switched', oldSid);
        return { user: publicUser(outcome.user) };
      },
    },
    // an owner, for their own session: from the next request on it works on the chosen café, and
    // its live sockets close with a code that makes every tab of the session load again (its page
    // holds the other café's menu, board and sequence numbers)
    chooseCafe: async ({ deps, user, req }, { locationId }) => {
      const cafe = await chooseCafe(deps.db, user, req.sessionID, locationId);
      deps.sessions.emit('cafe-chosen', req.sessionID);
      return { cafe };
    },
    acceptLink: async ({ deps, params, req }, { password }) => {
      const user = await acceptLink(deps, params.token, password);
      const previous = req.user ? req.sessionID : null;
      // a new password ends the person's sessions elsewhere (a reset may be about a leaked one)
      await signOutEverywhere(deps, user.id, req.sessionID);
      await logIn(req, user);
      if (previous) deps.sessions.emit('switched', previous);
      return { user: publicUser(user) };
    },
  };
}
