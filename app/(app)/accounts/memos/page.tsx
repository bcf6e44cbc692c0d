import type { Metadata } from 'next';
import Link from 'next/link';
import { MEMO_KIND_LABELS } from '@/components/credits/labels';
import { MoneyFigure } from '@/components/credits/money-figure';
import { Badge } from '@/components/ui/badge';
import { ButtonLink } from '@/components/ui/button';
import { PageHeader } from '@/components/ui/page-header';
import { requireRole } from '@/lib/auth/session';
import { listMemos } from '@/lib/db/credit-memos';
import { formatDay } from '@/lib/format/dates';
import { z } from 'zod';

export const metadata: Metadata = { title: 'Credit memos' };

const querySchema = z.object({
  page: z.coerce.number().int().min(1).catch(1),
  status: z.enum(['open', 'reconciled']).optional().catch(undefined),
  kind: z.enum(['claim', 'chargeback', 'reversal']).optional().catch(undefined),
  q: z.string().trim().max(60).optional().catch(undefined),
  from: z.iso.date().optional().catch(undefined),
  to: z.iso.date().optional().catch(undefined),
});

export default async function MemosPage({ searchParams }: { searchParams: Promise<Record<string, string | undefined>> }) {
  const user = await requireRole('accountant');
  const query = querySchema.parse(await searchParams);
  const pageSize = 50;
  const { rows, total } = await listMemos(user, { ...query, pageSize });
  const pages = Math.max(1, Math.ceil(total / pageSize));
  const href = (over: Record<string, string | number | undefined>) => {
    const p = new URLSearchParams();
    for (const [k, v] of Object.entries({ ...query, ...over })) if (v !== undefined && v !== '') p.set(k, String(v));
    return `/accounts/memos?${p}`;
  };
  const exportHref = `/api/accounts/memos/export?${new URLSearchParams(Object.entries({ from: query.from, to: query.to }).filter(([, v]) => v) as [string, string][])}`;
  const filters = [
    { label: 'All', status: undefined },
    { label: 'Open', status: 'open' },
    { label: 'Matched to a statement', status: 'reconciled' },
  ];

  return (
    <>
      <PageHeader
        title="Credit memos"
        lead="Every memo issued: credits, chargebacks and reversals. An issued memo is never changed; a correction is a memo that reverses it."
        actions={<ButtonLink href={exportHref} variant="secondary" prefetch={false}>Download CSV for the accounting system</ButtonLink>}
      />
      <form className="mb-4 flex flex-wrap items-end gap-3" action="/accounts/memos">
        <div className="flex gap-1" role="group" aria-label="Filter by status">
          {filters.map((f) => (
            <Link key={f.label} href={href({ status: f.status, page: 1 })} aria-current={query.status === f.status ? 'true' : undefined}
              className={`rounded-full border px-3 py-1 text-sm ${query.status === f.status ? 'border-ink bg-ink text-paper' : 'border-paper-line bg-paper-raised hover:bg-paper-sunk'}`}>
              {f.label}
            </Link>
          ))}
        </div>
        {query.status ? <input type="hidden" name="status" value={query.status} /> : null}
        <label className="text-sm">
          <span className="field-label">Issued from</span>
          <input type="date" name="from" defaultValue={query.from} className="field-input" />
        </label>
        <label className="text-sm">
          <span className="field-label">to</span>
          <input type="date" name="to" defaultValue={query.to} className="field-input" />
        </label>
        <label className="text-sm">
          <span className="field-label">Memo, claim or RMA</span>
          <input type="search" name="q" defaultValue={query.q} className="field-input" />
        </label>
        <button type="submit" className="rounded-md border border-paper-line bg-paper-raised px-4 py-2 text-sm font-bold hover:bg-paper-sunk">Show</button>
      </form>
      <div className="card overflow-x-auto">
        <table className="w-full text-left text-sm" data-testid="memos-table">
          <thead className="bg-paper-sunk text-xs uppercase tracking-wide text-ink-muted">
            <tr>
              <th className="px-3 py-2">Memo</th>
              <th className="px-3 py-2">Kind</th>
              <th className="px-3 py-2">Issued</th>
              <th className="px-3 py-2">Dealer</th>
              <th className="px-3 py-2">Claim</th>
              <th className="px-3 py-2 text-right">Total</th>
              <th className="px-3 py-2">Statement</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((m) => (
              <tr key={m.id} className="border-t border-paper-line">
                <td className="px-3 py-2"><Link href={`/accounts/memos/${m.id}`} className="font-mono font-bold text-charge-700 hover:underline">{m.number}</Link></td>
                <td className="px-3 py-2">{MEMO_KIND_LABELS[m.kind]}{m.reversedByNumber ? <span className="block text-xs text-fault-700">reversed by {m.reversedByNumber}</span> : null}</td>
                <td className="px-3 py-2">{formatDay(m.issuedOn)}</td>
                <td className="px-3 py-2">{m.dealerName} <span className="block font-mono text-xs text-ink-muted">{m.dealerAccountNumber}</span></td>
                <td className="px-3 py-2"><Link href={`/accounts/claims/${m.claimId}`} className="font-mono text-xs underline">{m.claimNumber}</Link></td>
                <td className="px-3 py-2 text-right"><MoneyFigure minor={m.totalMinor} currency={m.currency} strong /></td>
                <td className="px-3 py-2">{m.reconciledAt ? <Badge tone="charge">Matched</Badge> : m.proposed ? <Badge tone="volt">To confirm</Badge> : <Badge>Open</Badge>}</td>
              </tr>
            ))}
            {rows.length === 0 ? (
              <tr><td colSpan={7} className="px-3 py-8 text-center text-ink-muted">No memo matches.</td></tr>
            ) : null}
          </tbody>
        </table>
      </div>
      <div className="mt-3 flex items-center justify-between text-sm text-ink-muted">
        <span>{total} memo{total === 1 ? '' : 's'}</span>
        <span className="flex gap-3">
          {query.page > 1 ? <Link href={href({ page: query.page - 1 })} className="underline">Previous</Link> : null}
          Page {query.page} of {pages}
          {query.page < pages ? <Link href={href({ page: query.page + 1 })} className="underline">Next</Link> : null}
        </span>
      </div>
      <p className="mt-4 text-xs text-ink-muted">
        The CSV has one row per memo line in our layout LP-MEMO-LINES-1 (UTF-8, RFC 4180): memo number, kind and date, the memo it reverses,
        dealer and account, claim and RMA numbers, currency, each line’s kind, status, chargeback reason, part, labor code, quantity or hours,
        unit amount, computed and posted amounts, the adjustment reason and the memo total. Amounts have a dot and the currency’s decimals. It takes
        the dates above, or everything when none are set.
      </p>
    </>
  );
}
