// Time from `npm start` to /readyz answering 200, the build already made: the first start on an
// empty database (migrations and the demo café included) and restarts on a current one. For
// comparison, the same restart with the server's sources run through tsx, as `npm start` did
// before the server was compiled ahead of time.
import { spawn } from 'node:child_process';
import path from 'node:path';
import { ROOT } from './child';
import { summarize, type Summary } from './stats';

export interface StartupResult {
  /** `npm start` on an empty database: migrate, load the demo café, serve (ms). */
  first: number;
  /** `npm start` again on that database (ms). */
  restart: Summary;
  /** The sources through tsx on that database (ms). */
  sources: Summary;
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Start one way, time until /readyz says ok, stop (SIGTERM to its process group). */
async function timedStart(command: string, args: string[], env: NodeJS.ProcessEnv, port: number): Promise<number> {
  const started = performance.now();
  const child = spawn(command, args, { cwd: ROOT, detached: true, env: { ...process.env, ...env, PORT: String(port) }, stdio: ['ignore', 'pipe', 'pipe'] });
  let output = '';
  child.stdout.on('data', (d) => (output += d));
  child.stderr.on('data', (d) => (output += d));
  const exited = new Promise((r) => child.once('exit', r));
  try {
    for (;;) {
      if (child.exitCode !== null) throw new Error(`${command} ${args.join(' ')} exited ${child.exitCode}:\n${output}`);
      const ok = await fetch(`http://127.0.0.1:${port}/readyz`).then(
        (r) => r.status === 200,
        () => false,
      );
      if (ok) break;
      if (performance.now() - started > 120_000) throw new Error(`no /readyz after 2 minutes:\n${output}`);
      await sleep(5);
    }
    if (/building/i.test(output)) throw new Error('npm start built first: the build was older than the sources');
    return performance.now() - started;
  } finally {
    if (child.exitCode === null) process.kill(-child.pid!, 'SIGTERM');
    await exited;
  }
}

export async function startupTimes(dist: string, tmp: string, port: number, restarts = 5): Promise<StartupResult> {
  const env = { NODE_ENV: 'production', HOST: '127.0.0.1', JUGLINE_DIST: dist, LOG_LEVEL: 'warn', SEED_DEMO: 'true' };
  // once untimed: `npm start` builds here if the build is older than the sources
  await timedStart('npm', ['start'], { ...env, DATABASE_FILE: path.join(tmp, 'startup-warm.sqlite') }, port).catch(async (err: Error) => {
    if (!/built first/.test(err.message)) throw err;
  });
  const file = { DATABASE_FILE: path.join(tmp, 'startup.sqlite') };
  const first = await timedStart('npm', ['start'], { ...env, ...file }, port);
  const restart: number[] = [];
  const sources: number[] = [];
  for (let i = 0; i < restarts; i++) {
    restart.push(await timedStart('npm', ['start'], { ...env, ...file }, port));
    sources.push(await timedStart(process.execPath, ['--import', 'tsx', 'server/index.ts'], { ...env, ...file }, port));
  }
  return { first, restart: summarize(restart), sources: summarize(sources) };
}
