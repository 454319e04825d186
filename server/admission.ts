// Load shedding for the API. Past a number of requests in progress at once, a new one is answered
// at once with 503 and Retry-After instead of waiting behind the others. When a rush outruns this
// process, the orders it takes still answer within a few hundred milliseconds, and the Counter keeps
// the refused ones and sends them again after Retry-After with the same clientOrderId (placed
// once). Waiting in line instead would make every order slow and grow memory with the line.
// Refused before the body is read or the session loaded, so a refusal costs almost nothing.
import type { RequestHandler } from 'express';

/** How long a refused client waits before it tries again: long enough for the line to move. */
export const SHED_RETRY_AFTER_SECONDS = 2;

export function admission(maxInFlight: number): RequestHandler {
  let inFlight = 0;
  return (_req, res, next) => {
    if (inFlight >= maxInFlight) {
      res.set('Retry-After', String(SHED_RETRY_AFTER_SECONDS));
      res.status(503).json({ error: { code: 'unavailable', message: 'Jugline is busy with other requests; try again in a moment' } });
      return;
    }
    inFlight++;
    let released = false;
    const release = () => {
      if (released) return;
      released = true;
      inFlight--;
    };
    // 'close' also fires when the client goes away before the answer is sent
    res.once('finish', release);
    res.once('close', release);
    next();
  };
}
