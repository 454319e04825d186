// Web security for the app: headers (helmet, with a Content-Security-Policy that allows no inline
// script), a strict same-origin check on state-changing API calls (CSRF), and sign-in throttling.
import type { RequestHandler } from 'express';
import { rateLimit } from 'express-rate-limit';
import helmet from 'helmet';
import { HttpError } from './errors';

export function securityHeaders(production: boolean): RequestHandler {
  return helmet({
    // Vite's dev server injects inline scripts for hot reload; the production build needs none.
    contentSecurityPolicy: production
      ? {
          useDefaults: true,
          directives: {
            'script-src': ["'self'"],
            // React style attributes (the pour line's width) and the chart library's inline styles
            'style-src': ["'self'", "'unsafe-inline'"],
            'img-src': ["'self'", 'data:'],
            'connect-src': ["'self'"],
            'frame-src': ["'self'"],
            // a café LAN may serve over plain http: don't rewrite requests to https
            'upgrade-insecure-requests': null,
          },
        }
      : false,
    strictTransportSecurity: false, // set it at the TLS proxy, where https actually is
  });
}

const UNSAFE = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

/**
 * A browser says where a request came from (Origin, or Sec-Fetch-Site). State-changing calls
 * from another site's page are refused, so a page elsewhere can't act with a signed-in
 * cashier's cookie. Non-browser clients send neither header and are judged by their session.
 */
export function sameOriginOnly(exempt: string[]): RequestHandler {
  return (req, _res, next) => {
    if (!UNSAFE.has(req.method) || exempt.includes(req.path)) return next();
    const origin = req.get('origin');
    const site = req.get('sec-fetch-site');
    let ok = true;
    if (origin) {
      try {
        ok = new URL(origin).host === req.get('host');
      } catch {
        ok = false;
      }
    } else if (site) ok = site === 'same-origin' || site === 'none';
    next(ok ? undefined : new HttpError(403, 'forbidden', 'A request from another site was refused'));
  };
}

/** OWASP ASVS 4.0.3 V2.2.1: no more than 100 failed sign-ins an hour per account (and per address). */
export const FAILED_SIGN_INS_PER_HOUR = 100;

export function signInThrottle(): RequestHandler[] {
  const tooMany = (what: string): RequestHandler => (_req, _res, next) =>
    next(new HttpError(429, 'rate_limited', `Too many failed sign-ins ${what}. Wait an hour, or ask the owner to reset the password.`));
  const common = { windowMs: 60 * 60 * 1000, skipSuccessfulRequests: true, standardHeaders: 'draft-8' as const, legacyHeaders: false };
  return [
    rateLimit({ ...common, limit: FAILED_SIGN_INS_PER_HOUR * 3, handler: tooMany('from this address') }),
    rateLimit({
      ...common,
      limit: FAILED_SIGN_INS_PER_HOUR,
      // the body is not validated yet: String() of an object like { toString: 1 } throws (a 500)
      keyGenerator: (req) => `name:${(typeof req.body?.username === 'string' ? req.body.username : '').trim().toLowerCase()}`,
      handler: tooMany('for this name'),
    }),
  ];
}
