import type { Metadata } from 'next';
import { CreditQueueTable } from '@/components/credits/credit-queue-table';
import { ButtonLink } from '@/components/ui/button';
import { PageHeader } from '@/components/ui/page-header';
import { requireRole } from '@/lib/auth/session';
import { ROUNDING_RULE } from '@/lib/money';

export const metadata: Metadata = { title: 'Credits to issue' };

export default async function AccountsPage() {
  const user = await requireRole('accountant');
  return (
    <>
      <PageHeader
        title="Credits to issue"
        lead={`Claims against ${user.orgName} whose replacement is proven and whose core is dealt with. Open one to check each line and its basis, adjust a line with a reason, and issue the memo.`}
        actions={<ButtonLink href="/accounts/statements/new" variant="secondary">Import a statement</ButtonLink>}
      />
      <CreditQueueTable />
      <p className="mt-4 text-xs text-ink-muted">
        Amounts are computed exactly and rounded once per line, {ROUNDING_RULE}; a memo’s total is the sum of its rounded lines.
      </p>
    </>
  );
}
