// nginx from Debian's package in front of Jugline processes, with the repository's own
// deploy/nginx.conf as it is (copied unchanged into a temporary prefix folder, beside the two files
// it includes: the upstream servers and the listen line), its logs and temporary files there too.
// Stopped and removed after.
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { chmodSync, copyFileSync, existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { freePort } from './free-port';

export const NGINX = process.env.NGINX ?? '/usr/sbin/nginx';
export const MISSING_NGINX = `This needs nginx from Debian: apt-get install nginx (only ${NGINX} is used; no service has to run).`;
export const NGINX_CONF = path.resolve(import.meta.dirname, '../../deploy/nginx.conf');

export interface Nginx {
  url: string;
  port: number;
  stop(): Promise<void>;
}

async function waitForPort(port: number, child: ChildProcess, log: () => string) {
  for (let attempt = 0; attempt < 200; attempt++) {
    if (child.exitCode !== null) throw new Error(`nginx exited with ${child.exitCode}:\n${log()}`);
    const open = await new Promise<boolean>((resolve) => {
      const socket = net.connect(port, '127.0.0.1', () => (socket.destroy(), resolve(true)));
      socket.once('error', () => resolve(false));
    });
    if (open) return;
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error(`nginx did not listen on ${port}:\n${log()}`);
}

/** nginx on a free loopback port (or `port`), passing requests to the given Jugline ports. */
export async function startNginx(upstreamPorts: number[], port?: number): Promise<Nginx> {
  if (!existsSync(NGINX)) throw new Error(MISSING_NGINX);
  const prefix = mkdtempSync(path.join(os.tmpdir(), 'jugline-nginx-'));
  for (const dir of ['logs', 'temp']) mkdirSync(path.join(prefix, dir));
  // as root, nginx's workers run as an unprivileged user: they must be able to use its folders
  chmodSync(prefix, 0o755);
  chmodSync(path.join(prefix, 'temp'), 0o777);
  const listen = port ?? (await freePort());
  writeFileSync(path.join(prefix, 'upstream.conf'), upstreamPorts.map((p) => `server 127.0.0.1:${p};`).join('\n') + '\n');
  writeFileSync(path.join(prefix, 'listen.conf'), `listen 127.0.0.1:${listen};\n`);
  // nginx reads `include` beside the config file: the file goes into the prefix folder unchanged
  copyFileSync(NGINX_CONF, path.join(prefix, 'nginx.conf'));
  const args = ['-p', prefix + '/', '-c', path.join(prefix, 'nginx.conf'), '-e', path.join(prefix, 'logs', 'error.log'), '-g', 'daemon off;'];
  const test = spawnSync(NGINX, [...args, '-t'], { encoding: 'utf8' });
  if (test.status !== 0) {
    rmSync(prefix, { recursive: true, force: true });
    throw new Error(`nginx refused deploy/nginx.conf:\n${test.stderr}`);
  }
  const child = spawn(NGINX, args, { stdio: ['ignore', 'ignore', 'pipe'] });
  let output = '';
  child.stderr?.on('data', (d) => (output = (output + d).slice(-10_000)));
  const log = () => output + (existsSync(path.join(prefix, 'logs', 'error.log')) ? readFileSync(path.join(prefix, 'logs', 'error.log'), 'utf8') : '');
  try {
    await waitForPort(listen, child, log);
  } catch (err) {
    child.kill('SIGKILL');
    rmSync(prefix, { recursive: true, force: true });
    throw err;
  }
  return {
    url: `http://127.0.0.1:${listen}`,
    port: listen,
    stop: async () => {
      if (child.exitCode === null && child.signalCode === null) {
        const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
        child.kill('SIGQUIT'); // graceful: finish the requests in flight
        await exited;
      }
      rmSync(prefix, { recursive: true, force: true });
    },
  };
}
