// Offline orders: orders the Counter took but could not hand to the server yet, kept in this
// browser's IndexedDB so a reload or a crashed tab doesn't lose them. Each keeps its
// clientOrderId, so a resend that the server already has is answered with the same order, never
// a second one.
//
// Nothing here touches indexedDB until a function is called, and never where it doesn't exist
// (the server render): there the orders live in memory for as long as the process does.
import { createStore, del, set, values, type UseStore } from 'idb-keyval';
import type { CreateOrderBody } from '@/domain/schemas';

export interface OfflineOrder {
  clientOrderId: string;
  /** Exactly what is POSTed to /api/orders, id included. */
  body: CreateOrderBody;
  /** The total the Counter showed when the order was taken (the server prices it again). */
  totalCents: number | null;
  /** ISO-8601 UTC, when the cashier pressed Send. */
  queuedAt: string;
  /** Resends tried so far. */
  attempts: number;
  /**
   * waiting: a cash order, resent automatically; refused: the server said no (4xx) and the cashier
   * decides; held: a card order (or a split with a card part), never sent by itself — the cashier charges it with the customer
   * there, records that they paid cash, or cancels it.
   */
  state: 'waiting' | 'refused' | 'held';
  /** The last failure: a lost connection, or the server's own message for a refusal. */
  lastError: { status: number; code: string; message: string } | null;
}

/** A card is in the payment (a card order, or a split with a card part): never sent unasked. */
export function takesCard(payment: CreateOrderBody['payment']): boolean {
  return payment.method === 'card' || (payment.method === 'split' && payment.parts.some((p) => p.method === 'card'));
}

// Used when indexedDB is missing, or when a write to it fails (a full or blocked store): an
// order kept in memory is still resent while the tab lives, rather than dropped.
const memory = new Map<string, OfflineOrder>();
let store: UseStore | null = null;

function idb(): UseStore | null {
  if (typeof indexedDB === 'undefined') return null;
  // the store keeps its first name, so orders a browser already holds are still found
  store ??= createStore('jugline', 'pending-orders');
  return store;
}

export async function putOfflineOrder(order: OfflineOrder): Promise<void> {
  const s = idb();
  if (s) {
    try {
      await set(order.clientOrderId, order, s);
      memory.delete(order.clientOrderId);
      return;
    } catch {
      /* fall through to memory */
    }
  }
  memory.set(order.clientOrderId, order);
}

/** Every offline order, the oldest first (the order they were taken in). */
export async function listOfflineOrders(): Promise<OfflineOrder[]> {
  const s = idb();
  let stored: OfflineOrder[] = [];
  if (s) {
    try {
      stored = await values<OfflineOrder>(s);
    } catch {
      stored = [];
    }
  }
  const byId = new Map(stored.map((o) => [o.clientOrderId, o]));
  for (const o of memory.values()) byId.set(o.clientOrderId, o);
  // a card order stored as waiting (by an older page) is held all the same: never charged unasked
  return [...byId.values()]
    .map((o) => (o.state === 'waiting' && takesCard(o.body.payment) ? { ...o, state: 'held' as const } : o))
    .sort((a, b) => a.queuedAt.localeCompare(b.queuedAt) || a.clientOrderId.localeCompare(b.clientOrderId));
}

export async function removeOfflineOrder(clientOrderId: string): Promise<void> {
  memory.delete(clientOrderId);
  const s = idb();
  if (s) await del(clientOrderId, s);
}
