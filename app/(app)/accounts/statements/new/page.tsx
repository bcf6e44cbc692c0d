import type { Metadata } from 'next';
import Link from 'next/link';
import { StatementImport } from '@/components/credits/statement-import';
import { PageHeader } from '@/components/ui/page-header';
import { requireRole } from '@/lib/auth/session';
import { brandDealerAccounts } from '@/lib/db/dealer-accounts';
import { brandSettings } from '@/lib/db/liability';
import { listSources } from '@/lib/db/statements';

export const metadata: Metadata = { title: 'Import a statement' };

export default async function NewStatementPage() {
  const user = await requireRole('accountant');
  const [sources, accounts, brand] = await Promise.all([listSources(user.organisationId), brandDealerAccounts(user.organisationId), brandSettings(user.organisationId)]);
  return (
    <>
      <p className="mb-2 text-sm text-ink-muted"><Link href="/accounts/statements" className="underline">Statements</Link></p>
      <PageHeader title="Import a statement" lead="A CSV of payments and credits from a dealer’s books or your accounting system. Every row is read before anything is stored." />
      <StatementImport sources={sources} dealers={accounts.map((a) => ({ id: a.dealerId, name: `${a.dealerName} (${a.accountNumber})` }))} currency={brand.currency} />
    </>
  );
}
