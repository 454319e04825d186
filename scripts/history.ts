// npm run db:history -- --days 365 [--file <path or postgres:// URL>] [--seed <n>] [--append]
// An invented year of service for Pulse, reports and benchmarks, ending yesterday (café-local).
// The database is the server's (DATABASE_URL, else DATABASE_FILE) unless --file names another
// (a SQLite file, or a postgres:// URL).
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { parseArgs } from 'node:util';
import { databaseTarget, loadConfig } from '@server/config';
import { isPostgresUrl } from '@server/db/dialect';
import { DEFAULT_SEED, generateHistory, HistoryRefused, type HistorySummary } from './history/generate';

export { generateHistory, HistoryRefused };

const USAGE = 'Usage: npm run db:history -- --days <n> [--file <path or postgres:// URL>] [--seed <n>] [--append]';

class UsageError extends Error {}

function wholeNumber(name: string, text: string | undefined, fallback: number, min: number, max: number): number {
  if (text === undefined) return fallback;
  const n = Number(text);
  if (!Number.isInteger(n) || n < min || n > max) throw new UsageError(`--${name} takes a whole number from ${min} to ${max}, not "${text}"`);
  return n;
}

function report(s: HistorySummary): string {
  const span = s.firstDate ? `${s.firstDate} … ${s.lastDate}` : 'nothing to add';
  return [
    // never print a postgres:// URL: it may hold a password
    `History written to ${isPostgresUrl(s.file) ? 'the PostgreSQL database' : s.file} (seed ${s.seed}): ${span}`,
    `  days ${s.days}${s.skippedDays ? ` (${s.skippedDays} skipped: they had orders already)` : ''}`,
    `  orders ${s.orders}, items ${s.items}, payments ${s.payments}, refunds ${s.refunds}`,
    `  ${s.seconds.toFixed(1)} s`,
  ].join('\n');
}

/** Runs the command; answers the exit code. */
export async function main(argv: string[], env: NodeJS.ProcessEnv = process.env): Promise<number> {
  try {
    const { values } = parseArgs({
      args: argv,
      options: {
        days: { type: 'string' },
        file: { type: 'string' },
        seed: { type: 'string' },
        append: { type: 'boolean', default: false },
        help: { type: 'boolean', short: 'h', default: false },
      },
      strict: true,
    });
    if (values.help) {
      console.log(USAGE);
      return 0;
    }
    const days = wholeNumber('days', values.days, 365, 1, 3660);
    const seed = wholeNumber('seed', values.seed, DEFAULT_SEED, 0, 2 ** 32 - 1);
    let file: string;
    if (values.file && isPostgresUrl(values.file)) file = values.file;
    else if (values.file) {
      file = path.resolve(values.file);
      mkdirSync(path.dirname(file), { recursive: true });
    } else file = databaseTarget(loadConfig(env)); // exactly the database the server opens
    console.log(report(await generateHistory({ file, days, seed, append: values.append })));
    return 0;
  } catch (err) {
    if (err instanceof HistoryRefused) {
      console.error(err.message);
      return 2;
    }
    if (err instanceof UsageError || (err as { code?: string }).code?.startsWith('ERR_PARSE_ARGS')) {
      console.error(`${(err as Error).message}\n${USAGE}`);
      return 2;
    }
    throw err;
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(path.resolve(process.argv[1])).href) {
  process.exitCode = await main(process.argv.slice(2));
}
