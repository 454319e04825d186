// Sign-in throttling that can't be turned against the person whose name is attacked.
// OWASP ASVS 4.0.3 V2.2.1: at most 100 failed attempts an hour on one account, by controls that
// don't lock the owner out. OWASP "Slow Down Online Guessing Attacks with Device Cookies": a
// browser that has signed in as a person before carries a signed cookie and is judged on its own,
// apart from the unknown clients.
// Addresses vary through X-Forwarded-For (the app trusts it from loopback only, server/app.ts);
// they are documentation addresses (RFC 5737) that only ever appear in a header. The pauses run on
// a virtual clock: the injected sleep records each pause and moves the clock by it, so nothing
// here waits in real time and no assertion is about time taken.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '@seeds/demo-cafe';
import {
  ADDRESS_FAILURES_PER_HOUR,
  FAILED_SIGN_INS_PER_HOUR,
  MAX_SIGN_IN_PAUSE_MS,
  PAIR_FAILURES_PER_HOUR,
  WAITING_SIGN_INS_PER_NAME,
} from '@/domain/sign-in-pacing';
import { manualClock, startTestServer, type TestServer } from '../support/test-server';
import { setCookies } from './helpers';

const pacing = manualClock();
/** Every pause the server asked for, in ms. */
const slept: number[] = [];
/** While set, pauses wait here until the test lets them go (to fill a name's waiting line). */
let held: (() => void)[] | null = null;
function sleep(ms: number): Promise<void> {
  slept.push(ms);
  if (held) return new Promise((resolve) => held!.push(resolve));
  pacing.advance(ms);
  return Promise.resolve();
}

let server: TestServer;
beforeAll(async () => {
  server = await startTestServer({ signInPacing: { clock: pacing.clock, sleep } });
});
afterAll(() => server.close());

let nextAddress = 0;
/** A new address each call: 192.0.2.x, 198.51.100.x, 203.0.113.x (RFC 5737). */
function freshAddress(): string {
  const n = nextAddress++;
  const nets = ['192.0.2', '198.51.100', '203.0.113'];
  if (n >= 3 * 250) throw new Error('out of test addresses');
  return `${nets[Math.floor(n / 250)]}.${(n % 250) + 1}`;
}
const signInFrom = (address: string, username: string, password: string, agent = request(server.url)) =>
  agent.post('/api/session').set('X-Forwarded-For', address).send({ username, password });

describe('a flood of wrong passwords for one name from many addresses', () => {
  it('slows the name down instead of locking it: the owner signs in from a known terminal at once, and from a new address after one capped pause', async () => {
    expect(FAILED_SIGN_INS_PER_HOUR).toBeLessThanOrEqual(100); // ASVS V2.2.1
    const terminal = request.agent(server.url);
    const terminalAddress = freshAddress();
    expect((await signInFrom(terminalAddress, 'owner', DEMO_PASSWORD, terminal)).status).toBe(200);

    for (let i = 0; i < 120; i++) {
      const res = await signInFrom(freshAddress(), 'owner', `wrong-${i}`);
      expect(res.status, `attempt ${i}`).toBe(401);
    }
    // the attempts were spaced out, with pauses that grew up to the cap
    expect(slept.length).toBeGreaterThan(100);
    expect(Math.max(...slept)).toBe(MAX_SIGN_IN_PAUSE_MS);
    expect(slept.slice(0, 5)).toEqual([...slept.slice(0, 5)].sort((a, b) => a - b));

    // the known terminal: no pause, from its own address or another one
    const pausesBefore = slept.length;
    expect((await signInFrom(terminalAddress, 'owner', DEMO_PASSWORD, terminal)).status).toBe(200);
    expect((await signInFrom(freshAddress(), 'owner', DEMO_PASSWORD, terminal)).status).toBe(200);
    expect(slept.length).toBe(pausesBefore);

    // a browser never used before: the right password still works, after at most the capped pause
    const res = await signInFrom(freshAddress(), 'owner', DEMO_PASSWORD);
    expect(res.status).toBe(200);
    expect(slept.length).toBeLessThanOrEqual(pausesBefore + 1);
    expect(Math.max(0, ...slept.slice(pausesBefore))).toBeLessThanOrEqual(MAX_SIGN_IN_PAUSE_MS);
  }, 60_000);

  it('the known-terminal cookie is HttpOnly, SameSite=Lax, sent to the sign-in path only, and counts only for the names signed in with it', async () => {
    const lead = request.agent(server.url);
    const res = await signInFrom(freshAddress(), 'lead', DEMO_PASSWORD, lead);
    const known = setCookies(res).find((c) => c.startsWith('jugline.known='));
    expect(known).toBeDefined();
    const attributes = known!.split(';').map((a) => a.trim().toLowerCase());
    expect(attributes).toEqual(expect.arrayContaining(['httponly', 'samesite=lax', 'path=/api/session']));

    // the lead's terminal is an unknown one for the (still slowed) owner: paused like any other
    let pausesBefore = slept.length;
    expect((await signInFrom(freshAddress(), 'owner', DEMO_PASSWORD, lead)).status).toBe(200);
    expect(slept.length).toBe(pausesBefore + 1);

    // the owner's cookie with one character changed is no cookie at all
    const owner = await signInFrom(freshAddress(), 'owner', DEMO_PASSWORD);
    const pair = setCookies(owner)
      .find((c) => c.startsWith('jugline.known='))!
      .split(';')[0];
    const [name, value] = [pair.slice(0, pair.indexOf('=') + 1), pair.slice(pair.indexOf('=') + 1)];
    const forged = name + (value[0] === 'x' ? 'y' : 'x') + value.slice(1);
    pausesBefore = slept.length;
    const forgedTry = await request(server.url)
      .post('/api/session')
      .set('Cookie', forged)
      .set('X-Forwarded-For', freshAddress())
      .send({ username: 'owner', password: DEMO_PASSWORD });
    expect(forgedTry.status).toBe(200);
    expect(slept.length).toBe(pausesBefore + 1);
  });
});

