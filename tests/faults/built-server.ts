// The production build run the way e2e/own-server.ts runs it (e2e/serve.ts, NODE_ENV=production),
// as a child process in its own process group, for the tests that kill it or try to make it fall.
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';
import { createServer } from 'node:net';
import path from 'node:path';
import { DEMO_PASSWORD } from '@seeds/demo-cafe';

export const ROOT = path.resolve(import.meta.dirname, '../..');
/** A safety net so a broken start fails instead of hanging; never a timing assertion. */
const START_DEADLINE_MS = 30_000;

export const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Builds dist/ once if it is missing (`npm run test:faults` normally runs after `npm run build`). */
export function ensureBuilt() {
  if (['dist/client', 'dist/server', 'dist/app'].every((d) => existsSync(path.join(ROOT, d)))) return;
  const build = spawnSync('npm', ['run', 'build'], { cwd: ROOT, encoding: 'utf8' });
  if (build.status !== 0) throw new Error(`dist/ is missing and \`npm run build\` failed:\n${build.stdout}\n${build.stderr}`);
}

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });
}

/** The production server in its own process group, the way e2e/own-server.ts runs it. */
export class BuiltServer {
  private child: ChildProcess | null = null;
  log = '';
  constructor(
    readonly databaseFile: string,
    readonly port: number,
    /** More environment, e.g. DATABASE_URL and REDIS_URL for one process of a group. */
    private readonly env: NodeJS.ProcessEnv = {},
    /** serve: e2e/serve.ts through tsx; start: `npm start`'s own script, the compiled server on plain node. */
    private readonly via: 'serve' | 'start' = 'serve',
  ) {}

  get url() {
    return `http://127.0.0.1:${this.port}`;
  }

  /** The exit code or signal of a server that ended without being killed here; null while it runs. */
  get ended(): number | string | null {
    return this.child ? (this.child.exitCode ?? this.child.signalCode) : null;
  }

  private answers = () =>
    fetch(`${this.url}/api/session`).then(
      (r) => r.status,
      () => 0,
    );

  async start() {
    const [command, args, env] =
      this.via === 'serve'
        ? [path.join(ROOT, 'node_modules/.bin/tsx'), ['e2e/serve.ts'], { E2E_PORT: String(this.port), E2E_DATABASE_FILE: this.databaseFile }]
        : [process.execPath, ['scripts/start.mjs'], { NODE_ENV: 'production', PORT: String(this.port), HOST: '127.0.0.1', DATABASE_FILE: this.databaseFile }];
    const child = spawn(command, args, {
      cwd: ROOT,
      detached: true, // its own process group: tsx and the node it runs die together
      env: { ...process.env, NODE_OPTIONS: '', ...this.env, ...env },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    child.stdout?.on('data', (d) => (this.log += d));
    child.stderr?.on('data', (d) => (this.log += d));
    this.child = child;
    const until = Date.now() + START_DEADLINE_MS;
    while ((await this.answers()) !== 200) {
      if (child.exitCode !== null) throw new Error(`server exited with ${child.exitCode}:\n${this.log}`);
      if (Date.now() > until) throw new Error(`server did not start:\n${this.log}`);
      await sleep(50);
    }
  }

  /** SIGKILL the process group this test started — no graceful close, no flush. */
  async kill() {
    const child = this.child;
    if (!child?.pid || child.exitCode !== null || child.signalCode !== null) return;
    this.child = null;
    const exited = new Promise((resolve) => child.once('exit', resolve));
    process.kill(-child.pid, 'SIGKILL');
    await exited;
    while ((await this.answers()) !== 0) await sleep(20); // the port is closed once the group is gone
  }
}

/** Signs in as a demo person; the cookie header to send. */
export async function signIn(url: string, username: string): Promise<string> {
  const res = await fetch(`${url}/api/session`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ username, password: DEMO_PASSWORD }),
  });
  if (res.status !== 200) throw new Error(`sign-in as ${username} failed: ${res.status}`);
  return res.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
}

/** The demo menu's Espresso, the one-drink order the rush tests send. */
export async function espressoId(url: string, cookie: string): Promise<number> {
  const menu = (await (await fetch(`${url}/api/menu`, { headers: { cookie } })).json()) as { items: { id: number; name: string }[] };
  const espresso = menu.items.find((i) => i.name === 'Espresso');
  if (!espresso) throw new Error('the demo menu has no Espresso');
  return espresso.id;
}
