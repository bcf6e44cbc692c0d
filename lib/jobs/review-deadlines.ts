import 'server-only';
import { db } from '@/db/connection';
import { addBusinessDays, DEFAULT_DUE_SOON_WITHIN, localDate, weekdayName, isoWeekday } from '@/lib/calendar';
import { findClaimById } from '@/lib/db/claims';
import { brandCalendar, brandsWithOpenReviews, claimsNeedingReminder, recordReminder } from '@/lib/db/review';
import { notifyBrandRole } from '@/lib/services/claim-notify';

const RUNNING = new Set(['submitted', 'in_review', 'appealed']);
type Threshold = 'due_soon' | 'overdue';

const day = (d: string) => `${weekdayName(isoWeekday(d))} ${d}`;

/**
 * Tells the brand's reps (the assigned rep, or every rep while nobody has the claim) when a review
 * deadline is near (at most DEFAULT_DUE_SOON_WITHIN business days left) and when it has passed.
 * Once per claim, threshold and deadline: the reminder row and the notification are written in one
 * transaction, and the row's key refuses a second one, however many workers run.
 */
export async function remindReviewDeadlines(now = new Date()): Promise<{ dueSoon: number; overdue: number }> {
  const sent = { dueSoon: 0, overdue: 0 };
  for (const brandId of await brandsWithOpenReviews()) {
    const cal = await brandCalendar(brandId);
    const calendar = { holidays: cal.holidays };
    const today = localDate(now.toISOString(), cal.timeZone);
    const until = addBusinessDays(today, DEFAULT_DUE_SOON_WITHIN, calendar);
    const overdue = await claimsNeedingReminder(brandId, 'overdue', { until: today, before: true });
    const soon = await claimsNeedingReminder(brandId, 'due_soon', { from: today, until });
    for (const [threshold, list] of [['overdue', overdue], ['due_soon', soon]] as [Threshold, typeof soon][]) {
      for (const candidate of list) {
        const done = await db().transaction(async (trx) => {
          const claim = await findClaimById(candidate.id, trx, true);
          // The claim may have moved since it was listed: only its current deadline is reminded.
          if (!claim || !RUNNING.has(claim.stage) || claim.reviewDueOn !== candidate.reviewDueOn) return false;
          if (!(await recordReminder(trx, claim.id, threshold, candidate.reviewDueOn))) return false;
          await notifyBrandRole(trx, claim, 'brand_rep', {
            kind: threshold === 'overdue' ? 'review_overdue' : 'review_due_soon',
            title: threshold === 'overdue'
              ? `Claim ${claim.number} is past its review deadline (${day(candidate.reviewDueOn)})`
              : `Claim ${claim.number}: decide by ${day(candidate.reviewDueOn)}`,
            body: threshold === 'overdue'
              ? `${claim.dealerName} is waiting for a decision; the review deadline passed on ${day(candidate.reviewDueOn)}.`
              : `${claim.dealerName}’s claim is due for a decision by ${day(candidate.reviewDueOn)}. Decide it, or ask the dealer for what is missing.`,
            onlyAssigned: true,
          });
          return true;
        });
        if (done) sent[threshold === 'overdue' ? 'overdue' : 'dueSoon'] += 1;
      }
    }
  }
  return sent;
}
