// The realtime hub: services publish committed events, sockets subscribe per location.
// Kept behind this small interface so a broker-backed hub (several processes) is one module.
import type { AnyLiveEvent } from '@/domain/types';

export type EventListener = (event: AnyLiveEvent) => void;

export interface Hub {
  publish(locationId: number, event: AnyLiveEvent): void;
  subscribe(locationId: number, listener: EventListener): () => void;
}

export function createInProcessHub(): Hub {
  const listeners = new Map<number, Set<EventListener>>();
  return {
    publish(locationId, event) {
      for (const listener of listeners.get(locationId) ?? []) listener(event);
    },
    subscribe(locationId, listener) {
      const set = listeners.get(locationId) ?? new Set();
      set.add(listener);
      listeners.set(locationId, set);
      return () => set.delete(listener);
    },
  };
}
