// The owner's team screen: staff accounts, roles, invitations, PINs; the welcome link that sets a
// password; and the PIN switch of a shared terminal (which lives here, beside the PINs it checks).
import type { Request, RequestHandler } from 'express';
import { rateLimit, type Store } from 'express-rate-limit';
import type { Limits } from '@server/auth/shared-limits';
import { idParam } from '@/domain/schemas';
import { newPersonBody, ownPinBody, personPatchBody, pinBody, sendLinkBody, setPasswordBody, switchBody, tokenParam } from '@/domain/team-schemas';
import type { SessionUser } from '@/domain/types';
import { userOf } from '@server/auth/guards';
import { HttpError, parse } from '@server/errors';
import { DomainError } from '@server/domain-errors';
import type { Deps } from '@server/deps';
import { acceptLink, sendLink } from './invitations';
import { checkPinSwitch, setOwnPin, setPin } from './pins';
import { addPerson, updatePerson } from './team';
import { signOutEverywhere } from './sessions';
import type { ApiRoute } from '@server/routes';

/** Wrong PINs from one address in 15 minutes, whoever they were for. */
export const WRONG_PINS_PER_ADDRESS = 20;
/** Wrong passwords when setting one's own PIN, per person per hour. */
export const WRONG_PASSWORDS_PER_PERSON = 10;

const publicUser = (u: SessionUser) => ({ id: u.id, name: u.name, role: u.role });
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

export function teamRoutes(deps: Deps, limits: Limits): ApiRoute[] {
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

  return [
    {
      method: 'post',
      path: '/team',
      capability: 'manageTeam',
      handler: async (req, res) => res.status(201).json(await addPerson(deps, userOf(req), parse(newPersonBody, req.body), originOf(req))),
    },
    {
      method: 'patch',
      path: '/team/:id',
      capability: 'manageTeam',
      handler: async (req, res) => {
        const { id } = parse(idParam, req.params, 'params');
        res.json({ member: await updatePerson(deps, userOf(req), id, parse(personPatchBody, req.body)) });
      },
    },
    {
      method: 'post',
      path: '/team/:id/link',
      capability: 'manageTeam',
      handler: async (req, res) => {
        const { id } = parse(idParam, req.params, 'params');
        const { purpose } = parse(sendLinkBody, req.body);
        res.status(202).json(await sendLink(deps, userOf(req), id, purpose, originOf(req)));
      },
    },
    {
      method: 'put',
      path: '/team/:id/pin',
      capability: 'manageTeam',
      handler: async (req, res) => {
        const { id } = parse(idParam, req.params, 'params');
        const { pin } = parse(pinBody, req.body);
        await setPin(deps, userOf(req).locationId, id, pin);
        res.status(204).end();
      },
    },
    {
      // any signed-in person, for their own PIN
      method: 'put',
      path: '/me/pin',
      capability: 'viewQueue',
      before: [ownPasswordTries],
      handler: async (req, res) => {
        const body = parse(ownPinBody, req.body);
        try {
          await setOwnPin(deps, userOf(req), body.password, body.pin);
        } catch (err) {
          if (err instanceof DomainError && err.refusal === 'unauthenticated') res.locals.wrongSecret = true;
          throw err;
        }
        res.status(204).end();
      },
    },
    {
      // Only from a terminal already signed in to the same café; never from a signed-out one.
      method: 'post',
      path: '/session/switch',
      capability: 'viewQueue',
      before: [pinsFromAddress],
      handler: async (req, res) => {
        const body = parse(switchBody, req.body);
        const outcome = await checkPinSwitch(deps, userOf(req), body);
        if (!outcome.ok) {
          if (outcome.wrongPin) res.locals.wrongSecret = true;
          const retryAt = (outcome.error.details as { retryAt?: string } | undefined)?.retryAt;
          if (retryAt) res.set('Retry-After', String(Math.max(1, Math.ceil((Date.parse(retryAt) - deps.clock().getTime()) / 1000))));
          throw outcome.error;
        }
        const oldSid = req.sessionID;
        await logIn(req, outcome.user);
        deps.sessions.emit('switched', oldSid);
        res.json({ user: publicUser(outcome.user) });
      },
    },
    {
      method: 'post',
      path: '/welcome/:token',
      capability: null,
      handler: async (req, res) => {
        const { token } = parse(tokenParam, req.params, 'params');
        const { password } = parse(setPasswordBody, req.body);
        const user = await acceptLink(deps, token, password);
        const previous = req.user ? req.sessionID : null;
        // a new password ends the person's sessions elsewhere (a reset may be about a leaked one)
        await signOutEverywhere(deps, user.id, req.sessionID);
        await logIn(req, user);
        if (previous) deps.sessions.emit('switched', previous);
        res.json({ user: publicUser(user) });
      },
    },
  ];
}
