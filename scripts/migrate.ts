// Runs the Knex migrations, then loads the demo scenario (idempotent: a second run adds
// nothing that is already there). The test database gets the same scenario.
// Run it as `tsx --conditions=react-server scripts/migrate.ts`: demo sections call the app's own
// services, whose `server-only` guard only loads under that condition.
import { closeDb, db } from '../db/connection';
import { loadDemo } from '../db/seeds/demo';

async function main() {
  const [batch, applied] = await db().migrate.latest();
  console.log(applied.length ? `applied ${applied.length} migration(s) in batch ${batch}` : 'database schema is up to date');
  const added = await loadDemo(db());
  console.log(added ? `demo scenario loaded (${added} rows added)` : 'demo scenario already present; kept as it is');
}

main()
  .then(() => closeDb())
  .catch(async (err) => {
    console.error(err);
    await closeDb();
    process.exit(1);
  });
