// The Counter's offline orders: orders the server couldn't be reached for are kept in IndexedDB and
// resent with the same clientOrderId; orders the server refuses are not kept.
import 'fake-indexeddb/auto';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { act, render, renderHook, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createStore, values } from 'idb-keyval';
import type { ReactNode } from 'react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { createOrderBody, type CreateOrderBody } from '@/domain/schemas';
import type { OrderView } from '@/domain/types';
import { OfflineOrdersBanner } from '@/features/counter/offline-orders-banner';
import { listOfflineOrders, putOfflineOrder, removeOfflineOrder, type OfflineOrder } from '@/features/counter/offline-orders';
import { useOfflineOrders, type SendOrderFn } from '@/features/counter/use-offline-orders';
import { ApiError, http } from '@/lib/http';
import { uuid } from '@/lib/uuid';

// Read IndexedDB itself, not through the module, to be sure the order is really stored there
// (the store keeps its first name, pending-orders, for orders a browser already holds).
const inIndexedDb = () => values<OfflineOrder>(createStore('jugline', 'pending-orders'));

const body = (customerName: string): CreateOrderBody =>
  createOrderBody.parse({
    clientOrderId: uuid(),
    customerName,
    items: [{ menuItemId: 1 }],
    payment: { method: 'cash', tenderedCents: 500 },
  });

const offlineOrderOf = (b: CreateOrderBody, queuedAt: string): OfflineOrder => ({
  clientOrderId: b.clientOrderId,
  body: b,
  totalCents: 379,
  queuedAt,
  attempts: 0,
  state: 'waiting',
  lastError: null,
});

/** A stand-in for the server's POST /orders: answers from a script, and records every body. */
function scriptedServer(...answers: ('ok' | ApiError)[]) {
  const bodies: CreateOrderBody[] = [];
  const send: SendOrderFn = async (b) => {
    bodies.push(b);
    const answer = answers.shift() ?? 'ok';
    if (answer !== 'ok') throw answer;
    return { order: { clientOrderId: b.clientOrderId, customerName: b.customerName, number: bodies.length } as OrderView };
  };
  return { send, bodies };
}

const offline = () => new ApiError(0, 'offline', 'No connection to the Jugline server');
const never = () => 3_600_000; // no automatic round during a test: each resend here is asked for

function wrapper({ children }: { children: ReactNode }) {
  return <QueryClientProvider client={new QueryClient()}>{children}</QueryClientProvider>;
}

afterEach(async () => {
  vi.useRealTimers();
  vi.unstubAllGlobals();
  for (const o of await listOfflineOrders()) await removeOfflineOrder(o.clientOrderId);
});

describe('offline orders store', () => {
  it('puts, lists the oldest first, and removes, in IndexedDB', async () => {
    const a = body('Ada');
    const b = body('Bo');
    await putOfflineOrder(offlineOrderOf(b, '2026-12-01T09:00:02.000Z'));
    await putOfflineOrder(offlineOrderOf(a, '2026-12-01T09:00:01.000Z'));
    expect((await listOfflineOrders()).map((o) => o.body.customerName)).toEqual(['Ada', 'Bo']);
    expect((await inIndexedDb()).map((o) => o.clientOrderId).sort()).toEqual([a.clientOrderId, b.clientOrderId].sort());

    await putOfflineOrder({ ...offlineOrderOf(a, '2026-12-01T09:00:01.000Z'), attempts: 3 }); // same id: replaced
    expect(await listOfflineOrders()).toHaveLength(2);
    expect((await listOfflineOrders())[0].attempts).toBe(3);

    await removeOfflineOrder(a.clientOrderId);
    expect((await listOfflineOrders()).map((o) => o.body.customerName)).toEqual(['Bo']);
    expect(await inIndexedDb()).toHaveLength(1);
  });
});

