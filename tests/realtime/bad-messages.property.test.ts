// Bad messages on the live socket: arbitrary text, JSON and bytes get a validation error (or are
// ignored) and the socket stays usable; an over-size message closes only that socket (1009); a
// flood is rate limited (one `rate_limited` error, then 1008) while a screen pinging every few
// seconds never is. The server runs on a manual clock, so the token bucket refills only when the
// test moves time: no sleeps, no timed assertions.
import fc from 'fast-check';
import WebSocket from 'ws';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { clientMessage } from '@/domain/schemas';
import type { ServerMessage } from '@/domain/types';
import { RATE_BURST, RATE_PER_SECOND } from '@server/realtime/socket-server';
import { manualClock, startTestServer, type TestServer } from '../support/test-server';
import { closeAllSockets, connect, type LiveClient } from './ws-client';

/** ws maxPayload in server/realtime/socket-server.ts */
const MAX_MESSAGE_BYTES = 4096;

let server: TestServer;
let cookie: string;
const time = manualClock();

beforeAll(async () => {
  server = await startTestServer({ clock: time.clock });
  cookie = await server.cookieFor('barista');
});
afterEach(() => closeAllSockets());
afterAll(() => server.close());

async function open(): Promise<LiveClient> {
  const client = await connect(server.url, cookie);
  await client.next((m) => m.type === 'hello', 'hello');
  return client;
}

/** Resolves with the close code once the server closes the socket. */
function closed(client: LiveClient): Promise<number> {
  if (client.socket.readyState === WebSocket.CLOSED) return Promise.reject(new Error('already closed'));
  return new Promise((resolve) => client.socket.once('close', (code) => resolve(code)));
}

/** Sends a ping and returns every message that arrived before its pong (the socket answers in order). */
async function pingAndCollect(client: LiveClient): Promise<ServerMessage[]> {
  const from = client.messages.length;
  client.send({ type: 'ping' });
  await client.next((m) => m.type === 'pong', 'pong');
  const at = client.messages.findIndex((m, i) => i >= from && m.type === 'pong');
  return client.messages.slice(from, at);
}

const isValidMessage = (text: string) => {
  try {
    return clientMessage.safeParse(JSON.parse(text)).success;
  } catch {
    return false;
  }
};

type Frame = { text: string; binary?: undefined } | { text?: undefined; binary: Buffer };

/** Text and binary frames, all under the size limit, none a message the server accepts. */
const badFrame: fc.Arbitrary<Frame> = fc
  .oneof(
    fc.string({ unit: 'binary', maxLength: 800 }).map((s): Frame => ({ text: s })),
    fc.jsonValue({ stringUnit: 'binary', maxDepth: 4 }).map((v): Frame => ({ text: JSON.stringify(v) })),
    fc
      .record(
        {
          type: fc.oneof(fc.constantFrom('ping', 'resume', 'PING', 'event', '', 'hello'), fc.jsonValue()),
          since: fc.oneof(fc.jsonValue(), fc.constantFrom(-1, 1.5, '3', null, Infinity)),
        },
        { requiredKeys: [] },
      )
      .map((v): Frame => ({ text: JSON.stringify(v) })),
    fc.uint8Array({ maxLength: 1_000 }).map((bytes): Frame => ({ binary: Buffer.from(bytes) })),
  )
  .filter((f) => (f.binary ? f.binary.length : Buffer.byteLength(f.text)) <= MAX_MESSAGE_BYTES)
  .filter((f) => !isValidMessage(f.binary ? f.binary.toString() : f.text));

describe('arbitrary messages', () => {
  it('get validation_failed (or nothing) and the socket keeps answering pings', async () => {
    const client = await open();
    await fc.assert(
      fc.asyncProperty(badFrame, async (frame) => {
        time.advance(1_000); // a second between frames: well inside the rate limit
        if (frame.binary) client.socket.send(frame.binary);
        else client.sendRaw(frame.text);
        const before = await pingAndCollect(client);
        expect(before.length, JSON.stringify(before)).toBeLessThanOrEqual(1);
        for (const m of before) expect(m).toMatchObject({ type: 'error', code: 'validation_failed', message: expect.any(String) });
      }),
      { numRuns: 100 },
    );
    expect(client.socket.readyState).toBe(WebSocket.OPEN);
  });
});

describe('a message over the size limit', () => {
  it('closes that socket with 1009; another socket and new connections carry on', async () => {
    const bystander = await open();
    const big = await open();
    const code = closed(big);
    big.sendRaw(JSON.stringify({ type: 'ping', pad: 'x'.repeat(MAX_MESSAGE_BYTES) }));
    expect(await code).toBe(1009);

    time.advance(1_000);
    expect(await pingAndCollect(bystander)).toEqual([]);
    const fresh = await open();
    expect(await pingAndCollect(fresh)).toEqual([]);
  });
});

describe('the rate limit', () => {
  it('a flood of 500 messages gets one rate_limited error, then a 1008 close; other screens carry on', async () => {
    const bystander = await open();
    const flooder = await open();
    const code = closed(flooder);
    time.advance(60_000); // a full bucket
    for (let i = 0; i < 500; i++) flooder.send({ type: 'ping' });
    expect(await code).toBe(1008);

    const after = flooder.messages.slice(1); // after hello
    const pongs = after.filter((m) => m.type === 'pong').length;
    const errors = after.filter((m) => m.type === 'error');
    // the clock did not move while flooding: exactly the burst was served
    expect(pongs).toBe(RATE_BURST);
    expect(errors).toEqual([{ type: 'error', code: 'rate_limited', message: expect.any(String) }]);
    expect(after.at(-1)).toEqual(errors[0]);

    expect(await pingAndCollect(bystander)).toEqual([]);
    expect(server.sockets.peers()).toBe(1);
  });

  it('the bucket refills: a burst, a pause, and another burst are all answered', async () => {
    const client = await open();
    time.advance(60_000);
    for (let i = 0; i < RATE_BURST; i++) client.send({ type: 'ping' });
    // the server has read the whole first burst once it has answered it
    for (let i = 0; i < RATE_BURST; i++) await client.next((m) => m.type === 'pong', `pong ${i + 1}`);
    time.advance((RATE_BURST / RATE_PER_SECOND) * 1_000); // long enough to refill the bucket
    for (let i = 0; i < RATE_BURST; i++) client.send({ type: 'ping' });
    for (let i = 0; i < RATE_BURST; i++) await client.next((m) => m.type === 'pong', `pong ${RATE_BURST + i + 1}`);
    expect(client.messages.filter((m) => m.type === 'error')).toEqual([]);
    expect(client.socket.readyState).toBe(WebSocket.OPEN);
  });

  it('a screen pinging every few seconds for an hour is never limited', async () => {
    const screen = await open();
    for (let i = 0; i < 1_200; i++) {
      time.advance(3_000);
      expect(await pingAndCollect(screen)).toEqual([]);
    }
    expect(screen.messages.filter((m) => m.type === 'error')).toEqual([]);
    expect(screen.socket.readyState).toBe(WebSocket.OPEN);
  });
});
