// npm run db:migrate | db:seed — the database commands, with the same config as the server.
import path from 'node:path';
import { loadConfig } from '../server/config';
import { backupDatabase, checkBackup, restoreDatabase } from '../server/db/backup';
import { createDb, migrate } from '../server/db/knex';
import { isEmpty, seedDemoCafe } from '../seeds/demo-cafe';

const command = process.argv[2];
const config = loadConfig();

if (command === 'backup') {
  const stamp = new Date().toISOString().replace(/[:.]/g, '-');
  const target = process.argv[3] ?? path.join(path.dirname(config.databaseFile), 'backups', `jugline-${stamp}.sqlite`);
  await backupDatabase(config.databaseFile, target);
  console.log(`Backed up ${config.databaseFile} to ${target} (${checkBackup(target).orders} orders)`);
  process.exit(0);
}
if (command === 'restore') {
  const source = process.argv[3];
  if (!source) {
    console.error('Name the backup: npm run db:restore -- <backup file>   (stop the server first)');
    process.exit(2);
  }
  restoreDatabase(source, config.databaseFile);
  console.log(`Restored ${source} to ${config.databaseFile}; start the server again.`);
  process.exit(0);
}
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