describe('useOfflineOrders', () => {
  it('queues an order it cannot send and resends it with the same clientOrderId until it lands', async () => {
    const first = scriptedServer(offline());
    const later = scriptedServer(new ApiError(503, 'internal', 'Service unavailable'), 'ok');
    const { result } = renderHook(() => useOfflineOrders(first.send, { resend: later.send, retryDelayMs: never }), { wrapper });
    const order = body('Wren Ashby');

    let outcome: Awaited<ReturnType<typeof result.current.sendOrQueue>> | undefined;
    await act(async () => {
      outcome = await result.current.sendOrQueue(order, { totalCents: 379 });
    });
    expect(outcome?.queued).toBe(true);
    expect(result.current.orders.map((o) => o.clientOrderId)).toEqual([order.clientOrderId]);
    expect(result.current.orders[0].totalCents).toBe(379);
    expect((await inIndexedDb()).map((o) => o.clientOrderId)).toEqual([order.clientOrderId]);

    // first resend: the server is still away, so the order stays
    act(() => result.current.retryNow());
    await waitFor(() => expect(result.current.orders[0]?.attempts).toBe(1));
    expect(result.current.orders[0].state).toBe('waiting');
    expect(later.bodies).toHaveLength(1);

    // second resend: it lands, and leaves the store
    act(() => result.current.retryNow());
    await waitFor(() => expect(result.current.orders).toEqual([]));
    expect(await inIndexedDb()).toEqual([]);

    const ids = [...first.bodies, ...later.bodies].map((b) => b.clientOrderId);
    expect(ids).toEqual([order.clientOrderId, order.clientOrderId, order.clientOrderId]);
    expect(later.bodies.every((b) => JSON.stringify(b) === JSON.stringify(order))).toBe(true);
  });

  // 401: the session timed out while the order was on its way; it goes once someone signs in again
  it('queues on a gateway answer (502/503/504) and on a signed-out answer (401) too', async () => {
    for (const status of [401, 502, 503, 504]) {
      const server = scriptedServer(new ApiError(status, 'internal', 'gateway'));
      const { result, unmount } = renderHook(() => useOfflineOrders(server.send, { resend: server.send, retryDelayMs: never }), { wrapper });
      const order = body(`Gate ${status}`);
      await act(async () => {
        expect((await result.current.sendOrQueue(order)).queued).toBe(true);
      });
      expect((await listOfflineOrders()).map((o) => o.clientOrderId)).toContain(order.clientOrderId);
      unmount();
    }
  });

  it('does not queue an order the server refuses: the error goes to the cashier', async () => {
    const refusal = new ApiError(409, 'unavailable', 'Oat milk is 86’d');
    const server = scriptedServer(refusal);
    const { result } = renderHook(() => useOfflineOrders(server.send, { resend: server.send, retryDelayMs: never }), { wrapper });
    await act(async () => {
      await expect(result.current.sendOrQueue(body('Kit'))).rejects.toBe(refusal);
    });
    expect(result.current.orders).toEqual([]);
    expect(await inIndexedDb()).toEqual([]);
  });

  it('resends what an earlier page left behind as soon as it mounts, and on the online event', async () => {
    const left = body('From before the reload');
    await putOfflineOrder(offlineOrderOf(left, '2026-12-01T09:00:00.000Z'));
    const server = scriptedServer(offline(), 'ok');
    const { result } = renderHook(() => useOfflineOrders(server.send, { resend: server.send, retryDelayMs: never }), { wrapper });
    await waitFor(() => expect(result.current.orders[0]?.attempts).toBe(1)); // tried on mount, still away
    expect(server.bodies.map((b) => b.clientOrderId)).toEqual([left.clientOrderId]);

    act(() => void window.dispatchEvent(new Event('online')));
    await waitFor(() => expect(result.current.orders).toEqual([]));
    expect(server.bodies.map((b) => b.clientOrderId)).toEqual([left.clientOrderId, left.clientOrderId]);
  });
});

