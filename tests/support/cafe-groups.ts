// A café outside the demo group: its own group, so no owner of the demo group reaches it.
import type { Knex } from 'knex';

export async function groupOfItsOwn(db: Knex, name: string, createdAt: string): Promise<number> {
  const [{ id }] = await db('cafe_groups').insert({ name, created_at: createdAt }).returning('id');
  return id as number;
}
