/**
 * Helper of claims-list.ts (run by it, with the react-server condition): prints, as JSON, the
 * exact SQL and bindings that lib/db/claim-list.ts sends for each benchmarked list query, so the
 * bare pg server runs the very same statements as the route.
 */
import { closeDb, db } from '@/db/connection';
import { listClaims } from '@/lib/db/claim-list';
import type { AppUser } from '@/lib/db/users';
import { claimListQuerySchema } from '@/lib/validation/claims';
import { SHAPES } from './claims-list-shapes';

async function main() {
  const email = process.argv[2] ?? 'lena.hartmann@kettenblatt.test';
  const u = await db()('users as u').join('organisations as o', 'o.id', 'u.organisation_id').whereRaw('lower(u.email) = lower(?)', [email])
    .first('u.id', 'u.email', 'u.name', 'u.role', 'u.organisation_id as organisationId', 'u.org_kind as orgKind', 'o.name as orgName', 'u.units', 'u.time_zone as timeZone');
  if (!u) throw new Error(`no user ${email}`);
  const captured: { sql: string; bindings: unknown[] }[] = [];
  db().on('query', (q: { sql: string; bindings: unknown[] }) => captured.push({ sql: q.sql, bindings: q.bindings }));
  const out = [];
  for (const shape of SHAPES) {
    captured.length = 0;
    await listClaims(u as AppUser, claimListQuerySchema.parse(Object.fromEntries(new URLSearchParams(shape.query))));
    out.push({ ...shape, queries: [...captured] });
  }
  process.stdout.write(JSON.stringify(out));
}

main()
  .then(() => closeDb())
  .catch(async (e) => {
    console.error(e);
    await closeDb();
    process.exit(1);
  });
