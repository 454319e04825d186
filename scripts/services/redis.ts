// A throwaway Redis from Debian's `redis-server` package: a free loopback port, its files in a
// temporary folder, nothing saved to disk; stopped and removed afterwards. `down()` and `up()` stop
// it and start it again on the same port (what a Redis restart mid-rush looks like to the processes).
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { freePort } from './free-port';

export const REDIS_SERVER = process.env.REDIS_SERVER ?? '/usr/bin/redis-server';
export const MISSING_REDIS = `This needs Redis from Debian: apt-get install redis-server (only ${REDIS_SERVER} is used; no service has to run).`;

export interface RedisServer {
  url: string;
  /** Stops the server, keeping its port and folder for up(). */
  down(): Promise<void>;
  /** Starts it again on the same port. */
  up(): Promise<void>;
  stop(): Promise<void>;
}

/** Answers once the server takes connections (a PING over a bare socket). */
async function waitUntilReady(port: number, child: ChildProcess, log: () => string): Promise<void> {
  for (let attempt = 0; attempt < 200; attempt++) {
    if (child.exitCode !== null) throw new Error(`redis-server exited with ${child.exitCode}:\n${log()}`);
    const pong = await new Promise<boolean>((resolve) => {
      const socket = net.connect(port, '127.0.0.1', () => socket.write('PING\r\n'));
      socket.once('data', (d) => (socket.destroy(), resolve(d.toString().startsWith('+PONG'))));
      socket.once('error', () => resolve(false));
    });
    if (pong) return;
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error(`redis-server did not answer:\n${log()}`);
}

export async function startRedis(): Promise<RedisServer> {
  if (!existsSync(REDIS_SERVER)) throw new Error(MISSING_REDIS);
  const dir = mkdtempSync(path.join(os.tmpdir(), 'jugline-redis-'));
  const port = await freePort();
  let child: ChildProcess;
  let output = '';
  const launch = async () => {
    output = '';
    child = spawn(REDIS_SERVER, ['--port', String(port), '--bind', '127.0.0.1', '--save', '', '--appendonly', 'no', '--dir', dir, '--daemonize', 'no'], {
      cwd: dir,
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    child.stdout?.on('data', (d) => (output = (output + d).slice(-10_000)));
    child.stderr?.on('data', (d) => (output = (output + d).slice(-10_000)));
    await waitUntilReady(port, child, () => output);
  };
  const halt = async () => {
    if (child.exitCode !== null || child.signalCode !== null) return;
    const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
    child.kill('SIGTERM');
    await exited;
  };
  try {
    await launch();
  } catch (err) {
    await halt();
    rmSync(dir, { recursive: true, force: true });
    throw err;
  }
  return {
    url: `redis://127.0.0.1:${port}`,
    down: halt,
    up: launch,
    stop: async () => {
      await halt();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}

// `tsx scripts/services/redis.ts`: one to try things with, until Ctrl-C.
if (process.argv[1] && import.meta.url === pathToFileURL(path.resolve(process.argv[1])).href) {
  const redis = await startRedis();
  console.log(`Redis is up (a throwaway one; Ctrl-C stops it):\n\n  export REDIS_URL=${redis.url}\n`);
  const stop = () => void redis.stop().then(() => process.exit(0));
  process.once('SIGINT', stop);
  process.once('SIGTERM', stop);
}
