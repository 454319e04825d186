// A Jugline server a test starts, kills and starts again on the same database file (not
// Playwright's webServer), the way a crashed or restarted café server comes back.
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { expect, test } from '@playwright/test';

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });
}

/** Expected in the console while the server is down: failed fetches and socket reconnects. */
export const expectedWhileDown = [/Failed to load resource: net::ERR_CONNECTION_REFUSED/, /WebSocket connection to 'ws:\/\/.*' failed/];

export class OwnServer {
  private child: ChildProcess | null = null;
  private log = '';
  private constructor(
    readonly dir: string,
    readonly databaseFile: string,
    readonly port: number,
  ) {}

  static async create(name: string): Promise<OwnServer> {
    const dir = mkdtempSync(path.join(os.tmpdir(), `jugline-e2e-${name}-`));
    return new OwnServer(dir, path.join(dir, 'jugline.sqlite'), await freePort());
  }

  get baseURL() {
    return `http://127.0.0.1:${this.port}`;
  }

  private answers = () =>
    fetch(`${this.baseURL}/api/session`).then(
      (r) => r.status,
      () => 0,
    );

  async start() {
    const child = spawn('node_modules/.bin/tsx', ['e2e/serve.ts'], {
      detached: true, // its own process group: tsx and the node it runs stop together
      env: { ...process.env, E2E_PORT: String(this.port), E2E_DATABASE_FILE: this.databaseFile },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    child.stdout?.on('data', (d) => (this.log += d));
    child.stderr?.on('data', (d) => (this.log += d));
    this.child = child;
    await expect.poll(this.answers, { timeout: 60_000, message: `server did not start:\n${this.log}` }).toBe(200);
  }

  async kill() {
    const child = this.child;
    if (!child?.pid || child.exitCode !== null || child.signalCode !== null) return;
    this.child = null;
    const exited = new Promise((resolve) => child.once('exit', resolve));
    process.kill(-child.pid, 'SIGKILL'); // only the group this test started
    await exited;
    await expect.poll(this.answers, { message: 'server still answering after kill' }).toBe(0);
  }

  async dispose() {
    await this.kill();
    rmSync(this.dir, { recursive: true, force: true });
  }
}

/**
 * A spec that needs a café of its own (a board with only its own tickets, a bean shelf as seeded):
 * one server on a fresh database for the file, started before its tests and removed after.
 * Call at the top of the spec; read `.baseURL` inside a test.
 */
export function ownServerFor(name: string): { readonly baseURL: string } {
  let own: OwnServer | undefined;
  test.beforeAll(async () => {
    own = await OwnServer.create(name);
    await own.start();
  });
  test.afterAll(() => own?.dispose());
  return {
    get baseURL() {
      if (!own) throw new Error('ownServerFor: read baseURL inside a test');
      return own.baseURL;
    },
  };
}
