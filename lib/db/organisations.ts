import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/connection';

export async function organisationTimeZone(id: string, q: Knex = db()): Promise<string> {
  const row = await q('organisations').where({ id }).first('time_zone');
  return (row?.time_zone as string | undefined) ?? 'UTC';
}