// An overloaded server answers 503 with Retry-After (RFC 9110 §10.2.3); the queue waits at least that
// long before its next resend, whatever its own backoff says.
describe('useOfflineOrders and Retry-After', () => {
  const busy = (retryAfterMs: number) => new ApiError(503, 'unavailable', 'The database is busy; try again in a moment', undefined, retryAfterMs);
  // The fake clock moves setTimeout and Date only: fake-indexeddb works on setImmediate, left real.
  const fakeClock = () => vi.useFakeTimers({ toFake: ['setTimeout', 'clearTimeout', 'Date'] });
  const realSetTimeout = globalThis.setTimeout;
  /** Let IndexedDB finish what the last tick started; the fake clock stands still meanwhile. */
  const settle = () => act(() => new Promise<void>((r) => realSetTimeout(r, 20)));
  async function tick(ms: number) {
    await act(() => vi.advanceTimersByTimeAsync(ms));
    await settle();
  }

  /** The resends, each with the fake time it was made at (ms from the start). */
  function timedResends(server: ReturnType<typeof scriptedServer>) {
    const start = Date.now();
    const at: number[] = [];
    const resend: SendOrderFn = (b) => {
      at.push(Date.now() - start);
      return server.send(b);
    };
    return { resend, at };
  }

  it('a first send answered 503 with Retry-After: 3 is resent no sooner than 3 s later, and lands once', async () => {
    fakeClock();
    const first = scriptedServer(busy(3_000));
    const later = scriptedServer('ok');
    const resends = timedResends(later);
    // its own backoff alone would resend after 1 ms
    const { result } = renderHook(() => useOfflineOrders(first.send, { resend: resends.resend, retryDelayMs: () => 1 }), { wrapper });
    const order = body('Wren Ashby');
    await act(async () => {
      expect((await result.current.sendOrQueue(order)).queued).toBe(true);
    });

    await tick(2_999);
    expect(resends.at).toEqual([]);
    expect(result.current.orders.map((o) => o.clientOrderId)).toEqual([order.clientOrderId]);

    for (let i = 0; i < 20 && result.current.orders.length > 0; i++) await tick(250);
    expect(result.current.orders).toEqual([]);
    expect(await inIndexedDb()).toEqual([]);
    expect(resends.at).toHaveLength(1);
    expect(resends.at[0]).toBeGreaterThanOrEqual(3_000);
    expect(later.bodies.map((b) => b.clientOrderId)).toEqual([order.clientOrderId]);
  });

  it('a resend answered 503 with Retry-After: 3 holds the next round at least 3 s, then the order lands once', async () => {
    fakeClock();
    const first = scriptedServer(offline());
    const later = scriptedServer(busy(3_000), 'ok');
    const resends = timedResends(later);
    const { result } = renderHook(() => useOfflineOrders(first.send, { resend: resends.resend, retryDelayMs: () => 1 }), { wrapper });
    const order = body('Robin Vale');
    await act(async () => {
      await result.current.sendOrQueue(order);
    });

    for (let i = 0; i < 40 && result.current.orders.length > 0; i++) await tick(250);
    expect(result.current.orders).toEqual([]);
    expect(resends.at).toHaveLength(2); // the 503, then the one that landed
    expect(resends.at[1] - resends.at[0]).toBeGreaterThanOrEqual(3_000);
    expect(later.bodies.map((b) => b.clientOrderId)).toEqual([order.clientOrderId, order.clientOrderId]);

    await tick(10_000);
    expect(resends.at).toHaveLength(2); // nothing left to send
  });

  it('"Send now" still sends at once inside the Retry-After, and the waiting round does not send it again', async () => {
    fakeClock();
    const first = scriptedServer(busy(3_000));
    const later = scriptedServer('ok');
    const resends = timedResends(later);
    const { result } = renderHook(() => useOfflineOrders(first.send, { resend: resends.resend, retryDelayMs: () => 1 }), { wrapper });
    await act(async () => {
      await result.current.sendOrQueue(body('Kit'));
    });

    act(() => result.current.retryNow());
    await settle();
    expect(result.current.orders).toEqual([]);
    expect(resends.at).toEqual([0]);

    await tick(10_000);
    expect(resends.at).toEqual([0]);
  });

  it('http() puts the Retry-After of a refused request on the ApiError', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(() =>
        Promise.resolve(
          Response.json(
            { error: { code: 'unavailable', message: 'The database is busy; try again in a moment' } },
            { status: 503, headers: { 'Retry-After': '5' } },
          ),
        ),
      ),
    );
    await expect(http('POST', '/orders', body('Ada'))).rejects.toMatchObject({ status: 503, code: 'unavailable', retryAfterMs: 5_000 });

    vi.stubGlobal('fetch', () => Promise.resolve(Response.json({ error: { code: 'internal', message: 'Bad gateway' } }, { status: 502 })));
    const err = await http('POST', '/orders', body('Ada')).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ApiError);
    expect((err as ApiError).retryAfterMs).toBeUndefined();
  });
});

