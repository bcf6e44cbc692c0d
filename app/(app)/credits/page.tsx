import type { Metadata } from 'next';
import Link from 'next/link';
import { MEMO_KIND_LABELS } from '@/components/credits/labels';
import { MoneyFigure } from '@/components/credits/money-figure';
import { Badge } from '@/components/ui/badge';
import { ButtonLink } from '@/components/ui/button';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { requireRole } from '@/lib/auth/session';
import { CHARGEBACK_RULES } from '@/lib/credits';
import { formatDay } from '@/lib/format/dates';
import { dealerCredits } from '@/lib/services/dealer-credits';

export const metadata: Metadata = { title: 'Credits' };

export default async function DealerCreditsPage() {
  const user = await requireRole('dealer_admin');
  const brands = await dealerCredits(user);
  const any = brands.some((b) => b.memos.length > 0);
  return (
    <>
      <PageHeader title="Credits" lead={`What the brands owe ${user.orgName}, and what they charged back. Each memo lists its lines and how every amount was reached.`} />
      {!any ? (
        <EmptyState title="No credit memos yet">
          Each credit memo a brand issues for your claims will be listed here by brand, with its lines and any open chargeback, ready to download for your books.
        </EmptyState>
      ) : null}
      <div className="space-y-8">
        {brands.filter((b) => b.memos.length > 0).map((b) => (
          <section key={b.brandId} className="space-y-3" data-testid={`credits-${b.brandName}`}>
            <div className="flex flex-wrap items-end justify-between gap-3">
              <div>
                <h2>{b.brandName}</h2>
                <p className="text-sm text-ink-muted">
                  Account <span className="font-mono">{b.accountNumber}</span> · open, not yet on your statement: <MoneyFigure minor={b.openTotalMinor} currency={b.currency} strong />
                </p>
              </div>
              <ButtonLink href={`/api/credits/export?brand=${b.brandId}`} variant="secondary" prefetch={false}>Download CSV for your books</ButtonLink>
            </div>
            {b.openChargebacks.length ? (
              <div className="card border-fault-500/40 p-4">
                <h3 className="mb-2 font-bold text-fault-700">Open chargebacks</h3>
                <ul className="space-y-1 text-sm">
                  {b.openChargebacks.map(({ memo, line }) => (
                    <li key={memo.id + line.lineNo} className="flex flex-wrap justify-between gap-2">
                      <span>
                        <Link href={`/credits/memos/${memo.id}`} className="font-mono underline">{memo.number}</Link> · claim <span className="font-mono">{memo.claimNumber}</span> ·{' '}
                        {'reason' in line.basis ? CHARGEBACK_RULES[line.basis.reason].label : 'Chargeback'}
                        {'note' in line.basis && line.basis.note ? ` — “${line.basis.note}”` : ''}
                      </span>
                      <MoneyFigure minor={line.amountMinor} currency={memo.currency} strong />
                    </li>
                  ))}
                </ul>
              </div>
            ) : null}
            <div className="card overflow-x-auto">
              <table className="w-full text-left text-sm" data-testid="dealer-memos">
                <thead className="bg-paper-sunk text-xs uppercase tracking-wide text-ink-muted">
                  <tr>
                    <th className="px-3 py-2">Memo</th><th className="px-3 py-2">Kind</th><th className="px-3 py-2">Issued</th><th className="px-3 py-2">Claim</th>
                    <th className="px-3 py-2">RMA</th><th className="px-3 py-2 text-right">Total</th><th className="px-3 py-2">Status</th>
                  </tr>
                </thead>
                <tbody>
                  {b.memos.slice(0, 50).map((m) => (
                    <tr key={m.id} className="border-t border-paper-line">
                      <td className="px-3 py-2"><Link href={`/credits/memos/${m.id}`} className="font-mono font-bold text-charge-700 hover:underline">{m.number}</Link></td>
                      <td className="px-3 py-2">{MEMO_KIND_LABELS[m.kind]}{m.reversedByNumber ? <span className="block text-xs text-fault-700">reversed by {m.reversedByNumber}</span> : null}</td>
                      <td className="px-3 py-2">{formatDay(m.issuedOn)}</td>
                      <td className="px-3 py-2"><Link href={`/claims/${m.claimId}`} className="font-mono text-xs underline">{m.claimNumber}</Link></td>
                      <td className="px-3 py-2 font-mono text-xs">{m.rmaNumber ?? '—'}</td>
                      <td className="px-3 py-2 text-right"><MoneyFigure minor={m.totalMinor} currency={m.currency} strong /></td>
                      <td className="px-3 py-2">{m.reconciledAt ? <Badge tone="charge">On your statement</Badge> : <Badge>Open</Badge>}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
            {b.memos.length > 50 ? <p className="text-xs text-ink-muted">The latest 50 of {b.memos.length} memos; the CSV has them all.</p> : null}
          </section>
        ))}
      </div>
      <p className="mt-6 text-xs text-ink-muted">
        The CSV has one row per memo line in the layout LP-MEMO-LINES-1: memo number, kind and date, your account, claim and RMA numbers, each line’s
        kind, status, part or labor code, quantity or hours, unit amount, the amount computed and the amount posted, and the memo total. Amounts use a dot
        and the currency’s decimals; negative amounts are what you owe.
      </p>
    </>
  );
}
