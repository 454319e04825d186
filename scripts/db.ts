// npm run db:migrate | db:seed | db:backup | db:restore — the database commands, with the same
// config as the server (DATABASE_URL: PostgreSQL, else DATABASE_FILE).
import path from 'node:path';
import { backupDatabase, backupFileName, checkBackup, restoreDatabase } from '@server/db/backup';
import { databaseTarget, loadConfig } from '@server/config';
import { createDb } from '@server/db/knex';
import { migrateAndSeed } from '@server/db/migrate';

const command = process.argv[2];
const config = loadConfig();

const target = databaseTarget(config);
// never print a postgres:// URL: it may hold a password
const where = config.databaseUrl ? 'the PostgreSQL database' : config.databaseFile;

if (command === 'backup') {
  const stamp = new Date().toISOString().replace(/[:.]/g, '-');
  const file = process.argv[3] ?? path.join(path.dirname(config.databaseFile), 'backups', backupFileName(target, stamp));
  await backupDatabase(target, file);
  console.log(`Backed up ${where} to ${file} (${(await checkBackup(file)).orders} orders)`);
  process.exit(0);
}
if (command === 'restore') {
  const source = process.argv[3];
  if (!source) {
    console.error('Name the backup: npm run db:restore -- <backup file>   (stop the server first)');
    process.exit(2);
  }
  await restoreDatabase(source, target);
  console.log(`Restored ${source} to ${where}; start the server again.`);
  process.exit(0);
}
// migrate (and seed) as its own step, under the migration lock (server/db/migrate.ts)
const db = createDb(target);
try {
  const { migrated, seeded } = await migrateAndSeed(db, { seedDemo: command === 'seed' });
  console.log(`Migrated ${where} (${migrated} new migration${migrated === 1 ? '' : 's'})`);
  if (seeded) console.log('Loaded the demo café.');
  else if (command === 'seed') console.log('The database already has a café; the demo seed only goes into an empty one.');
} finally {
  await db.destroy();
}
