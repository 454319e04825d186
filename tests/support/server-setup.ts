// Server tests fail on any unexpected console.error: a logged error is a bug until shown otherwise.
import { afterEach, beforeEach, vi } from 'vitest';

let errors: unknown[][] = [];
beforeEach(() => {
  errors = [];
  vi.spyOn(console, 'error').mockImplementation((...args: unknown[]) => {
    errors.push(args);
  });
  vi.spyOn(console, 'log').mockImplementation(() => {});
});
afterEach(() => {
  vi.restoreAllMocks();
  if (errors.length) throw new Error(`console.error was called:\n${errors.map((a) => a.map(String).join(' ')).join('\n')}`);
});
