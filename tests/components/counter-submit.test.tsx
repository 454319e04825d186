// The Counter's submit, rendered in jsdom against a real Jugline server on a migrated demo
// database: the browser's fetch and WebSocket are pointed at that server with the cashier's
// session, so what the form sends is what the server stores. Three lattes are one line with a
// quantity and three drinks on the bar; a refused send keeps the order and its id, and the retry
// stores it once.
import 'fake-indexeddb/auto'; // the browser's storage for offline orders
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createMemoryRouter, RouterProvider } from 'react-router';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import WebSocket from 'ws';
import { counterRoute } from '@/routes/counter';
import { httpApi } from '@/lib/api';
import { menuQuery } from '@/queries/menu';
import { barBoardQuery } from '@/queries/board';
import { sessionQuery } from '@/queries/session';
import { startTestServer, type TestServer } from '../support/test-server';

let server: TestServer;
let cookie: string;
const realFetch = globalThis.fetch;
/** Set by a test to make the next POST /api/orders fail as a dropped connection would. */
let dropNextOrder = false;

beforeAll(async () => {
  server = await startTestServer();
  cookie = await server.cookieFor('cashier');
  vi.stubGlobal('fetch', (input: string, init: RequestInit = {}) => {
    if (dropNextOrder && input === '/api/orders' && init.method === 'POST') {
      dropNextOrder = false;
      return Promise.reject(new TypeError('Failed to fetch'));
    }
    return realFetch(`${server.url}${input}`, { ...init, headers: { ...(init.headers as Record<string, string>), cookie } });
  });
  vi.stubGlobal(
    'WebSocket',
    class extends WebSocket {
      constructor(url: string) {
        super(url.replace(/^ws:\/\/[^/]+/, server.url.replace(/^http/, 'ws')), { headers: { cookie } });
      }
    },
  );
}, 30_000);
afterAll(async () => {
  vi.unstubAllGlobals();
  await server?.close();
});

async function openCounter() {
  const queryClient = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  await Promise.all([
    queryClient.ensureQueryData(menuQuery(httpApi)),
    queryClient.ensureQueryData(barBoardQuery(httpApi)),
    queryClient.ensureQueryData(sessionQuery(httpApi)),
  ]);
  const { Component } = counterRoute({ api: httpApi, queryClient } as never);
  const router = createMemoryRouter([{ path: '/counter', Component }], { initialEntries: ['/counter'] });
  render(
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  await screen.findByRole('heading', { name: 'Counter' });
}

/** The menu tile, not the order line of the same name. */
const tile = (name: string) => within(screen.getByRole('tabpanel')).getByRole('button', { name: new RegExp(`^${name}`) });
const storedOrders = (name: string) => server.db('orders').where({ customer_name: name });

describe('the Counter sends what the cashier built', () => {
  it('three long blacks: one line of quantity 3, one order stored with three drinks for the bar', { timeout: 20_000 }, async () => {
    const user = userEvent.setup();
    await openCounter();
    for (let i = 0; i < 3; i++) {
      await user.click(tile('Long black'));
      await user.click(await screen.findByRole('button', { name: /Add to order/ }));
    }
    expect(screen.getAllByTestId('order-line')).toHaveLength(1);
    expect(screen.getByTestId('order-line')).toHaveTextContent('3 × Long black');
    await user.type(screen.getByLabelText('Name for the cup'), 'Quill Tester');
    await user.click(screen.getByRole('button', { name: /^Send/ }));
    await screen.findByText(/^Sent/);

    const [order] = await storedOrders('Quill Tester');
    expect(order).toBeDefined();
    // one cup each for the Bar
    expect(await server.db('order_items').where({ order_id: order.id })).toHaveLength(3);
    // the form is empty again for the next customer
    expect(screen.queryAllByTestId('order-line')).toHaveLength(0);
  });

  it('a send whose connection drops is kept, and goes once', { timeout: 30_000 }, async () => {
    const user = userEvent.setup();
    await openCounter();
    await user.click(tile('Long black'));
    await user.click(await screen.findByRole('button', { name: /Add to order/ }));
    await user.type(screen.getByLabelText('Name for the cup'), 'Dropped Once');
    dropNextOrder = true;
    await user.click(screen.getByRole('button', { name: /^Send/ }));
    // cash that can't reach the server waits in the browser and is sent again by itself
    await waitFor(async () => expect(await storedOrders('Dropped Once')).toHaveLength(1), { timeout: 15_000 });
    expect(await storedOrders('Dropped Once')).toHaveLength(1);
  });
});
