// The rush's hottest path, one cash order end to end through HTTP: how many database statements it
// costs (the session, the menu, the quote, the transaction, the answer), and that the answer built
// from the transaction's own rows is the order as it reads back. A count, not a time (speed is the
// bench's): it fails when a change adds a read to the path, and names the statements it saw.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestServer, demoMenu, type TestServer } from '../support/test-server';
import type { AnyLiveEvent } from '@/domain/types';
import { loadTicket } from '@server/tickets/ticket-views';
import { demoCafeId } from '@seeds/demo-cafe';
import { orderBody, type Agent } from './helpers';

let server: TestServer;
let cashier: Agent;
let ids: Awaited<ReturnType<typeof demoMenu>>;
const seen: string[] = [];
const record = (q: { sql: string }) => seen.push(q.sql);

beforeAll(async () => {
  server = await startTestServer();
  cashier = await server.signIn('cashier');
  ids = await demoMenu(server);
  server.db.on('query', record);
});
afterAll(async () => {
  server.db.off('query', record);
  await server.close();
});

const latteAndCroissant = (name: string) => orderBody(name, [{ menuItemId: ids.item('Latte') }, { menuItemId: ids.item('Butter croissant') }], 20_00);

/** Budget: the session and its person (2), the replay check (1), the menu's version (1), the
 * quote (1: the bar's counts; the drinks for its pace are a second read once the bar has bumped
 * in the last half hour, and no bump has happened here), BEGIN, the shift, the café's lock, the next number, three inserts, the event's
 * ticket (1: its bar drinks; the order is the inserted row, its taker the session's person), the
 * event's number and row (2), COMMIT. */
const STATEMENTS_PER_CASH_ORDER = 16;

describe('one cash order', () => {
  it(`costs at most ${STATEMENTS_PER_CASH_ORDER} statements once warm: the menu is not read again, the order not read back`, async () => {
    for (let i = 0; i < 3; i++) expect((await cashier.post('/api/orders').send(latteAndCroissant(`Warm ${i}`))).status).toBe(201);
    seen.length = 0;
    const res = await cashier.post('/api/orders').send(latteAndCroissant('Odile Marsh'));
    expect(res.status).toBe(201);
    const statements = [...seen];
    expect(
      statements.filter((s) => /from [`"]menu_items[`"]/.test(s)),
      'the menu read again',
    ).toEqual([]);
    expect(
      statements.filter((s) => /from [`"]orders[`"] where [`"]id[`"]/.test(s)),
      'the order read back for its event',
    ).toEqual([]);
    expect(
      statements.filter((s) => /from [`"]users[`"]/.test(s)),
      "people read beyond the session's",
    ).toHaveLength(1);

    expect(statements.length, statements.join('\n')).toBeLessThanOrEqual(STATEMENTS_PER_CASH_ORDER);
  });

  it('answers the order exactly as GET /api/orders/:id reads it back: lines, extras, allergens, tip, change, payment', async () => {
    const body = {
      ...orderBody(
        'Bastien Rook',
        [
          {
            menuItemId: ids.item('Latte'),
            sizeId: ids.size('Latte', 'Large'),
            milkId: ids.milk('Oat'),
            extraIds: [ids.extra('Vanilla syrup')],
            note: 'half sweet',
          },
          { menuItemId: ids.item('Espresso'), shots: 3 },
          { menuItemId: ids.item('Almond croissant') },
        ],
        50_00,
      ),
      allergens: ['tree nuts'],
      allergyNote: 'Keep the almond croissant apart',
      service: 'dine_in' as const,
    };
    const events: AnyLiveEvent[] = [];
    const unsubscribe = server.deps.hub.subscribe(await demoCafeId(server.db), (e) => events.push(e));
    const res = await cashier.post('/api/orders').send(body);
    unsubscribe();
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const read = await cashier.get(`/api/orders/${res.body.order.id}`);
    expect(read.status).toBe(200);
    expect(res.body.order).toEqual(read.body.order);
    // the event's ticket, made from the inserted rows, is the ticket as the board reads it back
    const fired = events.find((e) => e.type === 'order.fired');
    expect(fired && 'ticket' in fired ? fired.ticket : null).toEqual(await loadTicket(server.db, res.body.order.id));
    expect(fired && 'ticket' in fired ? fired.ticket.takenBy : null).toBe('Priya Onslow');
    // and it is the order asked for, not two empty answers agreeing
    expect(res.body.order).toMatchObject({ customerName: 'Bastien Rook', allergens: ['tree nuts'], payment: { method: 'cash', tenderedCents: 50_00 } });
    expect(res.body.order.lines.map((l: { itemName: string }) => l.itemName)).toEqual(['Latte', 'Espresso', 'Almond croissant']);
    expect(res.body.order.payment.parts).toHaveLength(1);
  });
});
