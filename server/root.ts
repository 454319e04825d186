// The project's folder, found from this module's own place: server/root.ts when the sources run
// (tsx, tests), dist/app/server/index.js when the compiled server runs (`npm start`). Walking up
// to package.json finds the same folder from both.
import { existsSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

function rootFrom(file: string): string {
  for (let dir = path.dirname(file); ; dir = path.dirname(dir)) {
    if (existsSync(path.join(dir, 'package.json'))) return dir;
    if (path.dirname(dir) === dir) throw new Error(`No package.json above ${file}`);
  }
}

export const PROJECT_ROOT = rootFrom(fileURLToPath(import.meta.url));