describe('one address', () => {
  it(`spraying names gets 429 after ${ADDRESS_FAILURES_PER_HOUR} failures, even with a right password; other addresses are not affected`, async () => {
    const sprayer = freshAddress();
    for (let i = 0; i < ADDRESS_FAILURES_PER_HOUR; i++) {
      const res = await signInFrom(sprayer, `guess-${i}`, 'hunter22');
      expect(res.status, `name ${i}`).toBe(401);
    }
    const blocked = await signInFrom(sprayer, 'guess-next', 'hunter22');
    expect(blocked.status).toBe(429);
    expect(blocked.body.error).toMatchObject({ code: 'rate_limited', message: expect.stringMatching(/from this address/) });
    expect(Number(blocked.headers['retry-after'])).toBeGreaterThan(0);
    expect((await signInFrom(sprayer, 'lead', DEMO_PASSWORD)).status).toBe(429);
    expect((await signInFrom(freshAddress(), 'lead', DEMO_PASSWORD)).status).toBe(200);
  }, 60_000);

  it(`trying one name gets 429 after ${PAIR_FAILURES_PER_HOUR} failures; that name signs in elsewhere and that address signs in other names`, async () => {
    const guesser = freshAddress();
    for (let i = 0; i < PAIR_FAILURES_PER_HOUR; i++) {
      expect((await signInFrom(guesser, 'cashier', `nope-${i}`)).status, `attempt ${i}`).toBe(401);
    }
    const blocked = await signInFrom(guesser, 'cashier', DEMO_PASSWORD);
    expect(blocked.status).toBe(429);
    expect(blocked.body.error.message).toMatch(/for this name from this address/);
    expect(Number(blocked.headers['retry-after'])).toBeGreaterThan(0);
    expect((await signInFrom(freshAddress(), 'cashier', DEMO_PASSWORD)).status).toBe(200);
    expect((await signInFrom(guesser, 'barista', DEMO_PASSWORD)).status).toBe(200);
  }, 60_000);
});

describe('the waiting line of a name', () => {
  it(`holds at most ${WAITING_SIGN_INS_PER_NAME} sign-ins at a time for a name; past that 429 with Retry-After, while its known terminal goes straight through`, async () => {
    const terminal = request.agent(server.url);
    expect((await signInFrom(freshAddress(), 'barista2', DEMO_PASSWORD, terminal)).status).toBe(200);
    // enough failures that the next attempt must wait its turn
    for (let i = 0; i < 8; i++) expect((await signInFrom(freshAddress(), 'barista2', `no-${i}`)).status).toBe(401);

    held = [];
    const waiting = Array.from({ length: WAITING_SIGN_INS_PER_NAME }, (_, i) => signInFrom(freshAddress(), 'barista2', `queued-${i}`).then((r) => r));
    // let the held requests reach the server (a bounded number of turns, not a timed wait)
    for (let i = 0; i < 200 && held.length < WAITING_SIGN_INS_PER_NAME; i++) await new Promise((r) => setTimeout(r, 10));
    expect(held).toHaveLength(WAITING_SIGN_INS_PER_NAME);

    const refused = await signInFrom(freshAddress(), 'barista2', DEMO_PASSWORD);
    expect(refused.status).toBe(429);
    expect(refused.body.error.code).toBe('rate_limited');
    expect(Number(refused.headers['retry-after'])).toBeGreaterThan(0);
    expect((await signInFrom(freshAddress(), 'barista2', DEMO_PASSWORD, terminal)).status).toBe(200);

    const release = held;
    held = null;
    release.forEach((go) => go());
    expect((await Promise.all(waiting)).map((r) => r.status)).toEqual(Array(WAITING_SIGN_INS_PER_NAME).fill(401));
  }, 60_000);
});
