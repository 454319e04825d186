// Bad input never breaks the server: for every route in server.routes (generated, so a new route
// is covered as soon as it exists), arbitrary bodies, query strings and :id segments are answered
// with a 4xx in the API's error shape, never a 5xx, and a rejected command changes nothing.
// Signed in as the owner, who may call everything, so 401/403 never count as a rejection.
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { z } from 'zod';
import * as beanSchemas from '@/domain/beans-schemas';
import * as menuAdminSchemas from '@/domain/menu-admin-schemas';
import * as schemas from '@/domain/schemas';
import * as settingsSchemas from '@/domain/settings-schemas';
import * as teamSchemas from '@/domain/team-schemas';
import { idParam } from '@/domain/schemas';
import type { ApiRoute } from '@server/routes';
import { WEBHOOK_PATH } from '@server/orders/routes';
import { startTestServer, type TestServer } from '../support/test-server';
import type { Agent } from './helpers';
import { tableNames } from '@server/db/dialect';

const RUNS = 25;
// Each property walks every route (about 100 of them) with RUNS inputs: minutes, not seconds.
vi.setConfig({ testTimeout: 300_000 });
/** express.json({ limit: '32kb' }) in server/app.ts */
const JSON_LIMIT_BYTES = 32 * 1024;
/** No demo row has an id this large; generated ids at or above it can only be 404s. */
const NO_SUCH_ID = 2_000_000_000;
/** Every table but the session store (a signed-in request may touch its own session row). */
let TABLES: string[] = [];

let server: TestServer;
let owner: Agent;
/** What each GET route answers with no query at all (a route that ignores its query must answer the same). */
const baseline = new Map<ApiRoute, number>();

const label = (r: ApiRoute) => `${r.method.toUpperCase()} /api${r.path}`;
const urlWithId = (r: ApiRoute, segment: string) => `/api${r.path.replace(':id', segment)}`;
const urlOf = (r: ApiRoute) => urlWithId(r, String(NO_SUCH_ID));
const isWebhook = (r: ApiRoute) => r.path === WEBHOOK_PATH;
const takesBody = (r: ApiRoute) => r.method === 'post' || r.method === 'put' || r.method === 'patch';

beforeAll(async () => {
  server = await startTestServer();
  owner = await server.signIn('owner');
  TABLES = (await tableNames(server.db)).filter((t) => t !== 'sessions');
  for (const table of ['orders', 'order_items', 'payments', 'refunds', 'events', 'shifts', 'menu_items']) {
    const max = Number((await server.db(table).max({ m: 'id' }).first())?.m ?? 0);
    if (max >= 1e7) throw new Error(`${table} has ids ≥ 1e7; the :id filter below assumes it does not`);
  }
  for (const r of server.routes.filter((r) => r.method === 'get')) baseline.set(r, (await owner.get(urlOf(r))).status);
});
afterAll(() => server.close());

async function rowCounts() {
  const out: Record<string, number> = {};
  for (const table of TABLES) out[table] = Number((await server.db(table).count({ n: '*' }).first())?.n);
  return out;
}

const errorShape = z.object({ error: z.object({ code: z.string().min(1), message: z.string().min(1), details: z.unknown().optional() }).strict() }).strict();

interface Answer {
  status: number;
  body: unknown;
  headers: Record<string, string>;
}

/** A 4xx other than 401/403, as JSON in the error shape; the message says what came back otherwise. */
function assertRejected(res: Answer, what: string) {
  const summary = `${what} → ${res.status} ${JSON.stringify(res.body).slice(0, 300)}`;
  expect(res.status, summary).toBeGreaterThanOrEqual(400);
  expect(res.status, summary).toBeLessThan(500);
  expect([401, 403], summary).not.toContain(res.status);
  expect(res.headers['content-type'], summary).toMatch(/application\/json/);
  expect(errorShape.safeParse(res.body).success, summary).toBe(true);
}

// ---------------------------------------------------------------- generators

/** Every field name any request schema knows, with the zod schemas that field has anywhere. */
const knownFields = new Map<string, z.ZodType[]>();
for (const value of [schemas, menuAdminSchemas, teamSchemas, settingsSchemas, beanSchemas].flatMap((m) => Object.values(m))) {
  const objects = value instanceof z.ZodObject ? [value] : value instanceof z.ZodDiscriminatedUnion ? value.options : [];
  for (const o of objects) {
    if (!(o instanceof z.ZodObject)) continue;
    for (const [name, field] of Object.entries(o.shape as Record<string, z.ZodType>)) {
      knownFields.set(name, [...(knownFields.get(name) ?? []), field]);
    }
  }
}
const knownNames = [...knownFields.keys()].sort();
const trickyKeys = ['__proto__', 'constructor', 'prototype', 'toString', 'valueOf', 'hasOwnProperty', ''];

