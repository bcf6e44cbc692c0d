import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { z } from 'zod';
import { ChooseMemoForm } from '@/components/credits/choose-memo-form';
import { MEMO_KIND_LABELS } from '@/components/credits/labels';
import { MatchActions } from '@/components/credits/match-actions';
import { MoneyFigure } from '@/components/credits/money-figure';
import { Badge } from '@/components/ui/badge';
import { PageHeader } from '@/components/ui/page-header';
import { requireRole } from '@/lib/auth/session';
import { NotFoundError } from '@/lib/errors';
import { formatDateTime, formatDay } from '@/lib/format/dates';
import { statementView, unmatchedWords } from '@/lib/services/reconciliation';

export const metadata: Metadata = { title: 'Statement' };

const FILTERS = [
  { key: 'all', label: 'All lines' },
  { key: 'proposed', label: 'To confirm' },
  { key: 'open', label: 'Not matched' },
  { key: 'confirmed', label: 'Matched' },
] as const;

const BASIS_WORDS: Record<string, string> = { reference: 'by reference', amount_date: 'same amount, within the date window', chosen: 'chosen by hand' };
const AMBIGUOUS_WORDS: Record<string, string> = {
  several_memos: 'fits several memos',
  memo_wanted_by_several_lines: 'another line wants the same memo',
};

