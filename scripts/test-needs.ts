// `npm test` runs this first (the `pretest` script): what the tests need from Debian. Missing
// programs are installed with apt-get when we are root; otherwise the run stops at once and names
// the command to type. Nothing here starts a service: the tests start their own servers.
import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { postgresBin } from '@server/db/postgres-tools';
import { NGINX } from '@scripts/services/nginx';
import { REDIS_SERVER } from '@scripts/services/redis';

interface Need {
  /** The Debian package. */
  pkg: string;
  why: string;
  present(): boolean;
}

const NEEDS: Need[] = [
  { pkg: 'chromium', why: 'the browser tests (Playwright drives /usr/bin/chromium)', present: () => existsSync('/usr/bin/chromium') },
  {
    pkg: 'postgresql',
    why: 'the PostgreSQL leg of the server tests (a throwaway cluster from its programs)',
    present: () => {
      try {
        postgresBin();
        return true;
      } catch {
        return false;
      }
    },
  },
  { pkg: 'nginx', why: 'the load balancer in front of several processes (deploy/nginx.conf, on a loopback port)', present: () => existsSync(NGINX) },
  { pkg: 'redis-server', why: 'the live events across processes (a throwaway redis-server per test file)', present: () => existsSync(REDIS_SERVER) },
];

const missing = NEEDS.filter((n) => !n.present());
if (missing.length > 0) {
  const pkgs = missing.map((n) => n.pkg);
  const why = missing.map((n) => `  ${n.pkg}: ${n.why}`).join('\n');
  if (process.getuid?.() !== 0) {
    console.error(
      `The tests need Debian packages that are not installed:\n${why}\nInstall them, then run npm test again:\n  sudo apt-get install -y ${pkgs.join(' ')}`,
    );
    process.exit(1);
  }
  console.log(`Installing what the tests need from Debian:\n${why}`);
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  execFileSync('apt-get', ['update', '-qq'], { stdio: 'inherit', env });
  execFileSync('apt-get', ['install', '-y', '-qq', ...pkgs], { stdio: 'inherit', env });
  const still = missing.filter((n) => !n.present()).map((n) => n.pkg);
  if (still.length > 0) {
    console.error(`apt-get finished but these are still missing: ${still.join(', ')}`);
    process.exit(1);
  }
}
