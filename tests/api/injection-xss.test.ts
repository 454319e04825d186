// Hostile text renders as text on every surface: the server-rendered screens (and the data they
// hand to the browser), the live socket's events, the receipt page and the e-mailed receipt, the
// shift-report e-mail, the CSV exports and the cup labels. Customer names, notes, allergy notes
// and discount reasons come in through the API; menu, size, milk, extra, category and café
// names are written straight into the database, as a menu editor or a settings screen could.
// Each payload carries the marker "pwned" so any place it turns into markup can be found.
import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { createRequire } from 'node:module';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Config } from '@server/config';
import { startServer, type RunningServer } from '@server/server';
import { DEMO_PASSWORD } from '@seeds/demo-cafe';
import type { LiveEvent } from '@/domain/types';
import { manualClock, type DemoLogin } from '../support/test-server';
import { closeAllSockets, connectAndResume, type LiveClient } from '../realtime/ws-client';
import { orderBody, type Agent } from './helpers';
import Papa from 'papaparse';
import { jsonOf } from '../support/rows';

// jsdom (a WHATWG-conformant HTML parser; scripts are not run) ships no types; its document is a DOM Document
const { JSDOM } = createRequire(import.meta.url)('jsdom') as { JSDOM: new (html: string) => { window: { document: Document } } };

const MARK = 'pwned';
const P = {
  // no spaces: the receipt and Pickup greet by first name, so the whole payload is the first name
  name: '<img/src="x"/onerror="pwned(1)">',
  scriptName: '</script><script>pwned(2)</script>',
  // (a line break in a name is refused at the door — tests/api/validation.test.ts)
  csvName: 'Jo "JJ", <b id=pwned3>x</b>; line 2',
  note: `"><svg onload=pwned(3)> ' onfocus='pwned(4)' x='`,
  allergy: '<script>pwned(5)</script> Tom &amp; Jerry &lt;3',
  discount: '<b onmouseover=pwned(6)>staff</b>',
  item: '<img src=x onerror=pwned(7)>Flat white',
  milk: 'Oat"><script>pwned(8)</script>',
  extra: '</td><td onclick=pwned(9)>Vanilla',
  size: '<i x=pwned(12)>R</i>',
  category: '<svg/onload=pwned(13)>Coffee',
  cafe: 'Harbour <script>pwned(10)</script> & "Hearth"',
  footer: '</p><a href="javascript:pwned(11)">Win</a>',
  search: '"><img src=x onerror=pwned(14)>',
};

/** Attributes that only ever hold text, where a payload is harmless (React quotes and escapes them). */
const TEXT_ATTRIBUTES = /^(data-[\w-]+|title|alt|aria-[\w-]+|value|placeholder|label|content)$/;
/** Attributes holding a URL: harmless with a payload percent-encoded into a path or query, not as a script URL. */
const URL_ATTRIBUTES = /^(href|src|action|formaction|poster|xlink:href)$/;
const scriptUrl = (value: string) => /^\s*(javascript|data|vbscript):/i.test(value);

/**
 * Every way a payload could have become markup: an inline handler, a marked attribute that isn't
 * plain text (href, src, id, x, …), a script whose text carries the marker, or page state that a
 * `<` could break out of. Returns the findings, so a failure names each one.
 */
function markupFrom(html: string, where: string): string[] {
  const doc = new JSDOM(html).window.document;
  const found: string[] = [];
  for (const el of doc.querySelectorAll('*')) {
    for (const { name, value } of Array.from(el.attributes)) {
      if (el.tagName === 'IFRAME' && name === 'srcdoc') found.push(...markupFrom(value, `${where} › iframe`));
      else if (name.startsWith('on')) found.push(`${where}: <${el.tagName.toLowerCase()} ${name}="${value}">`);
      else if (URL_ATTRIBUTES.test(name) ? scriptUrl(value) : value.includes(MARK) && !TEXT_ATTRIBUTES.test(name)) {
        found.push(`${where}: <${el.tagName.toLowerCase()} ${name}="${value}">`);
      }
    }
    if (el.tagName === 'SCRIPT') {
      const text = el.textContent ?? '';
      if (el.id === 'app-state') {
        if (text.includes('<')) found.push(`${where}: a "<" inside the page state`);
        JSON.parse(text); // still one well-formed JSON value
      } else if (text.includes(MARK)) found.push(`${where}: <script>${text.slice(0, 80)}</script>`);
    }
  }
  return found;
}

