// Small helpers shared by the API tests. No state lives here: every test file starts its own
// server and passes it in.
import { randomUUID } from 'node:crypto';
import { SESSION_COOKIE } from '@server/auth/session';
import type { TestServer } from '../support/test-server';

export type Agent = Awaited<ReturnType<TestServer['signIn']>>;

export interface LineInput {
  menuItemId: number;
  sizeId?: number;
  milkId?: number;
  shots?: number;
  extraIds?: number[];
  note?: string;
}

/** A well-formed order body; the client never sends a price. */
export function orderBody(customerName: string, items: LineInput[], tenderedCents = 100_00) {
  return {
    clientOrderId: randomUUID(),
    customerName,
    items,
    payment: { method: 'cash' as const, tenderedCents },
  };
}

/** A bean lot as the owner enters it (POST /api/beans/lots). */
export const lotBody = (over: Record<string, unknown> = {}) => ({
  name: 'Test Espresso Lot',
  roaster: 'Invented Roasting',
  origin: 'Somewhere; cherry',
  roastDate: '2026-02-20',
  receivedDate: '2026-02-23',
  receivedG: 2000,
  hopper: 'espresso',
  restDays: 5,
  bestUntilDays: 30,
  ...over,
});

/** Row counts of the tables an order or a bar command writes to. */
export async function writeCounts(server: TestServer) {
  const count = async (table: string) => Number((await server.db(table).count({ n: '*' }).first())?.n);
  return {
    orders: await count('orders'),
    order_items: await count('order_items'),
    events: await count('events'),
  };
}

/** The session id inside an express-session cookie value ("s:<sid>.<signature>", URL-encoded). */
export function sidOf(setCookie: string): string {
  const value = decodeURIComponent(setCookie.split(';')[0].split('=').slice(1).join('='));
  const match = /^s:([^.]+)\./.exec(value);
  if (!match) throw new Error(`not a signed session cookie: ${setCookie}`);
  return match[1];
}

/** The Set-Cookie headers of a response, always as an array. */
export const setCookies = (res: { headers: Record<string, unknown> }): string[] =>
  ([] as string[]).concat((res.headers['set-cookie'] as string[] | string | undefined) ?? []);

/** The session cookie's Set-Cookie line (a sign-in also sets the known-terminal cookie). */
export const sessionCookieOf = (res: { headers: Record<string, unknown> }): string => {
  const cookie = setCookies(res).find((c) => c.startsWith(`${SESSION_COOKIE}=`));
  if (!cookie) throw new Error('no session cookie was set');
  return cookie;
};
