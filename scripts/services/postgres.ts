// A throwaway PostgreSQL cluster from Debian's `postgresql` package for the PostgreSQL test leg:
// initdb into a temporary folder, the server on a free loopback port with its socket in the same
// folder, stopped and removed afterwards. No running service, no password (trust on loopback).
// initdb and postgres refuse to run as root, so as root they run as the `postgres` user.
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { chownSync, mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import pg from 'pg';
import { MISSING_POSTGRES, postgresBin } from '@server/db/postgres-tools';
import { freePort } from './free-port';

export interface PgCluster {
  /** postgres://… of the `postgres` maintenance database (superuser, no password). */
  adminUrl: string;
  urlOf(database: string): string;
  stop(): Promise<void>;
}

/** As root, the uid and gid of the `postgres` user (initdb refuses root); otherwise ourselves. */
function runAs(): { uid: number; gid: number } | undefined {
  if (process.getuid?.() !== 0) return undefined;
  const id = (flag: string) => Number(spawnSync('id', [flag, 'postgres'], { encoding: 'utf8' }).stdout.trim());
  const uid = id('-u');
  const gid = id('-g');
  if (!Number.isInteger(uid) || uid <= 0) throw new Error(`Running as root and there is no \`postgres\` user. ${MISSING_POSTGRES}`);
  return { uid, gid };
}

async function waitUntilReady(url: string, child: ChildProcess, log: () => string): Promise<void> {
  for (let attempt = 0; attempt < 300; attempt++) {
    if (child.exitCode !== null) throw new Error(`postgres exited with ${child.exitCode}:\n${log()}`);
    const client = new pg.Client({ connectionString: url });
    try {
      await client.connect();
      await client.end();
      return;
    } catch {
      await client.end().catch(() => {});
      await new Promise((r) => setTimeout(r, 100));
    }
  }
  throw new Error(`postgres did not accept connections:\n${log()}`);
}

export async function startCluster(): Promise<PgCluster> {
  const bin = postgresBin();
  const owner = runAs();
  const dir = mkdtempSync(path.join(os.tmpdir(), 'jugline-pg-'));
  if (owner) chownSync(dir, owner.uid, owner.gid);
  const data = path.join(dir, 'data');
  const init = spawnSync(path.join(bin, 'initdb'), ['-D', data, '-A', 'trust', '-U', 'postgres', '--no-sync', '-E', 'UTF8', '--locale=C'], {
    encoding: 'utf8',
    cwd: dir,
    ...owner,
  });
  if (init.status !== 0) {
    rmSync(dir, { recursive: true, force: true });
    throw new Error(`initdb failed (${init.error?.message ?? init.status}):\n${init.stderr}\n${MISSING_POSTGRES}`);
  }
  const port = await freePort();
  // durability off: a test cluster is thrown away; max_connections covers a pool per test server
  const child = spawn(
    path.join(bin, 'postgres'),
    [
      '-D',
      data,
      '-p',
      String(port),
      '-k',
      dir,
      '-c',
      'listen_addresses=127.0.0.1',
      '-c',
      'fsync=off',
      '-c',
      'synchronous_commit=off',
      '-c',
      'full_page_writes=off',
      '-c',
      'max_connections=400',
    ],
    { cwd: dir, stdio: ['ignore', 'pipe', 'pipe'], ...owner },
  );
  let output = '';
  child.stdout?.on('data', (d) => (output += d));
  child.stderr?.on('data', (d) => (output = (output + d).slice(-20_000)));
  const urlOf = (database: string) => `postgres://postgres@127.0.0.1:${port}/${database}`;
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  const stop = async () => {
    if (child.exitCode === null) {
      child.kill('SIGINT'); // fast shutdown: roll back open transactions, close connections
      await exited;
    }
    rmSync(dir, { recursive: true, force: true });
  };
  try {
    await waitUntilReady(urlOf('postgres'), child, () => output);
  } catch (err) {
    await stop();
    throw err;
  }
  return { adminUrl: urlOf('postgres'), urlOf, stop };
}

/** One statement on a short-lived connection (CREATE/DROP DATABASE can't run in a transaction). */
export async function adminQuery(url: string, sql: string): Promise<void> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    await client.query(sql);
  } finally {
    await client.end();
  }
}

// `npm run db:postgres`: a throwaway cluster to try Jugline on, with a `jugline` database, until Ctrl-C.
if (process.argv[1] && import.meta.url === pathToFileURL(path.resolve(process.argv[1])).href) {
  const cluster = await startCluster();
  await adminQuery(cluster.adminUrl, 'CREATE DATABASE jugline');
  console.log(
    `PostgreSQL is up (a throwaway cluster; Ctrl-C stops and removes it). In another shell:\n\n  export DATABASE_URL=${cluster.urlOf('jugline')}\n  export SESSION_SECRET=${randomBytes(32).toString('hex')}\n  npm run db:seed && npm start\n`,
  );
  const stop = () => void cluster.stop().then(() => process.exit(0));
  process.once('SIGINT', stop);
  process.once('SIGTERM', stop);
}