/** The words a person sees (the body's text, the <title> apart), line breaks and runs of spaces as one. */
function visibleText(html: string): string {
  const doc = new JSDOM(html).window.document;
  doc.querySelectorAll('script, style').forEach((el) => el.remove());
  return (doc.body.textContent ?? '').replace(/\s+/g, ' ');
}
const flat = (s: string) => s.replace(/\s+/g, ' ');

/** RFC 4180 §2 (a quoted field may hold commas, CRLF and "" for a quote), read by papaparse, a reader written apart from ours. */
function readCsv(text: string): string[][] {
  return Papa.parse<string[]>(text.replace(/\r\n$/, ''), { newline: '\r\n' }).data;
}

const time = manualClock('2026-03-02T14:00:00.000Z'); // 09:00 in New York, the demo café's zone
let dir: string;
let server: RunningServer;
const agents = {} as Record<DemoLogin, Agent>;
let orderId: number;
let secondOrderId: number;
let csvOrderId: number;
const fired: LiveEvent[] = [];
let bar: LiveClient;

async function signIn(login: DemoLogin) {
  const agent = request.agent(server.url);
  expect((await agent.post('/api/session').send({ username: login, password: DEMO_PASSWORD })).status).toBe(200);
  return agent;
}

beforeAll(async () => {
  dir = mkdtempSync(path.join(os.tmpdir(), 'jugline-xss-'));
  const config: Config = {
    env: 'test',
    port: 0,
    host: '127.0.0.1',
    databaseFile: path.join(dir, 'jugline.sqlite'),
    sessionSecret: randomBytes(32).toString('hex'),
    seedDemo: true,
  };
  // the screens are rendered by the real SSR entry (Vite in middleware mode), not left out
  server = await startServer(config, { pages: 'development', clock: time.clock, log: () => {} });
  const db = server.db;

  const flatWhite = await db('menu_items').where({ name: 'Flat white' }).first('id', 'category_id');
  await db('menu_items').where({ id: flatWhite.id }).update({ name: P.item });
  await db('item_sizes').where({ item_id: flatWhite.id }).update({ name: P.size });
  await db('menu_categories').where({ id: flatWhite.category_id }).update({ name: P.category });
  await db('milk_options').where({ name: 'Oat' }).update({ name: P.milk });
  await db('extras').where({ name: 'Vanilla syrup' }).update({ name: P.extra });
  await db('locations').update({ name: P.cafe, receipt_footer: P.footer });

  for (const login of ['owner', 'lead', 'cashier', 'barista'] as const) agents[login] = await signIn(login);
  const signedIn = await request(server.url).post('/api/session').send({ username: 'barista', password: DEMO_PASSWORD });
  const cookie = ([] as string[])
    .concat(signedIn.headers['set-cookie'] ?? [])
    .map((c) => c.split(';')[0])
    .join('; ');
  ({ client: bar } = await connectAndResume(server.url, cookie));

  expect((await agents.lead.post('/api/shifts').send({ openingFloatCents: 100_00, baristasOnBar: 1, waitTargetSeconds: 240 })).status).toBe(201);
  const size = await db('item_sizes').where({ item_id: flatWhite.id }).first('id');
  const oat = await db('milk_options').where({ name: P.milk }).first('id');
  const vanilla = await db('extras').where({ name: P.extra }).first('id');
  const latte = await db('menu_items').where({ name: 'Latte' }).first('id');
  const line = { menuItemId: flatWhite.id, sizeId: size.id, milkId: oat.id, extraIds: [vanilla.id], note: P.note };
  const first = await agents.owner.post('/api/orders').send({
    ...orderBody(P.name, [line]),
    allergyNote: P.allergy,
    discount: { kind: 'percent', value: 10, reason: P.discount },
  });
  expect(first.status, JSON.stringify(first.body)).toBe(201);
  orderId = first.body.order.id;
  const second = await agents.cashier.post('/api/orders').send(orderBody(P.scriptName, [{ menuItemId: latte.id, milkId: oat.id }]));
  expect(second.status).toBe(201);
  secondOrderId = second.body.order.id;
  const third = await agents.cashier.post('/api/orders').send(orderBody(P.csvName, [{ menuItemId: latte.id }]));
  expect(third.status).toBe(201);
  csvOrderId = third.body.order.id;
  for (let i = 0; i < 3; i++) fired.push(await bar.nextEvent('order.fired'));
}, 60_000);