const key = fc.oneof(fc.string({ unit: 'binary', maxLength: 20 }), fc.constantFrom(...knownNames), fc.constantFrom(...trickyKeys));
const jsonAny = fc.jsonValue({ stringUnit: 'binary', maxDepth: 4 });
const jsonObjectish = fc.letrec<{ value: unknown }>((tie) => ({
  value: fc.oneof(
    { depthSize: 'small', withCrossShrink: true },
    jsonAny,
    fc.array(tie('value'), { maxLength: 4 }),
    fc.dictionary(key, tie('value'), { maxKeys: 5 }),
  ),
})).value;

/** A value no schema accepts for that field name (wrong type, out of range, too long…). */
const wrongFor = (name: string) => fc.oneof(jsonAny, jsonObjectish).filter((v) => knownFields.get(name)!.every((s) => !s.safeParse(v).success));

const knownFieldsWrong = fc
  .subarray(knownNames, { minLength: 1, maxLength: 6 })
  .chain((names) => fc.tuple(...names.map(wrongFor)).map((values) => Object.fromEntries(names.map((n, i) => [n, values[i]]))));

/** One known field holding a string of 1,000 characters up to about the body limit. */
const hugeString = fc
  .tuple(fc.constantFrom(...knownNames), fc.integer({ min: 1_000, max: JSON_LIMIT_BYTES - 64 }), fc.constantFrom('a', ' ', '7', 'é', '"'))
  .map(([name, n, ch]) => ({ [name]: ch.repeat(n) }));

/** Thousands of levels of [[[…]]] or {"a":{"a":…}}, alone or under a known field, written as text
 * (JSON.stringify itself overflows the stack on values this deep). */
const deeplyNested = fc
  .tuple(fc.integer({ min: 50, max: 10_000 }), fc.boolean(), fc.option(fc.constantFrom(...knownNames), { nil: undefined }))
  .map(([depth, arrays, under]) => {
    const d = arrays ? depth : Math.floor(depth / 2);
    const inner = arrays ? `${'['.repeat(d)}1${']'.repeat(d)}` : `${'{"a":'.repeat(d)}1${'}'.repeat(d)}`;
    return under ? `{${JSON.stringify(under)}:${inner}}` : inner;
  });

/** Request bodies as JSON text. */
const anyBody = fc.oneof(
  jsonAny.map((v) => JSON.stringify(v)),
  jsonObjectish.map((v) => JSON.stringify(v)),
  fc.dictionary(key, jsonObjectish, { minKeys: 1, maxKeys: 8 }).map((v) => JSON.stringify(v)),
  knownFieldsWrong.map((v) => JSON.stringify(v)),
  hugeString.map((v) => JSON.stringify(v)),
  deeplyNested,
);

const percentJunk = fc.constantFrom('%', '%zz', '%2', '%00', '%C0%AF', '%E0%A4%A', '%FF', '%2F', '%2e%2e%2f', '+', '&', '=', '#');
const queryPart = fc.oneof(
  fc.string({ unit: 'grapheme', maxLength: 30 }).map(encodeURIComponent),
  fc.string({ unit: 'binary-ascii', maxLength: 30 }).map(encodeURIComponent),
  fc.array(percentJunk, { minLength: 1, maxLength: 3 }).map((a) => a.join('')),
);
const queryKey = fc.oneof(queryPart, fc.constantFrom(...knownNames, ...trickyKeys, 'a[b]', 'a[]', 'q[0]'));
/** Random keys and values, known keys with random values, and repeated keys. */
const anyQuery = fc
  .tuple(
    fc.array(fc.tuple(queryKey, queryPart), { maxLength: 8 }),
    fc.subarray(knownNames, { maxLength: 4 }), // these are sent twice
    queryPart,
  )
  .map(([pairs, repeated, v]) => [...pairs.map(([k, val]) => `${k}=${val}`), ...repeated.flatMap((k) => [`${k}=${v}`, `${k}=${v}`])].join('&'));

