import knexFactory, { type Knex } from 'knex';
import pg from 'pg';
import config from '../knexfile';

// Calendar dates stay 'YYYY-MM-DD' strings: a JS Date would shift them by the server's zone.
pg.types.setTypeParser(1082, (v) => v);
// bigint columns hold money in minor units and counts; refuse silently losing precision.
pg.types.setTypeParser(20, (v) => {
  const n = Number(v);
  if (!Number.isSafeInteger(n)) throw new Error(`bigint ${v} exceeds the safe integer range`);
  return n;
});

const globalForDb = globalThis as unknown as { loadproofDb?: Knex };

export function db(): Knex {
  globalForDb.loadproofDb ??= knexFactory(config);
  return globalForDb.loadproofDb;
}

export async function closeDb(): Promise<void> {
  if (globalForDb.loadproofDb) {
    await globalForDb.loadproofDb.destroy();
    globalForDb.loadproofDb = undefined;
  }
}