afterAll(async () => {
  await closeAllSockets();
  await server?.close();
  if (dir) rmSync(dir, { recursive: true, force: true });
});

async function page(login: DemoLogin, url: string) {
  const res = await agents[login].get(url);
  expect(res.status, `${url}: ${res.text.slice(0, 300)}`).toBe(200);
  expect(res.headers['content-type']).toMatch(/^text\/html/);
  return res.text;
}

describe('the checks themselves', () => {
  it('find markup where a payload has become markup, and nothing in escaped text', () => {
    expect(markupFrom(`<p>${P.name}</p>`, 'raw')).toEqual([expect.stringContaining('onerror')]);
    expect(markupFrom('<a href="javascript:pwned(11)">x</a>', 'raw')).toHaveLength(1);
    expect(markupFrom('<p><b id=pwned3>x</b></p>', 'raw')).toHaveLength(1);
    expect(markupFrom('<script>pwned(5)</script>', 'raw')).toHaveLength(1);
    expect(markupFrom('<iframe srcdoc="<img src=x onerror=pwned(1)>"></iframe>', 'raw')).toHaveLength(1);
    expect(() => markupFrom('<script id="app-state" type="application/json">{"a":"</script><p>"}</script>', 'raw')).toThrow();
    const escaped = '<p title="&lt;img onerror=pwned(1)&gt;">&lt;img src=x onerror="pwned(1)"&gt;</p><a href="/r?q=%3Cimg%20pwned">x</a>';
    expect(markupFrom(escaped, 'escaped')).toEqual([]);
  });

  it('read CSV as RFC 4180 says (quoted commas, doubled quotes, CRLF inside a quoted field)', () => {
    expect(readCsv('"a","b ""c""","d,\r\ne"\r\n"1",2,\r\n')).toEqual([
      ['a', 'b "c"', 'd,\r\ne'],
      ['1', '2', ''],
    ]);
  });
});

describe('server-rendered screens', () => {
  const screens: [DemoLogin, () => string, (keyof typeof P)[]][] = [
    ['barista', () => '/bar', ['name', 'scriptName', 'note', 'allergy', 'item', 'milk', 'extra']],
    ['cashier', () => '/pickup', []],
    ['cashier', () => '/counter', ['item', 'category']],
    ['cashier', () => `/receipts/${orderId}`, ['cafe', 'name', 'item', 'size', 'milk', 'extra', 'discount', 'footer']],
    ['cashier', () => `/labels/${orderId}`, ['name', 'item', 'size', 'milk', 'extra', 'note', 'allergy']],
    ['lead', () => '/pulse', []],
    ['lead', () => `/reports?q=${encodeURIComponent(P.search)}`, []],
    ['lead', () => '/reports', ['name', 'scriptName']],
  ];

  it.each(screens)('as %s, %s shows every payload as text and runs none of it', async (login, url, shown) => {
    const html = await page(login, url());
    expect(markupFrom(html, url())).toEqual([]);
    const text = visibleText(html);
    for (const key of shown) expect(text, `${url()} should show ${key}`).toContain(flat(P[key]));
  });

  it('the data handed to the browser carries the names exactly, for the same render after hydration', async () => {
    const html = await page('barista', '/bar');
    const state = new JSDOM(html).window.document.getElementById('app-state')!.textContent!;
    const text = JSON.stringify(JSON.parse(state));
    for (const key of ['name', 'scriptName', 'note', 'allergy', 'item', 'milk'] as const) expect(text).toContain(JSON.stringify(P[key]).slice(1, -1));
  });
});

describe('the live socket', () => {
  it('carries every hostile string unchanged in its events, as JSON data', () => {
    const first = fired.find((e) => e.ticket.id === orderId)!;
    expect(first.ticket.customerName).toBe(P.name);
    expect(first.ticket.allergyNote).toBe(P.allergy);
    expect(first.ticket.drinks[0]).toMatchObject({ itemName: P.item, milk: { name: P.milk }, note: P.note });
    expect(JSON.stringify(first.ticket.drinks[0])).toContain(JSON.stringify(P.extra));
    expect(fired.find((e) => e.ticket.id === secondOrderId)!.ticket.customerName).toBe(P.scriptName);
    expect(fired.find((e) => e.ticket.id === csvOrderId)!.ticket.customerName).toBe(P.csvName);
  });
});

