// What goes down a live socket, as text. One event (or snapshot) goes to many screens, so it is
// serialised once per audience, not once per socket: with 1,000 screens per-socket serialising
// was most of the server's time per order (see BENCHMARKS.md). A Pickup screen faces customers
// and gets the Pickup shape of the same event (src/domain/pickup.ts), whatever the role of the
// session that set it up; every other screen gets the full event.
import { pickupEvent, pickupView, type PickupServerMessage } from '@/domain/pickup';
import type { AnyLiveEvent, BoardSnapshot, ServerMessage } from '@/domain/types';

export type Audience = 'staff' | 'pickup';

const eventFrames = new WeakMap<AnyLiveEvent, Partial<Record<Audience, string>>>();

export function eventFrame(event: AnyLiveEvent, audience: Audience): string {
  let frames = eventFrames.get(event);
  if (!frames) eventFrames.set(event, (frames = {}));
  return (frames[audience] ??=
    audience === 'pickup'
      ? JSON.stringify({ type: 'event', event: pickupEvent(event) } satisfies PickupServerMessage)
      : JSON.stringify({ type: 'event', event } satisfies ServerMessage));
}

const NOW = '"now":"';

/**
 * A snapshot's frame for each audience, each serialised once, when first asked for. A shared
 * snapshot may be a few seconds old when it is sent again, and screens set their clock by its
 * `now`: each send writes the time of sending there (an ISO time always has 24 characters).
 */
export function snapshotFrames(snapshot: BoardSnapshot): (audience: Audience, nowIso: string) => string {
  const frames: Partial<Record<Audience, string>> = {};
  return (audience, nowIso) => {
    const frame = (frames[audience] ??=
      audience === 'pickup'
        ? JSON.stringify({ type: 'snapshot', snapshot: pickupView(snapshot) } satisfies PickupServerMessage)
        : JSON.stringify({ type: 'snapshot', snapshot } satisfies ServerMessage));
    // the first "now" is the snapshot's own: it follows `seq`, before any ticket
    const at = frame.indexOf(NOW) + NOW.length;
    return frame.slice(0, at) + nowIso + frame.slice(at + nowIso.length);
  };
}
