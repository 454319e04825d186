// npm run cluster [-- --processes 3 --port 8080]
// A café group on one machine, to try it: a throwaway PostgreSQL and Redis, the migrations and the
// demo café once, N Jugline processes (the production build) and nginx in front with
// deploy/nginx.conf. Prints the address; Ctrl-C stops everything and removes its folders.
import { fork, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { adminQuery, startCluster } from '@scripts/services/postgres';
import { startNginx } from '@scripts/services/nginx';
import { startRedis } from '@scripts/services/redis';
import { DEMO_PASSWORD, DEMO_SIGN_INS } from '@seeds/demo-cafe';
import { freePort } from '@scripts/services/free-port';

const ROOT = path.resolve(import.meta.dirname, '..');
const USAGE = 'Usage: npm run cluster -- [--processes 3] [--port 8080]';

function options() {
  const { values } = parseArgs({
    options: { processes: { type: 'string', default: '3' }, port: { type: 'string' }, help: { type: 'boolean', short: 'h' } },
    strict: true,
  });
  if (values.help) {
    console.log(USAGE);
    process.exit(0);
  }
  const processes = Number(values.processes);
  const port = values.port === undefined ? undefined : Number(values.port);
  if (!Number.isInteger(processes) || processes < 1 || processes > 16 || (port !== undefined && (!Number.isInteger(port) || port < 1024 || port > 65535))) {
    console.error(`--processes takes 1 to 16 and --port 1024 to 65535\n${USAGE}`);
    process.exit(2);
  }
  return { processes, port };
}

/** One Jugline process (the compiled server, as `npm start` runs it), ready once it serves. */
function startProcess(env: NodeJS.ProcessEnv, port: number): Promise<ChildProcess> {
  const child = fork(path.join(ROOT, 'scripts/start.mjs'), [], {
    cwd: ROOT,
    execArgv: ['--enable-source-maps'],
    env: { ...env, PORT: String(port) },
    stdio: ['ignore', 'pipe', 'pipe', 'ipc'],
  });
  return new Promise((resolve, reject) => {
    let output = '';
    const onData = (d: Buffer) => {
      output += d;
      if (output.includes('Jugline is serving at')) resolve(child);
    };
    child.stdout?.on('data', onData);
    child.stderr?.on('data', (d) => (output += d));
    child.once('exit', (code) => reject(new Error(`a Jugline process exited (${code}) before serving:\n${output}`)));
  });
}

const o = options();
const stops: (() => Promise<void>)[] = [];
const stopAll = async () => {
  for (const stop of stops.reverse()) await stop().catch((err) => console.error(err));
};
try {
  console.log('Starting PostgreSQL and Redis…');
  const pg = await startCluster();
  stops.push(pg.stop);
  await adminQuery(pg.adminUrl, 'CREATE DATABASE jugline');
  const redis = await startRedis();
  stops.push(redis.stop);
  const env = {
    ...process.env,
    NODE_ENV: 'production',
    HOST: '127.0.0.1',
    DATABASE_URL: pg.urlOf('jugline'),
    REDIS_URL: redis.url,
    SESSION_SECRET: randomBytes(32).toString('hex'),
    MIGRATE_ON_START: 'false',
  };
  console.log('Migrating and loading the demo café (once, before any process starts)…');
  const seeded = fork(path.join(ROOT, 'scripts/db.ts'), ['seed'], { cwd: ROOT, execArgv: ['--import', 'tsx'], env, stdio: 'inherit' });
  await new Promise<void>((resolve, reject) => seeded.once('exit', (code) => (code === 0 ? resolve() : reject(new Error(`db:seed exited ${code}`)))));
  console.log(`Starting ${o.processes} Jugline process${o.processes === 1 ? '' : 'es'}…`);
  const ports: number[] = [];
  for (let i = 0; i < o.processes; i++) {
    const port = await freePort();
    const child = await startProcess(env, port);
    ports.push(port);
    stops.push(
      () =>
        new Promise<void>((resolve) => {
          if (child.exitCode !== null) return resolve();
          child.once('exit', () => resolve());
          child.kill('SIGTERM');
        }),
    );
  }
  const nginx = await startNginx(ports, o.port);
  stops.push(nginx.stop);
  console.log(`\nThe group is serving at ${nginx.url} — nginx in front of ${ports.map((p) => `127.0.0.1:${p}`).join(', ')}.`);
  console.log(`Demo sign-ins: ${DEMO_SIGN_INS.map((s) => s.username).join(', ')} (password "${DEMO_PASSWORD}"). Ctrl-C stops everything.`);
} catch (err) {
  console.error(err);
  await stopAll();
  process.exit(1);
}
const stop = () => void stopAll().then(() => process.exit(0));
process.once('SIGINT', stop);
process.once('SIGTERM', stop);