function decoded(segment: string): string | undefined {
  try {
    return decodeURIComponent(segment);
  } catch {
    return undefined;
  }
}
/** Any :id segment except one that could name a real row (a positive integer below 1e7). */
const anyIdSegment = fc
  .oneof(
    fc.string({ unit: 'grapheme', maxLength: 40 }).map(encodeURIComponent),
    fc.string({ unit: 'binary-ascii', maxLength: 40 }).map(encodeURIComponent),
    fc
      .array(fc.oneof(percentJunk, fc.constantFrom('../', '..', '.', 'a', '1', '-1', '0', '1e3', '0x10', ' 5', '1.5', 'Infinity', '9'.repeat(30))), {
        minLength: 1,
        maxLength: 5,
      })
      .map((a) => a.join('')),
  )
  .filter((segment) => {
    // no segment at all is another route (/orders/ is GET /orders); a raw # or ? ends the path
    if (segment === '' || /[#?]/.test(segment)) return false;
    const value = decoded(segment);
    if (value === undefined) return true;
    const id = idParam.safeParse({ id: value });
    return !(id.success && id.data.id < 1e7);
  });

/** Always tried first on every body route: each known field at once as an object that can't be
 * turned into a string ({ toString: 1 } makes String(x) throw), as null, as an empty array. */
const everyField = (value: unknown) => JSON.stringify(Object.fromEntries(knownNames.map((n) => [n, value])));
const bodyExamples: [string][] = [[everyField({ toString: 1, valueOf: 1 })], [everyField(null)], [everyField([])], [everyField({ __proto__: 1 })]];

// ---------------------------------------------------------------- properties

const bodyRoutes = () => server.routes.filter((r) => takesBody(r) && !isWebhook(r));

describe('arbitrary JSON bodies', () => {
  it('covers every route that takes a body', () => {
    expect(bodyRoutes().map(label)).toEqual(expect.arrayContaining(['POST /api/orders', 'POST /api/session', 'POST /api/shifts']));
  });

  it('every body route answers a 4xx in the error shape and stores nothing', async () => {
    for (const route of bodyRoutes()) {
      await fc.assert(
        fc.asyncProperty(anyBody, async (body) => {
          const before = await rowCounts();
          const res = await owner.post(urlOf(route)).set('Content-Type', 'application/json').send(body);
          assertRejected(res, `${label(route)} ${body.slice(0, 200)}`);
          expect(await rowCounts(), label(route)).toEqual(before);
        }),
        { numRuns: RUNS, examples: bodyExamples },
      );
    }
  });

  it('a body over the JSON limit is 413 payload_too_large', async () => {
    const body = JSON.stringify({ reason: 'a'.repeat(JSON_LIMIT_BYTES) });
    for (const route of bodyRoutes()) {
      const before = await rowCounts();
      const res = await owner.post(urlOf(route)).set('Content-Type', 'application/json').send(body);
      assertRejected(res, label(route));
      expect(res.status, label(route)).toBe(413);
      expect((res.body as z.infer<typeof errorShape>).error.code).toBe('payload_too_large');
      expect(await rowCounts()).toEqual(before);
    }
  });

  it('invalid JSON is 400 validation_failed', async () => {
    for (const route of bodyRoutes()) {
      for (const text of ['{', '{"a":}', "{'a':1}", '[1,]', 'undefined', '{"a":1}}', '\u0000']) {
        const res = await owner.post(urlOf(route)).set('Content-Type', 'application/json').send(text);
        assertRejected(res, `${label(route)} ${JSON.stringify(text)}`);
        expect(res.status).toBe(400);
        expect((res.body as z.infer<typeof errorShape>).error.code).toBe('validation_failed');
      }
    }
  });

  it('a body that is not JSON (other content types, charsets, encodings) is a 4xx, not a 500', async () => {
    const variants: { headers: Record<string, string>; body: string | Buffer }[] = [
      { headers: { 'Content-Type': 'text/plain' }, body: 'hello' },
      { headers: { 'Content-Type': 'application/x-www-form-urlencoded' }, body: 'available=true&reason=because' },
      { headers: { 'Content-Type': 'multipart/form-data; boundary=x' }, body: '--x\r\nContent-Disposition: form-data; name="a"\r\n\r\n1\r\n--x--\r\n' },
      { headers: { 'Content-Type': 'application/xml' }, body: '<order/>' },
      { headers: { 'Content-Type': 'application/octet-stream' }, body: Buffer.from([0, 1, 2, 255]) },
      { headers: { 'Content-Type': 'application/json; charset=latin1' }, body: '{"reason":"because"}' },
      { headers: { 'Content-Type': 'application/json; charset=nope' }, body: '{}' },
      { headers: { 'Content-Type': 'application/json', 'Content-Encoding': 'gzip' }, body: 'not gzip at all' },
      { headers: { 'Content-Type': 'application/json', 'Content-Encoding': 'snappy' }, body: '{}' },
      { headers: { 'Content-Type': 'application/json', 'Content-Encoding': 'deflate' }, body: Buffer.from([1, 2, 3]) },
      { headers: { 'Content-Type': 'not a media type' }, body: '{}' },
    ];
    for (const route of bodyRoutes()) {
      for (const v of variants) {
        const before = await rowCounts();
        const res = await owner.post(urlOf(route)).set(v.headers).send(v.body);
        assertRejected(res, `${label(route)} ${JSON.stringify(v.headers)}`);
        expect(await rowCounts()).toEqual(before);
      }
    }
  });
});

describe('the payment webhook', () => {
  it('answers 400 to random bodies, with or without a made-up signature, and stores nothing', async () => {
    const webhook = server.routes.find(isWebhook)!;
    expect(webhook).toBeDefined();
    await fc.assert(
      fc.asyncProperty(
        fc.oneof(
          anyBody,
          fc.uint8Array({ maxLength: 2_000 }).map((a) => Buffer.from(a)),
        ),
        fc.option(
          fc.oneof(
            fc.string({ unit: 'binary-ascii', maxLength: 80 }),
            fc.string({ maxLength: 40 }).map((s) => `t=1,v1=${s}`),
          ),
          {
            nil: undefined,
          },
        ),
        async (body, signature) => {
          const before = await rowCounts();
          let req = owner.post(`/api${WEBHOOK_PATH}`).set('Content-Type', 'application/json');
          if (signature !== undefined) req = req.set('Stripe-Signature', signature.replace(/[^\x20-\x7e]/g, '') || 'x');
          const res = await req.send(body);
          assertRejected(res, `webhook ${String(body).slice(0, 100)}`);
          expect(res.status).toBe(400);
          expect(await rowCounts()).toEqual(before);
        },
      ),
      { numRuns: RUNS * 2 },
    );
  });
});

describe('arbitrary query strings', () => {
  const getRoutes = () => server.routes.filter((r) => r.method === 'get');

  it('a GET route ignores its query (same answer as none) or rejects it with 400 validation_failed; never a 5xx', async () => {
    expect(getRoutes().map(label)).toEqual(expect.arrayContaining(['GET /api/orders', 'GET /api/tickets', 'GET /api/reports/tickets']));
    for (const route of getRoutes()) {
      await fc.assert(
        fc.asyncProperty(anyQuery, async (query) => {
          const before = await rowCounts();
          const res = await owner.get(`${urlOf(route)}?${query}`);
          const what = `${label(route)}?${query}`;
          expect(res.status, `${what} → ${res.status} ${JSON.stringify(res.body).slice(0, 200)}`).toBeLessThan(500);
          if (res.status !== baseline.get(route)) {
            assertRejected(res, what);
            expect(res.status, what).toBe(400);
            expect((res.body as z.infer<typeof errorShape>).error.code, what).toBe('validation_failed');
          } else if (res.status >= 400) assertRejected(res, what);
          expect(await rowCounts(), what).toEqual(before);
        }),
        { numRuns: RUNS },
      );
    }
  });

  it('a route that reads its query refuses every known key given twice', async () => {
    const repeated = knownNames.flatMap((k) => [`${k}=1`, `${k}=1`]).join('&');
    let readers = 0;
    for (const route of getRoutes()) {
      const res = await owner.get(`${urlOf(route)}?${repeated}`);
      expect(res.status, label(route)).toBeLessThan(500);
      if (res.status !== baseline.get(route)) {
        readers += 1;
        assertRejected(res, label(route));
        expect(res.status).toBe(400);
      }
    }
    expect(readers, 'GET /api/orders, /tickets and the reports read their query').toBeGreaterThanOrEqual(3);
  });
});

describe('arbitrary :id segments', () => {
  const idRoutes = () => server.routes.filter((r) => r.path.includes(':id'));

  it('every :id route answers a 4xx in the error shape and stores nothing', async () => {
    expect(idRoutes().length).toBeGreaterThanOrEqual(10);
    for (const route of idRoutes()) {
      await fc.assert(
        fc.asyncProperty(anyIdSegment, async (segment) => {
          const before = await rowCounts();
          const url = urlWithId(route, segment);
          const res = takesBody(route) ? await owner[route.method](url).send({}) : await owner[route.method](url);
          assertRejected(res, `${route.method.toUpperCase()} ${url}`);
          expect(await rowCounts(), url).toEqual(before);
        }),
        { numRuns: RUNS },
      );
    }
  });
});
