// The Counter's offline orders. An order the server can't be reached for (no connection, or a gateway
// answering 502/503/504) is kept in this browser and resent with the same clientOrderId: on a
// timer with backoff, never sooner than a Retry-After the server gave; when the browser says it is
// back online, when the live socket reconnects, and when the cashier taps "Send now". An order the
// server refuses (4xx) is never queued; one that was queued and is refused later stays, with the
// server's message, until discarded.
// A card order is never sent by itself: a card is charged with the customer standing there, and
// meanwhile they may have paid cash. It is held until the cashier chooses (settleHeld).
import { useQueryClient } from '@tanstack/react-query';
import { useCallback, useEffect, useRef, useState } from 'react';
import type { CreateOrderBody } from '@/domain/schemas';
import type { OrderView } from '@/domain/types';
import { send } from '@/lib/commands';
import { ApiError } from '@/lib/http';
import { onLiveConnected } from '@/lib/live-socket';
import { menuKeys } from '@/queries/menu';
import { listOfflineOrders, putOfflineOrder, removeOfflineOrder, takesCard, type OfflineOrder } from './offline-orders';

export type SendOrderFn = (body: CreateOrderBody) => Promise<{ order: OrderView }>;

export type SendOutcome = { queued: false; order: OrderView } | { queued: true; offlineOrder: OfflineOrder };

export interface OfflineOrdersOptions {
  /** Resends of queued orders; POST /api/orders unless a test passes its own. */
  resend?: SendOrderFn;
  /** Wait before the n-th automatic resend after a failed round (n from 1). */
  retryDelayMs?: (failures: number) => number;
}

export interface OfflineOrders {
  /** Orders not on the server yet, the oldest first. */
  orders: OfflineOrder[];
  /** True while a round of resends is running. */
  resending: boolean;
  /**
   * Send an order; if the server can't be reached, keep it and resend it later. Resolves with
   * the order, or with `queued: true`. Rejects, as a plain send would, when the server refuses it.
   */
  sendOrQueue(body: CreateOrderBody, summary?: { totalCents?: number }): Promise<SendOutcome>;
  /** Resend now; with an id, also give a refused order another try. */
  retryNow(clientOrderId?: string): void;
  /** Drop an order for good (the cashier's decision, after a refusal, or cancelling a held card order). */
  discard(clientOrderId: string): Promise<void>;
  /**
   * The cashier's choice for a held card order: run the card now (the customer is there) or send
   * it as paid in cash for the total shown. Resolves with the order once the server has it; a
   * cash choice the server can't be reached for waits like any cash order.
   */
  settleHeld(clientOrderId: string, choice: 'card' | 'cash'): Promise<OrderView | null>;
}

/** No answer from the server at all, a gateway saying it has none, or a session that timed out
 * (401: sent again once someone has signed in on this terminal): worth trying again. */
export function isUnreachable(err: unknown): boolean {
  return err instanceof ApiError && [0, 401, 502, 503, 504].includes(err.status);
}

/** The server looked at the order and said no; sending the same body again won't change that. */
function isRefusal(err: unknown): err is ApiError {
  return err instanceof ApiError && err.status >= 400 && err.status < 500 && ![401, 408, 429].includes(err.status);
}

const postOrder: SendOrderFn = (body) => send.placeOrder(body);

// 2 s, 4 s, 8 s … up to 30 s, with jitter so a room of tablets doesn't resend at once.
const defaultDelay = (failures: number) => Math.min(30_000, 1000 * 2 ** failures) * (0.75 + Math.random() / 2);

// A longer delay makes setTimeout fire at once.
const MAX_TIMER_MS = 2 ** 31 - 1;

const retryAfterOf = (err: unknown) => (err instanceof ApiError ? (err.retryAfterMs ?? 0) : 0);

const errorOf = (err: unknown): OfflineOrder['lastError'] =>
  err instanceof ApiError
    ? { status: err.status, code: err.code, message: err.message }
    : { status: 0, code: 'internal', message: err instanceof Error ? err.message : 'Could not send the order' };

/**
 * @param send the first send of each new order. The Counter passes its own mutation's
 * `mutateAsync`, so "Sending…" and a refusal show there as before; resends don't go through it.
 */
