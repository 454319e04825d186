// server/db/tables.ts is the schema the migrations build, table for table: a migration that adds,
// drops or retypes a column fails here until `npm run db:types` is run again.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { TABLES_FILE, tableTypes } from '@scripts/table-types';

describe('the generated table row types', () => {
  it('match the migrated schema', async () => {
    expect(readFileSync(TABLES_FILE, 'utf8')).toBe(await tableTypes());
  });
});
