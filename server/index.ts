// `npm run dev` and `npm start` land here.
import { checkServeSettings, ConfigError, loadConfig } from './config';
import { demoPasswordStillSet } from '@seeds/demo-cafe';
import { DatabaseBehindError } from './db/migrate';
import { guardProcess } from './process-guard';
import { appLogger, printSignIns, startServer } from './server';

async function main() {
  let config;
  try {
    config = loadConfig();
    checkServeSettings();
  } catch (err) {
    if (err instanceof ConfigError) {
      console.error(err.message);
      process.exit(78); // EX_CONFIG
    }
    throw err;
  }
  const logger = appLogger(config);
  guardProcess(logger);
  let running;
  try {
    running = await startServer(config, { logger });
  } catch (err) {
    if (err instanceof DatabaseBehindError) {
      console.error(err.message);
      process.exit(78); // EX_CONFIG: the operator runs the migration step
    }
    throw err;
  }
  if (await demoPasswordStillSet(running.db)) printSignIns(running.url);
  else console.log(`Jugline is serving at ${running.url}`);

  const stop = (signal: string) => {
    console.log(`${signal}: finishing requests and closing…`);
    running.close().then(
      () => process.exit(0),
      (err) => {
        console.error(err);
        process.exit(1);
      },
    );
  };
  process.once('SIGTERM', () => stop('SIGTERM'));
  process.once('SIGINT', () => stop('SIGINT'));
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
