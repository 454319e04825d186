// Client weight per screen, from the build's manifest: what a browser downloads to show and run a
// screen = the entry chunk and its static imports + the screen's chunk and its static imports
// (each file once), gzip-compressed. "Later" is what the screen loads itself after hydrating
// (dynamic imports inside it, e.g. the Pulse chart).
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { gzipSync } from 'node:zlib';
import { chunkClosure, readManifest, type Manifest } from '@server/ssr/pages';
import { SCREEN_FILES } from '@/routes';

export interface ScreenWeight {
  screen: string;
  jsGzip: number;
  cssGzip: number;
  laterJsGzip: number;
  files: number;
}

function dynamicClosure(manifest: Manifest, keys: string[], skip: Set<string>): string[] {
  const out: string[] = [];
  for (const key of keys) {
    for (const dyn of (manifest[key] as { dynamicImports?: string[] }).dynamicImports ?? []) {
      if (!skip.has(dyn)) out.push(dyn);
    }
  }
  return out;
}

/** Keys of the chunks a set of manifest keys imports statically (themselves included). */
function staticKeys(manifest: Manifest, keys: string[]): string[] {
  const seen = new Set<string>();
  const visit = (k: string) => {
    if (seen.has(k) || !manifest[k]) return;
    seen.add(k);
    manifest[k].imports?.forEach(visit);
  };
  keys.forEach(visit);
  return [...seen];
}

export function screenWeights(clientDir: string): ScreenWeight[] {
  const manifest = readManifest(clientDir);
  if (!manifest) throw new Error(`${clientDir} has no .vite/manifest.json: build with build.manifest (vite.config.ts sets it)`);
  const sizes = new Map<string, number>();
  const gz = (file: string) => {
    if (!sizes.has(file)) sizes.set(file, gzipSync(readFileSync(path.join(clientDir, file))).length);
    return sizes.get(file)!;
  };
  const entries = Object.keys(manifest).filter((k) => manifest[k].isEntry);
  const screenKeys = new Set(Object.values(SCREEN_FILES));
  return Object.entries(SCREEN_FILES).map(([screen, file]) => {
    const now = chunkClosure(manifest, [...entries, file]);
    const mine = staticKeys(manifest, [file]);
    const later = chunkClosure(manifest, dynamicClosure(manifest, mine, screenKeys));
    const laterJs = later.js.filter((f) => !now.js.includes(f));
    return {
      screen,
      jsGzip: now.js.reduce((n, f) => n + gz(f), 0),
      cssGzip: now.css.reduce((n, f) => n + gz(f), 0),
      laterJsGzip: laterJs.reduce((n, f) => n + gz(f), 0),
      files: now.js.length + now.css.length,
    };
  });
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const dir = path.resolve(process.argv[2] ?? 'dist/client');
  for (const w of screenWeights(dir)) {
    console.log(
      `${w.screen.padEnd(16)} js ${(w.jsGzip / 1024).toFixed(1).padStart(6)} KB  css ${(w.cssGzip / 1024).toFixed(1)} KB  later ${(w.laterJsGzip / 1024).toFixed(1)} KB  (${w.files} files)`,
    );
  }
}
