// Playwright's global setup: notes the git tree before the run and, as the teardown, fails the
// run naming every file the run added or changed in it (a screenshot written to docs/, a stray
// database). Files already dirty before the run count only if their content changed during it.
import { execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { readFileSync, statSync } from 'node:fs';

type TreeState = Map<string, string>;

/** Every path git reports as not clean (tracked changes and untracked, not ignored), with a hash of its bytes. */
function treeState(): TreeState | null {
  let out: string;
  try {
    out = execFileSync('git', ['status', '--porcelain=v1', '-z', '--untracked-files=all'], { encoding: 'utf8' });
  } catch {
    return null; // not a git checkout: nothing to compare
  }
  const state: TreeState = new Map();
  const entries = out.split('\0');
  for (let i = 0; i < entries.length; i++) {
    const entry = entries[i];
    if (!entry) continue;
    const file = entry.slice(3);
    if (entry[0] === 'R' || entry[0] === 'C') i++; // a rename carries its old path next
    state.set(file, hashOf(file));
  }
  return state;
}

function hashOf(file: string): string {
  try {
    if (statSync(file).isDirectory()) return 'directory';
    return createHash('sha256').update(readFileSync(file)).digest('hex');
  } catch {
    return 'deleted';
  }
}

export default function globalSetup() {
  const before = treeState();
  return function globalTeardown() {
    const after = treeState();
    if (!before || !after) return;
    const changed = [...after].filter(([file, hash]) => before.get(file) !== hash).map(([file]) => file);
    if (changed.length > 0) {
      throw new Error(
        `the e2e run changed the git tree (${changed.join(', ')}). Specs write screenshots with shot(name) from ` +
          'e2e/shots.ts (test-results/shots/, gitignored); docs/screenshots/ is refreshed by `npm run screenshots` only. ' +
          'Restore the files with `git checkout -- <file>` (or delete new ones). If you edited them yourself during the run, rerun.',
      );
    }
  };
}
