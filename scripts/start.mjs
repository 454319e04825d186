// `npm start`: the server compiled ahead of time (dist/app), with no TypeScript loader at run time.
// Plain JavaScript on purpose: this file runs before anything is built. It builds first when the
// build is missing or older than the sources (a fresh checkout, a `git pull`), then imports the
// compiled server into this same process.
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const dist = path.resolve(ROOT, process.env.JUGLINE_DIST ?? 'dist');
const BUILT = ['client/index.html', 'server/entry-server.js', 'app/server/index.js'].map((f) => path.join(dist, f));
const SOURCES = ['src', 'server', 'migrations', 'seeds', 'index.html', 'package-lock.json', 'vite.config.ts'];

function newest(file) {
  if (!existsSync(file)) return 0;
  const stat = statSync(file);
  if (!stat.isDirectory()) return stat.mtimeMs;
  return Math.max(0, ...readdirSync(file).map((f) => newest(path.join(file, f))));
}

const builtAt = Math.min(...BUILT.map((f) => (existsSync(f) ? statSync(f).mtimeMs : 0)));
if (builtAt === 0 || Math.max(...SOURCES.map((s) => newest(path.join(ROOT, s)))) > builtAt) {
  console.log(builtAt === 0 ? 'No build yet — building Jugline (one time)…' : 'The sources changed since the last build — building again…');
  const build = spawnSync('npm', ['run', 'build'], { cwd: ROOT, stdio: 'inherit' });
  if (build.status !== 0) process.exit(build.status ?? 1);
}
await import(pathToFileURL(path.join(dist, 'app/server/index.js')).href);
