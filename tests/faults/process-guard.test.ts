// The last-resort handlers the server process runs under (server/process-guard.ts), tried in a
// real node process of their own: a promise nobody awaited is logged (pino, the app's logger) and
// the process goes on serving; an exception thrown out of a callback is logged and ends the process
// with code 1 (Node's own advice: the state it cut short is unknown), for its supervisor to restart.
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { ROOT } from './built-server';

function runGuarded(body: string) {
  const script = `
import { createLogger } from './server/logging.ts';
import { guardProcess } from './server/process-guard.ts';
guardProcess(createLogger('info'));
${body}`;
  const run = spawnSync(process.execPath, ['--import', 'tsx', '--input-type=module', '-e', script], { cwd: ROOT, encoding: 'utf8' });
  const logged = run.stdout
    .split('\n')
    .filter((l) => l.startsWith('{'))
    .map((l) => JSON.parse(l) as { level: number; msg: string; err?: { message: string; code?: string } });
  return { status: run.status, stdout: run.stdout, stderr: run.stderr, logged };
}

describe('the server process’s last-resort handlers', () => {
  it('log an unhandled rejection as an error and keep the process alive', () => {
    const run = runGuarded(`
Promise.reject(Object.assign(new Error('nobody awaited this'), { code: 'SQLITE_BUSY' }));
setImmediate(() => setImmediate(() => console.log('still serving')));`);
    expect(run.status, run.stderr).toBe(0);
    expect(run.stdout).toContain('still serving');
    // pino levels: 50 error, 60 fatal (pino's documentation)
    expect(run.logged).toEqual([expect.objectContaining({ level: 50, err: expect.objectContaining({ message: 'nobody awaited this', code: 'SQLITE_BUSY' }) })]);
  });

  it('log an uncaught exception as fatal and end the process with code 1', () => {
    const run = runGuarded(`
setImmediate(() => { throw new Error('a bug in a callback'); });
setTimeout(() => console.log('went on after the exception'), 2000);`);
    expect(run.status).toBe(1);
    expect(run.stdout).not.toContain('went on after the exception');
    expect(run.logged).toEqual([expect.objectContaining({ level: 60, err: expect.objectContaining({ message: 'a bug in a callback' }) })]);
  });
});
