// What resuming screens share. A resume costs a read of the log and, for a screen far behind, a
// snapshot of the board; a café's screens reconnect together (a restart, the Wi-Fi back) and a
// faulty or hostile screen may ask again and again. So the work is done once per café and
// sequence number: screens asking at the same moment await one computation, and its result is
// reused while no new event has been logged — for a few seconds at most, so a snapshot's `now`
// and the Pickup board's ready timeout stay current. Snapshot frames are kept beside it, one per
// audience (see frames.ts).
import type { AnyLiveEvent, BoardSnapshot } from '@/domain/types';
import type { Deps } from '@server/deps';
import { eventsSince, latestSeq, moreEventsThan } from '@server/events';
import { boardSnapshot } from '@server/tickets/tickets';
import { snapshotFrames, type Audience } from './frames';

/** How long a computed snapshot or replay is reused while the log has not moved. */
export const REUSE_MS = 5_000;
/** Replays from this many different places in the log are kept per café; more are read unshared. */
const KEPT_REPLAYS = 16;

export type ResumeAnswer =
  { kind: 'replay'; events: AnyLiveEvent[] } | { kind: 'snapshot'; snapshot: BoardSnapshot; frame: (audience: Audience, nowIso: string) => string };

type SharedSnapshot = Extract<ResumeAnswer, { kind: 'snapshot' }>;

/** One café's shared work at one sequence number. */
interface Shared {
  seq: number;
  at: number;
  snapshot?: Promise<SharedSnapshot>;
  /** By `since`; null: more than `maxReplay` events behind (a snapshot instead). */
  replays: Map<number, Promise<AnyLiveEvent[] | null>>;
}

export interface ResumeSource {
  answer(locationId: number, since: number): Promise<ResumeAnswer>;
  /** Drops what has outlived REUSE_MS (the socket server's heartbeat calls it). */
  prune(): void;
}

/** A promise kept in a cache is dropped from it if it fails, so the next screen tries afresh. */
function keep<T>(promise: Promise<T>, drop: () => void): Promise<T> {
  promise.catch(drop);
  return promise;
}

export function createResumeSource(deps: Deps, maxReplay: number): ResumeSource {
  const byLocation = new Map<number, Shared>();
  const now = () => deps.clock().getTime();
  const fresh = (s: Shared, t: number) => t >= s.at && t - s.at <= REUSE_MS;

  async function sharedAt(locationId: number): Promise<Shared> {
    const seq = await latestSeq(deps.db, locationId);
    const t = now();
    let shared = byLocation.get(locationId);
    if (!shared || shared.seq !== seq || !fresh(shared, t)) {
      shared = { seq, at: t, replays: new Map() };
      byLocation.set(locationId, shared);
    }
    return shared;
  }

  async function readReplay(locationId: number, since: number): Promise<AnyLiveEvent[] | null> {
    if (await moreEventsThan(deps.db, locationId, since, maxReplay)) return null;
    const events = await eventsSince(deps.db, locationId, since, maxReplay);
    return events.length > maxReplay ? null : events; // events logged since the probe
  }

  async function buildSnapshot(locationId: number): Promise<SharedSnapshot> {
    const snapshot = await boardSnapshot(deps, locationId);
    return { kind: 'snapshot', snapshot, frame: snapshotFrames(snapshot) };
  }

  return {
    async answer(locationId, since) {
      const shared = await sharedAt(locationId);
      // Nothing logged after `since` when we looked: anything newer reaches the socket live.
      if (since >= shared.seq) return { kind: 'replay', events: [] };
      let replay = shared.replays.get(since);
      if (!replay) {
        replay = readReplay(locationId, since);
        if (shared.replays.size < KEPT_REPLAYS)
          shared.replays.set(
            since,
            keep(replay, () => shared.replays.delete(since)),
          );
      }
      const events = await replay;
      if (events) return { kind: 'replay', events };
      shared.snapshot ??= keep(buildSnapshot(locationId), () => (shared.snapshot = undefined));
      return shared.snapshot;
    },
    prune() {
      const t = now();
      for (const [locationId, shared] of byLocation) if (!fresh(shared, t)) byLocation.delete(locationId);
    },
  };
}
