import type { Metadata } from 'next';
import Link from 'next/link';
import { ButtonLink } from '@/components/ui/button';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { requireRole } from '@/lib/auth/session';
import { listImports } from '@/lib/db/statements';
import { formatDateTime } from '@/lib/format/dates';

export const metadata: Metadata = { title: 'Statements' };

export default async function StatementsPage() {
  const user = await requireRole('accountant');
  const imports = await listImports(user.organisationId);
  const action = <ButtonLink href="/accounts/statements/new">Import a statement</ButtonLink>;
  return (
    <>
      <PageHeader
        title="Statements"
        lead="Dealer statements and exports from the accounting system, matched to the credit memos they pay. You confirm each match; a confirmed match reconciles the claim."
        actions={action}
      />
      {imports.length === 0 ? (
        <EmptyState title="No statement imported yet" action={action}>
          Import a CSV from a dealer’s books or from your accounting system. Choose which column is the date, the reference and the amount once;
          the choice is remembered for that source.
        </EmptyState>
      ) : (
        <div className="card overflow-x-auto">
          <table className="w-full text-left text-sm" data-testid="statements-table">
            <thead className="bg-paper-sunk text-xs uppercase tracking-wide text-ink-muted">
              <tr>
                <th className="px-3 py-2">File</th>
                <th className="px-3 py-2">Source</th>
                <th className="px-3 py-2">Dealer</th>
                <th className="px-3 py-2 text-right">Lines</th>
                <th className="px-3 py-2 text-right">Matched</th>
                <th className="px-3 py-2 text-right">To confirm</th>
                <th className="px-3 py-2">Imported</th>
              </tr>
            </thead>
            <tbody>
              {imports.map((i) => (
                <tr key={i.id} className="border-t border-paper-line">
                  <td className="px-3 py-2"><Link href={`/accounts/statements/${i.id}`} className="font-bold text-charge-700 hover:underline">{i.fileName}</Link></td>
                  <td className="px-3 py-2">{i.sourceName}</td>
                  <td className="px-3 py-2">{i.dealerName ?? 'several'}</td>
                  <td className="px-3 py-2 text-right figure">{i.lineCount}</td>
                  <td className="px-3 py-2 text-right figure">{i.confirmed}</td>
                  <td className="px-3 py-2 text-right figure">{i.proposed}</td>
                  <td className="px-3 py-2">{formatDateTime(i.importedAt, user.timeZone)} · {i.importedByName}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