export default async function StatementPage({ params, searchParams }: { params: Promise<{ id: string }>; searchParams: Promise<Record<string, string | undefined>> }) {
  const user = await requireRole('accountant');
  const { id } = await params;
  if (!z.uuid().safeParse(id).success) notFound();
  const sp = await searchParams;
  const filter = z.enum(['all', 'proposed', 'open', 'confirmed']).catch('all').parse(sp.show);
  const page = z.coerce.number().int().min(1).catch(1).parse(sp.page);
  const view = await statementView(user, id, filter, page).catch((e) => {
    if (e instanceof NotFoundError) notFound();
    throw e;
  });
  const imp = view.import;
  const pages = Math.max(1, Math.ceil(view.lines.total / view.pageSize));
  const href = (over: Record<string, string | number>) => `/accounts/statements/${imp.id}?${new URLSearchParams({ show: filter, page: String(page), ...Object.fromEntries(Object.entries(over).map(([k, v]) => [k, String(v)])) })}`;

  return (
    <>
      <p className="mb-2 text-sm text-ink-muted"><Link href="/accounts/statements" className="underline">Statements</Link></p>
      <PageHeader
        title={imp.fileName}
        lead={`${imp.sourceName} · ${imp.dealerName ?? 'several dealers'} · ${imp.lineCount} line${imp.lineCount === 1 ? '' : 's'} · imported ${formatDateTime(imp.importedAt, user.timeZone)} by ${imp.importedByName} · amount matches within ±${imp.dateWindowDays} days`}
      />
      <div className="mb-4 flex flex-wrap items-center gap-2">
        <Badge tone="charge">{imp.confirmed} matched</Badge>
        <Badge tone="volt">{imp.proposed} to confirm</Badge>
        <span className="ml-auto flex gap-1" role="group" aria-label="Show">
          {FILTERS.map((f) => (
            <Link key={f.key} href={href({ show: f.key, page: 1 })} aria-current={filter === f.key ? 'true' : undefined}
              className={`rounded-full border px-3 py-1 text-sm ${filter === f.key ? 'border-ink bg-ink text-paper' : 'border-paper-line bg-paper-raised hover:bg-paper-sunk'}`}>
              {f.label}
            </Link>
          ))}
        </span>
      </div>

      <div className="card overflow-x-auto">
        <table className="w-full text-left text-sm" data-testid="statement-lines">
          <thead className="bg-paper-sunk text-xs uppercase tracking-wide text-ink-muted">
            <tr>
              <th className="px-3 py-2">Row</th>
              <th className="px-3 py-2">Date</th>
              <th className="px-3 py-2">Reference</th>
              <th className="px-3 py-2 text-right">Amount</th>
              <th className="px-3 py-2">Memo</th>
              <th className="px-3 py-2">What to do</th>
            </tr>
          </thead>
          <tbody>
            {view.lines.rows.map((l) => (
              <tr key={l.id} className="border-t border-paper-line align-top" data-testid={`statement-line-${l.lineNo}`}>
                <td className="px-3 py-2 figure">{l.lineNo}</td>
                <td className="px-3 py-2 whitespace-nowrap">{formatDay(l.date)}</td>
                <td className="px-3 py-2">{l.reference ?? <span className="text-ink-muted">—</span>}{l.dealerName && !imp.dealerId ? <span className="block text-xs text-ink-muted">{l.dealerName}</span> : null}</td>
                <td className="px-3 py-2 text-right"><MoneyFigure minor={l.amountMinor} currency={l.currency} /></td>
                <td className="px-3 py-2">
                  {l.match ? (
                    <>
                      <Link href={`/accounts/claims/${l.match.claimId}`} className="font-mono font-bold text-charge-700 underline">{l.match.memoNumber}</Link>
                      <span className="block text-xs text-ink-muted">
                        claim {l.match.claimNumber} · <MoneyFigure minor={l.match.memoTotalMinor} currency={l.currency} /> · {BASIS_WORDS[l.match.basis]}
                      </span>
                      {l.match.amountDifferenceMinor !== 0 ? (
                        <span className="block text-xs text-volt-700">The line differs from the memo by <MoneyFigure minor={l.match.amountDifferenceMinor} currency={l.currency} /></span>
                      ) : null}
                    </>
                  ) : l.outcome.type === 'ambiguous' ? (
                    <span className="text-sm text-volt-700">{AMBIGUOUS_WORDS[l.outcome.reason] ?? l.outcome.reason}: {l.outcome.candidateCount} candidate{l.outcome.candidateCount === 1 ? '' : 's'}</span>
                  ) : (
                    <span className="text-sm text-ink-muted">
                      {l.rejected.length ? `You rejected ${l.rejected.join(', ')}.` : l.outcome.type === 'unmatched' ? `Not matched: ${unmatchedWords(l.outcome.reason)}.` : 'Not matched.'}
                    </span>
                  )}
                </td>
                <td className="px-3 py-2">
                  {l.match?.status === 'confirmed' ? (
                    <Badge tone="charge">Matched{l.match.decidedByName ? ` by ${l.match.decidedByName}` : ''}</Badge>
                  ) : l.match?.status === 'proposed' ? (
                    <MatchActions matchId={l.match.id} memoNumber={l.match.memoNumber} />
                  ) : (
                    <ChooseMemoForm lineId={l.id} candidates={l.outcome.type === 'ambiguous' ? l.outcome.candidates.map((c) => c.memoNumber).filter((n) => !l.rejected.includes(n)) : []} />
                  )}
                </td>
              </tr>
            ))}
            {view.lines.rows.length === 0 ? <tr><td colSpan={6} className="px-3 py-8 text-center text-ink-muted">No line to show.</td></tr> : null}
          </tbody>
        </table>
      </div>
      <div className="mt-3 flex justify-end gap-3 text-sm text-ink-muted">
        {page > 1 ? <Link href={href({ page: page - 1 })} className="underline">Previous</Link> : null}
        Page {page} of {pages}
        {page < pages ? <Link href={href({ page: page + 1 })} className="underline">Next</Link> : null}
      </div>

      <section className="mt-8">
        <h2 className="mb-1">Memos not on any statement{imp.dealerName ? ` — ${imp.dealerName}` : ''}</h2>
        <p className="mb-3 text-sm text-ink-muted">
          Issued memos with no match waiting or confirmed, oldest first: {view.memos.total}
          {view.memos.total > view.memos.rows.length ? `, the first ${view.memos.rows.length} shown; all are on the Memos page under “Open”` : ''}.
        </p>
        <div className="card overflow-x-auto">
          <table className="w-full text-left text-sm" data-testid="unmatched-memos">
            <thead className="bg-paper-sunk text-xs uppercase tracking-wide text-ink-muted">
              <tr><th className="px-3 py-2">Memo</th><th className="px-3 py-2">Kind</th><th className="px-3 py-2">Issued</th><th className="px-3 py-2">Dealer</th><th className="px-3 py-2">Claim</th><th className="px-3 py-2 text-right">Total</th></tr>
            </thead>
            <tbody>
              {view.memos.rows.map((m) => (
                <tr key={m.id} className="border-t border-paper-line">
                  <td className="px-3 py-2 font-mono"><Link href={`/accounts/memos/${m.id}`} className="underline">{m.number}</Link></td>
                  <td className="px-3 py-2">{MEMO_KIND_LABELS[m.kind as keyof typeof MEMO_KIND_LABELS] ?? m.kind}</td>
                  <td className="px-3 py-2">{formatDay(m.issuedOn)}</td>
                  <td className="px-3 py-2">{m.dealerName}</td>
                  <td className="px-3 py-2 font-mono text-xs">{m.claimNumber}</td>
                  <td className="px-3 py-2 text-right"><MoneyFigure minor={m.totalMinor} currency={m.currency} /></td>
                </tr>
              ))}
              {view.memos.rows.length === 0 ? <tr><td colSpan={6} className="px-3 py-6 text-center text-ink-muted">Every memo is on a statement.</td></tr> : null}
            </tbody>
          </table>
        </div>
      </section>
    </>
  );
}
