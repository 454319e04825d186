// Load shedding for the API. When a rush outruns this process, a new request is answered at once
// with 503 and Retry-After instead of waiting behind the others: the orders it takes still answer
// within a few hundred milliseconds, and the Counter keeps the refused ones and sends them again
// after Retry-After with the same clientOrderId (placed once). Waiting in line instead makes every
// order slow and grows memory with the line. Two signs of a rush, because the line forms in two
// places:
// - requests in progress at once (past MAX_REQUESTS_IN_FLIGHT): where commands wait on real I/O,
//   as on PostgreSQL;
// - the event loop stalled: on SQLite a command runs start to end without yielding, so requests
//   never overlap here — they wait unread in the socket buffers while the loop works through the
//   ones it read before. A request read when the loop has not come round for longer than
//   MAX_LOOP_STALL_MS waited at least that long already. Only new orders are refused for that:
//   they are what a rush brings more of, and the Counter holds them; the Bar's bumps and the
//   screens' reads are what clears the line, and a slow report must not turn a bump away.
// Refused before the body is read or the session loaded, so a refusal costs almost nothing.
import type { Request, RequestHandler } from 'express';

/** How long a refused client waits before it tries again: long enough for the line to move. */
export const SHED_RETRY_AFTER_SECONDS = 2;
const TICK_MS = 10;

export interface AdmissionLimits {
  maxInFlight: number;
  /** Time the loop may go without coming round before a new order is refused (ms); 0: never. */
  maxStallMs: number;
  /** The requests a stall refuses; new orders (server/app.ts). */
  shedOnStall: (req: Request) => boolean;
}

export function admission({ maxInFlight, maxStallMs, shedOnStall }: AdmissionLimits): RequestHandler {
  let inFlight = 0;
  let lastTick = performance.now();
  // a timer runs only between the loop's rounds: the time since it last ran is the current stall
  // (unref: it never keeps a process alive that has nothing else to do)
  setInterval(() => (lastTick = performance.now()), TICK_MS).unref();
  return (req, res, next) => {
    const stalled = maxStallMs > 0 && performance.now() - lastTick > maxStallMs && shedOnStall(req);
    if (inFlight >= maxInFlight || stalled) {
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
