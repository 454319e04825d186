// `npm run build:server`: the server compiled ahead of time into dist/app, so `npm start` runs
// plain JavaScript (scripts/start.mjs) with no TypeScript loader. esbuild bundles server/index.ts
// with our own modules and leaves every package as an import, resolved from node_modules at run
// time. Each migration is an entry of its own: Knex loads them one by one (server/db/knex.ts).
// The bench compiles its server wrappers the same way (bench/child.ts).
import { readdirSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { build } from 'esbuild';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

/** Compile `entries` (paths from the project folder) into `outdir`, keeping their folders. */
export async function compileServer(outdir: string, entries: string[]): Promise<void> {
  await build({
    absWorkingDir: ROOT,
    entryPoints: entries,
    outbase: '.',
    outdir,
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    packages: 'external',
    sourcemap: true,
    logLevel: 'warning',
  });
}

/** The server and its migrations, into <dist>/app. */
export function buildServer(dist = path.join(ROOT, 'dist')): Promise<void> {
  const migrations = readdirSync(path.join(ROOT, 'migrations'))
    .filter((f) => f.endsWith('.ts'))
    .map((f) => `migrations/${f}`);
  return compileServer(path.join(dist, 'app'), ['server/index.ts', ...migrations]);
}

if (process.argv[1] === fileURLToPath(import.meta.url)) await buildServer();
