// Web security for the app: headers (helmet, with a Content-Security-Policy that allows no inline
// script) and a strict same-origin check on state-changing API calls (CSRF). Sign-in pacing lives
// in server/auth/sign-in-throttle.ts.
import type { RequestHandler } from 'express';
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
