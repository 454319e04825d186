// npm run db:migrate | db:seed — the database commands, with the same config as the server.
import { loadConfig } from '../server/config';
import { createDb, migrate } from '../server/db/knex';
import { isEmpty, seedDemoCafe } from '../seeds/demo-cafe';

const command = process.argv[2];
const config = loadConfig();
const db = createDb(config.databaseFile);
try {
  await migrate(db);
  console.log(`Migrated ${config.databaseFile}`);
  if (command === 'seed') {
    if (await isEmpty(db)) {
      await seedDemoCafe(db);
      console.log('Loaded the demo café.');
    } else console.log('The database already has a café; the demo seed only goes into an empty one.');
  }
} finally {
  await db.destroy();
}
