import type { Metadata } from 'next';
import { ReviewQueueTable } from '@/components/review/review-queue-table';
import { PageHeader } from '@/components/ui/page-header';
import { requireRole } from '@/lib/auth/session';
import { PART_CATEGORIES, PART_CATEGORY_LABELS } from '@/lib/coverage';
import { brandDealerAccounts } from '@/lib/db/dealer-accounts';
import { brandCalendar } from '@/lib/db/review';
import { reviewRuleText } from '@/lib/review';

export const metadata: Metadata = { title: 'Review queue' };

export default async function ReviewPage() {
  const user = await requireRole('brand_rep');
  const [accounts, cal] = await Promise.all([brandDealerAccounts(user.organisationId), brandCalendar(user.organisationId)]);
  const dealers = accounts.map((a) => ({ value: a.dealerId, label: `${a.dealerName} (${a.accountNumber})` }));
  const categories = PART_CATEGORIES.map((c) => ({ value: c, label: PART_CATEGORY_LABELS[c].replace(/^./, (m) => m.toUpperCase()) }));
  return (
    <>
      <PageHeader
        title="Review queue"
        lead={`Claims filed against ${user.orgName}, the nearest deadline first. Take a claim to review it; ask for more, approve or deny.`}
      />
      <ReviewQueueTable dealers={dealers} categories={categories} />
      <p className="mt-4 max-w-3xl text-xs text-ink-muted" data-testid="deadline-rule">
        {reviewRuleText({ holidays: cal.holidays })} Times are in the brand’s time zone ({cal.timeZone}).
      </p>
    </>
  );
}
