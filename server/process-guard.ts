// Last-resort handlers for the server process (server/index.ts and e2e/serve.ts install them).
// Every promise the app starts is awaited or caught, and a busy database answers 503 (errors.ts);
// these only catch what still slips through, and decide whether the process goes on:
//
// - An unhandled rejection is an operation that has already failed with nobody left to tell.
//   It unwound no stack of anyone else's: each command is one SQLite transaction that rolls back
//   when it fails, and live events are published only after a commit, so the database and the
//   screens are as they were. Surviving it is safe: log it as an error and keep serving.
// - An uncaught exception cut a synchronous call short somewhere we cannot know (a socket's
//   bookkeeping, a response half-written), and Node's documentation says it is not safe to resume
//   normal operation after one. Log it as fatal and exit with 1 for the supervisor to start the
//   server again; the crash test (tests/faults/crash-restart.test.ts) shows a restart loses no
//   acknowledged order.
import type { Logger } from 'pino';

export function guardProcess(logger: Logger): void {
  process.on('unhandledRejection', (reason) => {
    logger.error({ err: reason }, 'unhandled rejection; the process keeps serving');
  });
  process.on('uncaughtException', (err, origin) => {
    logger.fatal({ err, origin }, 'uncaught exception; the process exits for its supervisor to restart it');
    process.exit(1); // pino flushes its stdout stream on exit
  });
}