export function useOfflineOrders(send: SendOrderFn = postOrder, options: OfflineOrdersOptions = {}): OfflineOrders {
  const qc = useQueryClient();
  const [orders, setOrders] = useState<OfflineOrder[]>([]);
  const [resending, setResending] = useState(false);
  const fns = useRef({ send, resend: options.resend ?? postOrder, delay: options.retryDelayMs ?? defaultDelay });
  fns.current = { send, resend: options.resend ?? postOrder, delay: options.retryDelayMs ?? defaultDelay };
  const loop = useRef({
    running: false,
    again: false,
    failures: 0,
    /** The Retry-After of the last failure (0 if it gave none): the next automatic round waits at least this. */
    retryAfterMs: 0,
    timer: undefined as ReturnType<typeof setTimeout> | undefined,
    alive: false,
  });

  const refresh = useCallback(async () => {
    const list = await listOfflineOrders();
    if (loop.current.alive) setOrders(list);
    return list;
  }, []);

  const flushRef = useRef<() => Promise<void>>(async () => {});
  /** Set the next automatic round, if anything is still waiting. */
  const schedule = useCallback((list: OfflineOrder[]) => {
    const l = loop.current;
    clearTimeout(l.timer);
    l.timer = undefined;
    if (!l.alive || !list.some((o) => o.state === 'waiting')) return; // held card orders wait for the cashier
    const backoff = fns.current.delay(Math.max(1, l.failures));
    // An overloaded server said when to come back: not sooner. The jitter that keeps a room of
    // tablets from resending together goes only on top of that time.
    const floor = l.retryAfterMs * (1 + Math.random() / 4);
    l.timer = setTimeout(() => void flushRef.current(), Math.min(MAX_TIMER_MS, Math.max(backoff, floor)));
  }, []);

  /** One round: resend every waiting order in the order taken; stop at the first that can't get through. */
  const flush = useCallback(async () => {
    const l = loop.current;
    if (!l.alive) return;
    if (l.running) {
      l.again = true; // one round at a time; a trigger during a round runs another after it
      return;
    }
    l.running = true;
    clearTimeout(l.timer);
    setResending(true);
    try {
      do {
        l.again = false;
        l.retryAfterMs = 0;
        let blocked = false;
        for (const order of (await listOfflineOrders()).filter((o) => o.state === 'waiting' && !takesCard(o.body.payment))) {
          try {
            await fns.current.resend(order.body);
            await removeOfflineOrder(order.clientOrderId).catch(() => {
              /* still stored: the next round resends it and the server answers the same order */
            });
          } catch (err) {
            if (isRefusal(err)) {
              await putOfflineOrder({ ...order, attempts: order.attempts + 1, state: 'refused', lastError: errorOf(err) });
              if (err.status === 409) void qc.invalidateQueries({ queryKey: menuKeys.all }); // something was 86'd
              continue;
            }
            await putOfflineOrder({ ...order, attempts: order.attempts + 1, lastError: errorOf(err) });
            l.retryAfterMs = retryAfterOf(err);
            blocked = true;
            break;
          }
        }
        l.failures = blocked ? l.failures + 1 : 0;
        if (blocked) break;
      } while (l.again && l.alive);
    } finally {
      l.running = false;
      if (l.alive) setResending(false);
      const list = await refresh().catch(() => []);
      schedule(list);
    }
  }, [qc, refresh, schedule]);
  flushRef.current = flush;

  /**
   * A sign the server may be back: forget the backoff and try at once, Retry-After included.
   * "Send now" is a person asking, with the customer in front of them; the 'online' event and a
   * live socket reconnecting are news newer than the answer that set the wait. Each is one round,
   * never a second send beside one in flight (one round at a time), and a server still overloaded
   * answers with a new Retry-After that holds the automatic rounds after it.
   */
  const retrySoon = useCallback(() => {
    loop.current.failures = 0;
    void flush();
  }, [flush]);

  useEffect(() => {
    const l = loop.current;
    l.alive = true;
    // orders left from before a reload are resent as soon as the Counter opens
    void refresh().then((list) => {
      if (list.some((o) => o.state === 'waiting')) void flush();
    });
    window.addEventListener('online', retrySoon);
    const offLive = onLiveConnected(retrySoon);
    return () => {
      l.alive = false;
      clearTimeout(l.timer);
      window.removeEventListener('online', retrySoon);
      offLive();
    };
  }, [refresh, flush, retrySoon]);

  const sendOrQueue = useCallback(
    async (body: CreateOrderBody, summary: { totalCents?: number } = {}): Promise<SendOutcome> => {
      try {
        const { order } = await fns.current.send(body);
        return { queued: false, order };
      } catch (err) {
        if (!isUnreachable(err)) throw err;
        // our server answered that the card service didn't: the cashier sees that at once
        if (takesCard(body.payment) && err instanceof ApiError && err.code === 'payment_unavailable') throw err;
        const kept: OfflineOrder = {
          clientOrderId: body.clientOrderId,
          body,
          totalCents: summary.totalCents ?? null,
          queuedAt: new Date().toISOString(),
          attempts: 0,
          state: takesCard(body.payment) ? 'held' : 'waiting',
          lastError: errorOf(err),
        };
        await putOfflineOrder(kept);
        loop.current.retryAfterMs = retryAfterOf(err);
        const list = await refresh();
        if (!loop.current.running) schedule(list);
        return { queued: true, offlineOrder: kept };
      }
    },
    [refresh, schedule],
  );

  const retryNow = useCallback(
    (clientOrderId?: string) => {
      void (async () => {
        if (clientOrderId) {
          const order = (await listOfflineOrders()).find((o) => o.clientOrderId === clientOrderId);
          if (order?.state === 'refused') await putOfflineOrder({ ...order, state: 'waiting' });
        }
        retrySoon();
      })();
    },
    [retrySoon],
  );

  const discard = useCallback(
    async (clientOrderId: string) => {
      await removeOfflineOrder(clientOrderId);
      await refresh();
    },
    [refresh],
  );

  const settleHeld = useCallback(
    async (clientOrderId: string, choice: 'card' | 'cash'): Promise<OrderView | null> => {
      const order = (await listOfflineOrders()).find((o) => o.clientOrderId === clientOrderId);
      if (!order || order.state !== 'held') return null;
      const body: CreateOrderBody = choice === 'card' ? order.body : { ...order.body, payment: { method: 'cash', tenderedCents: order.totalCents ?? 0 } };
      try {
        const { order: taken } = await fns.current.resend(body);
        await removeOfflineOrder(clientOrderId);
        return taken;
      } catch (err) {
        // cash was taken: it may go on its own now; a card stays held for the cashier
        const state = choice === 'cash' && isUnreachable(err) ? 'waiting' : 'held';
        await putOfflineOrder({ ...order, body: state === 'waiting' ? body : order.body, state, attempts: order.attempts + 1, lastError: errorOf(err) });
        if (state === 'waiting') {
          loop.current.retryAfterMs = retryAfterOf(err);
          schedule(await refresh());
        }
        return null;
      } finally {
        await refresh();
      }
    },
    [refresh, schedule],
  );

  return { orders, resending, sendOrQueue, retryNow, discard, settleHeld };
}
