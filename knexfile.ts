import type { Knex } from 'knex';
import { databaseUrl } from './lib/env';

const config: Knex.Config = {
  client: 'pg',
  connection: databaseUrl(),
  pool: { min: 0, max: 10 },
  migrations: { directory: './db/migrations', extension: 'ts', loadExtensions: ['.ts'] },
  seeds: { directory: './db/seeds', extension: 'ts', loadExtensions: ['.ts'] },
};

export default config;