describe('e-mail', () => {
  it('the e-mailed receipt: HTML with every payload as text, plain text verbatim, headers untouched', async () => {
    const res = await agents.cashier.post(`/api/orders/${orderId}/receipt`).send({ email: 'guest@example.com' });
    expect(res.status).toBe(202);
    const mail = await server.db('outbox').where({ message_id: res.body.messageId }).first();
    expect(jsonOf(mail.to_addresses)).toEqual(['guest@example.com']);
    expect(mail.subject).not.toMatch(/[\r\n]/);
    expect(mail.subject).toContain(P.cafe);
    expect(markupFrom(mail.html_body, 'receipt mail')).toEqual([]);
    const html = visibleText(mail.html_body);
    const firstName = P.name.split(' ')[0];
    for (const text of [P.cafe, firstName, P.item, P.size, P.milk, P.extra, P.note, P.discount, P.footer]) {
      expect(html).toContain(flat(text));
      expect(mail.text_body).toContain(text);
    }
  });

  it('the shift-report e-mail to the owner: menu and café names as text', async () => {
    const close = await agents.lead.post('/api/shifts/current/close').send({ countedCashCents: 100_00, note: P.note, confirmOpenTickets: true });
    expect(close.status).toBe(200);
    expect(close.body.mailed).toBe(true);
    const mail = (await server.db('outbox').orderBy('id', 'desc').select('*')).find((m) =>
      jsonOf<string[]>(m.to_addresses).some((a) => a.includes('mara@harbour-hearth.example')),
    );
    expect(mail.subject).not.toMatch(/[\r\n]/);
    expect(markupFrom(mail.html_body, 'shift report mail')).toEqual([]);
    const html = visibleText(mail.html_body);
    for (const text of [P.cafe, P.item]) {
      expect(html).toContain(flat(text));
      expect(mail.text_body).toContain(text);
    }
  });
});

describe('the Outbox screen', () => {
  it('lists the mails as text and shows mail HTML only in a sandboxed frame', async () => {
    const html = await page('lead', '/outbox');
    expect(markupFrom(html, '/outbox')).toEqual([]); // the frames' own HTML is checked too
    const doc = new JSDOM(html).window.document;
    const frames = Array.from(doc.querySelectorAll('iframe'));
    expect(frames.length).toBeGreaterThanOrEqual(1); // the open mail's HTML
    for (const frame of frames) expect(frame.getAttribute('sandbox')).toBe(''); // no scripts, forms or same-origin
    expect(visibleText(html)).toContain(flat(P.cafe));
  });
});

describe('CSV exports', () => {
  it('the ticket CSV is a download, not a page, and each hostile name is exactly one cell', async () => {
    const res = await agents.lead.get('/api/reports/tickets.csv');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toMatch(/^attachment;/);
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    const [header, ...rows] = readCsv(res.text);
    const customer = header.indexOf('Customer');
    expect(rows.every((r) => r.length === header.length)).toBe(true); // quotes, commas and the line break stayed inside their cell
    const names = rows.map((r) => r[customer]);
    for (const name of [P.name, P.scriptName, P.csvName]) expect(names).toContain(name);
    expect(rows).toHaveLength(3);
  });

  it('the shift CSV has the hostile menu and milk names as plain cells', async () => {
    const { id: shiftId } = await server.db('shifts').whereNotNull('closed_at').orderBy('id', 'desc').first('id');
    const res = await agents.lead.get(`/api/reports/shift/${shiftId}.csv`);
    expect(res.status).toBe(200);
    expect(res.headers['content-disposition']).toMatch(/^attachment;/);
    const rows = readCsv(res.text);
    expect(rows.every((r) => r.length === rows[0].length)).toBe(true);
    const items = rows.filter((r) => r[0] === 'Top items').map((r) => r[1]);
    expect(items).toContain(P.item);
  });
});

describe('JSON answers', () => {
  it('an order with hostile text is served as JSON that no browser will sniff as HTML', async () => {
    const res = await agents.cashier.get(`/api/orders/${orderId}`);
    expect(res.headers['content-type']).toMatch(/^application\/json/);
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.body.order.customerName).toBe(P.name);
  });

  it('a hostile path in a 404 is echoed only inside JSON', async () => {
    const res = await agents.cashier.get(`/api/${encodeURIComponent(P.name)}`);
    expect(res.status).toBe(404);
    expect(res.headers['content-type']).toMatch(/^application\/json/);
  });
});
