// `npm start` runs the server compiled ahead of time (dist/app) on plain Node: no TypeScript loader
// is given to the process, so any .ts module it still needed would fail to load. A database
// migrated by the sources (tests, scripts, `npm run dev`) is current for the compiled server —
// the migrations keep their source names — and it takes an order and renders a screen.
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BuiltServer, ensureBuilt, espressoId, freePort, signIn } from './built-server';

const dir = mkdtempSync(path.join(os.tmpdir(), 'jugline-compiled-'));
const file = path.join(dir, 'jugline.sqlite');
const servers: BuiltServer[] = [];

beforeAll(() => ensureBuilt());
afterAll(async () => {
  for (const s of servers) await s.kill();
  rmSync(dir, { recursive: true, force: true });
});

describe('npm start', () => {
  it('serves the compiled server on plain node, on a database the sources migrated, without building again', async () => {
    const sources = new BuiltServer(file, await freePort(), {}, 'serve');
    servers.push(sources);
    await sources.start();
    await sources.kill();

    const compiled = new BuiltServer(file, await freePort(), {}, 'start');
    servers.push(compiled);
    await compiled.start();
    expect(compiled.log).not.toMatch(/building/i);

    const ready = await fetch(`${compiled.url}/readyz`);
    expect(await ready.json()).toEqual({ ok: true }); // no migration pending: the names match

    const cookie = await signIn(compiled.url, 'cashier');
    const order = await fetch(`${compiled.url}/api/orders`, {
      method: 'POST',
      headers: { cookie, origin: compiled.url, 'content-type': 'application/json' },
      body: JSON.stringify({
        clientOrderId: randomUUID(),
        customerName: 'Compiled Cleo',
        items: [{ menuItemId: await espressoId(compiled.url, cookie) }],
        payment: { method: 'cash', tenderedCents: 10_00 },
      }),
    });
    expect(order.status).toBe(201);

    const bar = await fetch(`${compiled.url}/bar`, { headers: { cookie: await signIn(compiled.url, 'barista') } });
    expect(bar.status).toBe(200);
    expect(await bar.text()).toContain('Compiled Cleo');
  });
});
