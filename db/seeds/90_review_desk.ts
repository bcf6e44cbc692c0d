import type { Knex } from 'knex';
import { findClaimById } from '@/lib/db/claims';
import { findActiveUser } from '@/lib/db/users';
import { reviewColumnsOnSubmit } from '@/lib/services/review-clock';
import { requestInfo, takeClaim } from '@/lib/services/review';

// The reps' desk in the demo: every open claim carries its review clock, and two of
// Wrenfield's claims are already being worked — one in review, one waiting on the dealer —
// moved by the same services a rep's clicks use. Runs with the react-server condition
// (scripts/migrate.ts), so server modules load outside Next.js.
const CLOCK_STAGES = ['submitted', 'in_review', 'waiting_on_dealer', 'appealed'];

/** Runs outside the loader's wrapping transaction: the services take their own, row by row. */
export async function seed(knex: Knex): Promise<number> {
  let added = 0;
  // Claims the demo drove through the machine directly get the clock a submission starts.
  const unclocked = await knex('claims').whereIn('stage', CLOCK_STAGES).whereNull('review_started_at').whereNotNull('submitted_at').select('id', 'submitted_at');
  for (const row of unclocked) {
    const claim = await findClaimById(row.id, knex);
    if (!claim) continue;
    const cols = await reviewColumnsOnSubmit(knex, claim);
    await knex('claims').where({ id: row.id }).update({ review_started_at: row.submitted_at, review_due_on: cols.review_due_on });
    added++;
  }

  const rep = await knex('users').where({ email: 'ines.costa@wrenfield.test' }).first('id');
  const ines = rep && (await findActiveUser(rep.id));
  if (!ines) return added;
  const untouched = async (partSerial: string) => {
    const c = await knex('claims').where({ brand_id: ines.organisationId, part_serial: partSerial, stage: 'submitted' }).first('id', 'version');
    if (!c) return null;
    const taken = await knex('claim_events').where({ claim_id: c.id, event: 'TAKE' }).first('id');
    return taken ? null : (c as { id: string; version: number });
  };

  const inReview = await untouched('HM500-25-4822');
  if (inReview) {
    await takeClaim(ines, inReview.id, inReview.version);
    added++;
  }
  const waiting = await untouched('B4814-24-2291');
  if (waiting) {
    const taken = await takeClaim(ines, waiting.id, waiting.version);
    await requestInfo(
      ines,
      waiting.id,
      {
        items: [
          { key: 'photos', detail: 'the battery’s charge port and the contacts on the mount' },
          { key: 'load_test', detail: 'a full capacity discharge from 100 %, not a partial one' },
        ],
        message: 'The discharge you sent stops at 40 % charge, so the capacity cannot be read from it. Please run a full discharge after a full charge and add the two photos.',
      },
      taken.version,
    );
    added += 2;
  }
  return added;
}