function Counterish({ send, resend }: { send: SendOrderFn; resend: SendOrderFn }) {
  const offlineOrders = useOfflineOrders(send, { resend, retryDelayMs: never });
  return (
    <>
      <button type="button" onClick={() => void offlineOrders.sendOrQueue(body('Wren Ashby'), { totalCents: 379 }).catch(() => {})}>
        Take Wren
      </button>
      <button type="button" onClick={() => void offlineOrders.sendOrQueue(body('Robin Vale'), { totalCents: 1250 }).catch(() => {})}>
        Take Robin
      </button>
      <OfflineOrdersBanner offlineOrders={offlineOrders} currency="USD" />
    </>
  );
}

describe('OfflineOrdersBanner', () => {
  it('says in words how many orders wait, whose and how much, and sends them on "Send now"', async () => {
    const user = userEvent.setup();
    const first = scriptedServer(offline(), offline());
    const later = scriptedServer('ok', 'ok');
    render(<Counterish send={first.send} resend={later.send} />, { wrapper });
    expect(screen.queryByText(/not sent yet/)).toBeNull();

    await user.click(screen.getByRole('button', { name: 'Take Wren' }));
    await screen.findByRole('heading', { name: '1 order not sent yet — will send when the server is back' });
    await user.click(screen.getByRole('button', { name: 'Take Robin' }));
    await screen.findByRole('heading', { name: '2 orders not sent yet — will send when the server is back' });
    const rows = screen.getAllByTestId('offline-order');
    expect(rows.map((r) => r.textContent)).toEqual(['Wren Ashby$3.79Not sent yet', 'Robin Vale$12.50Not sent yet']);

    await user.click(screen.getByRole('button', { name: 'Send now' }));
    await waitFor(() => expect(screen.queryByTestId('offline-orders')).toBeNull());
    expect(later.bodies.map((b) => b.customerName)).toEqual(['Wren Ashby', 'Robin Vale']); // in the order taken
    expect(later.bodies.map((b) => b.clientOrderId)).toEqual(first.bodies.map((b) => b.clientOrderId));
  });

  it('keeps a queued order the server later refuses, with its message, until the cashier discards it', async () => {
    const user = userEvent.setup();
    const first = scriptedServer(offline());
    const later = scriptedServer(new ApiError(409, 'unavailable', 'Espresso is 86’d'));
    render(<Counterish send={first.send} resend={later.send} />, { wrapper });
    await user.click(screen.getByRole('button', { name: 'Take Wren' }));
    await user.click(await screen.findByRole('button', { name: 'Send now' }));

    await screen.findByRole('heading', { name: '1 order refused by the server — check and discard' });
    expect(screen.getByTestId('offline-order')).toHaveTextContent('Refused: Espresso is 86’d');
    expect(screen.queryByRole('button', { name: 'Send now' })).toBeNull(); // not resent by itself
    expect((await inIndexedDb()).map((o) => o.state)).toEqual(['refused']);

    await user.click(screen.getByRole('button', { name: 'Discard Wren Ashby' }));
    await waitFor(() => expect(screen.queryByTestId('offline-orders')).toBeNull());
    expect(await inIndexedDb()).toEqual([]);
    expect(later.bodies).toHaveLength(1);
  });
});

// A card is charged only with the customer there: a card order that can't reach the server is
// held, never resent by itself, and the cashier decides when the Counter is back.
const cardBody = (customerName: string): CreateOrderBody =>
  createOrderBody.parse({
    clientOrderId: uuid(),
    customerName,
    items: [{ menuItemId: 1 }],
    payment: { method: 'card', paymentMethod: 'pm_card_visa' },
  });

