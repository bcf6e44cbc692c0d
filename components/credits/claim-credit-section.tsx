import Link from 'next/link';
import { Badge } from '@/components/ui/badge';
import { ButtonLink } from '@/components/ui/button';
import type { Role } from '@/lib/auth/roles';
import { memosOfClaim } from '@/lib/db/credit-memos';
import { formatDay } from '@/lib/format/dates';
import { MEMO_KIND_LABELS } from './labels';
import { MoneyFigure } from './money-figure';

/** The claim page's view of its money: the memos issued for it, or where the credit stands. */
export async function ClaimCreditSection({ claimId, stage, role }: { claimId: string; stage: string; role: Role }) {
  const memos = await memosOfClaim(claimId);
  if (memos.length === 0 && stage !== 'credit_pending') return null;
  const memoHref = (id: string) => (role === 'accountant' ? `/accounts/memos/${id}` : role === 'dealer_admin' ? `/credits/memos/${id}` : null);
  return (
    <section className="card p-5" data-testid="claim-credit">
      <div className="mb-3 flex items-center justify-between gap-2">
        <h2>Credit</h2>
        {role === 'accountant' ? <ButtonLink href={`/accounts/claims/${claimId}`} variant="secondary">Open in Accounts</ButtonLink> : null}
      </div>
      {memos.length === 0 ? (
        <p className="text-sm text-ink-muted">Both tracks are done; the brand’s accountant issues the credit memo next.</p>
      ) : (
        <ul className="space-y-2 text-sm">
          {memos.map((m) => {
            const href = memoHref(m.id);
            return (
              <li key={m.id} className="flex flex-wrap items-baseline justify-between gap-2">
                <span>
                  {MEMO_KIND_LABELS[m.kind]} {href ? <Link href={href} className="font-mono font-bold underline">{m.number}</Link> : <span className="font-mono font-bold">{m.number}</span>}
                  <span className="block text-xs text-ink-muted">
                    {formatDay(m.issuedOn)}
                    {m.reversedByNumber ? ` · reversed by ${m.reversedByNumber}` : ''}
                  </span>
                </span>
                <span className="text-right">
                  <MoneyFigure minor={m.totalMinor} currency={m.currency} strong />
                  <span className="block">{m.reconciledAt ? <Badge tone="charge">Matched to the statement</Badge> : <Badge>Open</Badge>}</span>
                </span>
              </li>
            );
          })}
        </ul>
      )}
    </section>
  );
}
