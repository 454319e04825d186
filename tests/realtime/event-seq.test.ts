// The live sequence is per café, gap-free and in commit order, so a screen that resumes from the
// number it has seen never misses an event whose transaction committed later. Commands here hold
// their transactions open and are let go in scrambled order; after each commit a resuming screen
// reads what follows its last number (the replay the socket sends), and a live screen gets every
// event once, in order. On PostgreSQL all the transactions are open at once; SQLite runs one at a
// time, and the same checks hold.
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { dialectOf } from '@server/db/dialect';
import { appendMenuChangedEvent, eventsSince, latestSeq, runCommand } from '@server/events';
import { startTestServer, type TestServer } from '../support/test-server';
import { groupOfItsOwn } from '../support/cafe-groups';
import { demoLocationId } from './bar-actions';
import { closeAllSockets, connectAndResume } from './ws-client';

let server: TestServer;
let locationId: number;
beforeAll(async () => {
  server = await startTestServer();
  locationId = await demoLocationId(server);
});
afterEach(() => closeAllSockets());
afterAll(() => server.close());

/** A promise and the function that settles it. */
function latch() {
  let open!: () => void;
  const opened = new Promise<void>((resolve) => (open = resolve));
  return { open, opened };
}

describe('the event sequence under concurrent commands', () => {
  it('commits from transactions let go in scrambled order reach every screen, none missed', async () => {
    const order = [3, 0, 5, 1, 4, 2]; // the order the transactions are let go in
    const n = order.length;
    const start = await latestSeq(server.db, locationId);
    const { client: live } = await connectAndResume(server.url, await server.cookieFor('barista'));

    const gates = order.map(() => latch());
    const entered = new Set<number>();
    const allIn = latch();
    // how many transactions the database lets be open at once: each its own connection on
    // PostgreSQL, one after another on SQLite's single connection
    const together = dialectOf(server.db) === 'postgres' ? n : 1;
    const commands = order.map((_, k) =>
      runCommand(server.deps, async (trx) => {
        const event = await appendMenuChangedEvent(trx, locationId, new Date().toISOString(), null);
        entered.add(k);
        if (entered.size === together) allIn.open();
        await gates[k].opened;
        return { result: k, events: [event] };
      }),
    );
    await allIn.opened;

    let seen = start; // the resuming screen's last number
    const resume = async () => {
      const replay = await eventsSince(server.db, locationId, seen, 100);
      // whatever it is sent continues exactly where it was
      expect(replay.map((e) => e.seq)).toEqual(replay.map((_, i) => seen + 1 + i));
      seen += replay.length;
    };
    let resumes = Promise.resolve();
    for (const k of order) {
      gates[k].open();
      if (entered.has(k)) await commands[k]; // on SQLite one not yet begun runs when its turn comes
      // a screen resumes after this commit; on SQLite its read waits its turn behind the queued commands
      const resumed = (resumes = resumes.then(resume));
      if (together > 1) await resumed;
    }
    await Promise.all(commands);
    await resumes;
    await resume();
    expect(seen).toBe(start + n);

    const delivered = [];
    for (let i = 0; i < n; i++) {
      const message = await live.next((m) => m.type === 'event' && m.event.type === 'menu.changed', 'menu.changed');
      delivered.push((message as { event: { seq: number } }).event.seq);
    }
    expect(delivered).toEqual(order.map((_, i) => start + 1 + i));
  });

  it('numbers each café on its own, and a rolled-back command gives its number back', async () => {
    const other = await server
      .db('locations')
      .insert({
        name: 'North Quay',
        group_id: await groupOfItsOwn(server.db, 'North Quay', new Date().toISOString()),
        time_zone: 'America/New_York',
        currency: 'USD',
        locale: 'en-US',
        tax_mode: 'exclusive',
        created_at: new Date().toISOString(),
      })
      .returning('id');
    const otherId = Number((other[0] as { id: number }).id ?? other[0]);
    const before = await latestSeq(server.db, locationId);
    const at = new Date().toISOString();
    await runCommand(server.deps, async (trx) => ({ result: null, events: [await appendMenuChangedEvent(trx, otherId, at, null)] }));
    const refused = runCommand(server.deps, async (trx) => {
      await appendMenuChangedEvent(trx, locationId, at, null);
      throw new Error('refused');
    });
    await expect(refused).rejects.toThrow('refused');
    await runCommand(server.deps, async (trx) => ({ result: null, events: [await appendMenuChangedEvent(trx, locationId, at, null)] }));
    expect(await latestSeq(server.db, otherId)).toBe(1);
    expect((await eventsSince(server.db, locationId, before, 10)).map((e) => e.seq)).toEqual([before + 1]);
  });
});