function CardCounter({ send, resend }: { send: SendOrderFn; resend: SendOrderFn }) {
  const offlineOrders = useOfflineOrders(send, { resend, retryDelayMs: () => 1 });
  return (
    <>
      <button type="button" onClick={() => void offlineOrders.sendOrQueue(cardBody('Cass Moor'), { totalCents: 460 }).catch(() => {})}>
        Take Cass by card
      </button>
      <OfflineOrdersBanner offlineOrders={offlineOrders} currency="USD" />
    </>
  );
}

describe('a card order while the server is away', () => {
  it('is held, not resent on a timer, on "online" or on "Send now", and is never charged without the cashier', async () => {
    const user = userEvent.setup();
    const first = scriptedServer(offline());
    const later = scriptedServer();
    render(<CardCounter send={first.send} resend={later.send} />, { wrapper });
    await user.click(screen.getByRole('button', { name: 'Take Cass by card' }));
    await screen.findByRole('heading', { name: /1 card order held — not charged/ });
    expect(screen.getByTestId('offline-order')).toHaveTextContent('Cass Moor$4.60Card not charged');
    expect(screen.queryByRole('button', { name: 'Send now' })).toBeNull();
    expect((await inIndexedDb()).map((o) => o.state)).toEqual(['held']);

    act(() => void window.dispatchEvent(new Event('online')));
    await new Promise((r) => setTimeout(r, 50)); // a timer round would have run by now (1 ms)
    expect(later.bodies).toEqual([]);
  });

  it('"They paid cash" sends the same order once as cash for its total, never the card', async () => {
    const user = userEvent.setup();
    const first = scriptedServer(offline());
    const later = scriptedServer('ok');
    render(<CardCounter send={first.send} resend={later.send} />, { wrapper });
    await user.click(screen.getByRole('button', { name: 'Take Cass by card' }));
    await user.click(await screen.findByRole('button', { name: 'Cass Moor paid cash' }));
    await waitFor(() => expect(screen.queryByTestId('offline-orders')).toBeNull());
    expect(later.bodies.map((b) => [b.clientOrderId, b.payment])).toEqual([[first.bodies[0].clientOrderId, { method: 'cash', tenderedCents: 460 }]]);
  });

  it('"Charge card now" runs the card once, with the customer there', async () => {
    const user = userEvent.setup();
    const first = scriptedServer(offline());
    const later = scriptedServer('ok');
    render(<CardCounter send={first.send} resend={later.send} />, { wrapper });
    await user.click(screen.getByRole('button', { name: 'Take Cass by card' }));
    await user.click(await screen.findByRole('button', { name: 'Charge Cass Moor’s card now' }));
    await waitFor(() => expect(screen.queryByTestId('offline-orders')).toBeNull());
    expect(later.bodies).toEqual([first.bodies[0]]);
  });

  it('"Cancel" drops it without sending anything', async () => {
    const user = userEvent.setup();
    const first = scriptedServer(offline());
    const later = scriptedServer();
    render(<CardCounter send={first.send} resend={later.send} />, { wrapper });
    await user.click(screen.getByRole('button', { name: 'Take Cass by card' }));
    await user.click(await screen.findByRole('button', { name: 'Cancel Cass Moor’s order' }));
    await waitFor(() => expect(screen.queryByTestId('offline-orders')).toBeNull());
    expect(later.bodies).toEqual([]);
    expect(await inIndexedDb()).toEqual([]);
  });

  it('a card order an older page stored as waiting is held on mount, not charged', async () => {
    const left = cardBody('From an older page');
    await putOfflineOrder(offlineOrderOf(left, '2026-12-01T09:00:00.000Z'));
    const server = scriptedServer();
    const { result } = renderHook(() => useOfflineOrders(server.send, { resend: server.send, retryDelayMs: () => 1 }), { wrapper });
    await waitFor(() => expect(result.current.orders.map((o) => o.state)).toEqual(['held']));
    await new Promise((r) => setTimeout(r, 50));
    expect(server.bodies).toEqual([]);
  });
});
