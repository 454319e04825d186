// Forking a server process for the bench (Jugline's or the floor's) and reading its probe.
import { fork, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { compileServer } from '@scripts/build-server';
import type { ProbeReading } from './probe';

export const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

export interface ServerChild {
  url: string;
  probe(opts?: { reset?: boolean; gc?: boolean }): Promise<ProbeReading>;
  stop(): Promise<void>;
}

const compiled = new Map<string, Promise<string>>();

/** The script compiled ahead of time as `npm start`'s server is (scripts/build-server.ts), beside it in <dist>/app. */
function compile(script: string, dist: string): Promise<string> {
  const out = path.join(dist, 'app');
  const key = `${out}/${script}`;
  if (!compiled.has(key)) {
    compiled.set(
      key,
      compileServer(out, [`bench/${script}`]).then(() => path.join(out, 'bench', script.replace(/\.ts$/, '.js'))),
    );
  }
  return compiled.get(key)!;
}

/**
 * Both servers run the same way: compiled ahead of time, on plain Node as `npm start` runs
 * Jugline, with --expose-gc so memory is read after a collection.
 */
export async function startChild(script: string, env: Record<string, string>): Promise<ServerChild> {
  let errors = '';
  const file = await compile(script, path.resolve(ROOT, env.JUGLINE_DIST ?? process.env.JUGLINE_DIST ?? 'dist'));
  const child: ChildProcess = fork(file, [], {
    cwd: ROOT,
    // BENCH_PROFILE_DIR (--profile): a V8 CPU profile of each server process, written as it exits
    execArgv: [
      '--enable-source-maps',
      '--expose-gc',
      ...(process.env.BENCH_PROFILE_DIR ? ['--cpu-prof', `--cpu-prof-dir=${process.env.BENCH_PROFILE_DIR}`] : []),
    ],
    // NODE_ENV as `npm start` sets it: React's production build renders the screens
    env: { ...process.env, NODE_ENV: 'production', ...env },
    stdio: ['ignore', 'ignore', 'pipe', 'ipc'],
  });
  child.stderr?.on('data', (d) => (errors += d));
  const url = await new Promise<string>((resolve, reject) => {
    child.once('exit', (code) => reject(new Error(`${script} exited (${code}) before it was ready:\n${errors}`)));
    child.on('message', (m: { ready?: string }) => m.ready && resolve(m.ready));
  });
  child.removeAllListeners('exit');
  let next = 0;
  const waiting = new Map<number, (r: ProbeReading) => void>();
  child.on('message', (m: { probe?: number; reading?: ProbeReading }) => {
    if (m.probe !== undefined) waiting.get(m.probe)?.(m.reading!);
  });
  return {
    url,
    probe: (opts = {}) =>
      new Promise((resolve) => {
        const id = next++;
        waiting.set(id, (r) => {
          waiting.delete(id);
          resolve(r);
        });
        child.send({ probe: id, ...opts });
      }),
    stop: () =>
      new Promise((resolve) => {
        if (child.exitCode !== null) return resolve();
        const timer = setTimeout(() => child.kill('SIGKILL'), 10_000);
        child.once('exit', () => {
          clearTimeout(timer);
          resolve();
        });
        child.send({ stop: true });
      }),
  };
}
