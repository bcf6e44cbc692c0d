import Link from 'next/link';
import { Badge } from '@/components/ui/badge';
import type { StoredMemo } from '@/lib/db/credit-memos';
import { formatDay } from '@/lib/format/dates';
import { ROUNDING_RULE } from '@/lib/money';
import { CreditLinesTable } from './credit-lines-table';
import { MEMO_KIND_LABELS } from './labels';

/** An issued memo as a document: who, what for, every line with its basis, the total. */
export function MemoDocument({ memo, claimHref, memoHref }: { memo: StoredMemo; claimHref?: string; memoHref?: (id: string) => string }) {
  return (
    <article className="card p-6 print:border-0 print:shadow-none" data-testid="memo-document">
      <header className="flex flex-wrap items-start justify-between gap-4 border-b border-paper-line pb-4">
        <div>
          <p className="text-xs font-bold uppercase tracking-wide text-ink-muted">{memo.brandName}</p>
          <h2 className="text-xl">
            {MEMO_KIND_LABELS[memo.kind]} <span className="font-mono" data-testid="memo-number">{memo.number}</span>
          </h2>
          <p className="mt-1 text-sm text-ink-soft">Issued {formatDay(memo.issuedOn)}{memo.issuedByName ? ` by ${memo.issuedByName}` : ''}</p>
        </div>
        <div className="text-right text-sm">
          {memo.reconciledAt ? (
            <Badge tone="charge">Matched to statement {formatDay(memo.reconciledAt.slice(0, 10))}</Badge>
          ) : memo.proposed ? (
            <Badge tone="volt">Match waiting for confirmation</Badge>
          ) : (
            <Badge tone="neutral">Open</Badge>
          )}
          {memo.reversedByNumber ? (
            <p className="mt-1 text-fault-700">
              Reversed by{' '}
              {memoHref && memo.reversedByMemoId ? <Link className="font-mono underline" href={memoHref(memo.reversedByMemoId)}>{memo.reversedByNumber}</Link> : <span className="font-mono">{memo.reversedByNumber}</span>}
            </p>
          ) : null}
        </div>
      </header>
      <dl className="grid gap-x-6 gap-y-2 py-4 text-sm sm:grid-cols-4">
        <div>
          <dt className="text-xs font-bold uppercase tracking-wide text-ink-muted">Dealer</dt>
          <dd>{memo.dealerName}</dd>
        </div>
        <div>
          <dt className="text-xs font-bold uppercase tracking-wide text-ink-muted">Dealer account</dt>
          <dd className="font-mono">{memo.dealerAccountNumber}</dd>
        </div>
        <div>
          <dt className="text-xs font-bold uppercase tracking-wide text-ink-muted">Claim</dt>
          <dd className="font-mono">{claimHref ? <Link href={claimHref} className="underline">{memo.claimNumber}</Link> : memo.claimNumber}</dd>
        </div>
        <div>
          <dt className="text-xs font-bold uppercase tracking-wide text-ink-muted">RMA</dt>
          <dd className="font-mono">{memo.rmaNumber ?? '—'}</dd>
        </div>
      </dl>
      {memo.kind === 'reversal' ? (
        <p className="mb-3 rounded-md bg-paper-sunk px-3 py-2 text-sm">
          Reverses{' '}
          {memoHref && memo.reversesMemoId ? <Link className="font-mono underline" href={memoHref(memo.reversesMemoId)}>{memo.reversesMemoNumber}</Link> : <span className="font-mono">{memo.reversesMemoNumber}</span>}
          : {memo.reason}
        </p>
      ) : memo.reason ? (
        <p className="mb-3 rounded-md bg-paper-sunk px-3 py-2 text-sm">{memo.reason}</p>
      ) : null}
      <CreditLinesTable lines={memo.lines} currency={memo.currency} totalMinor={memo.totalMinor} />
      <p className="mt-4 text-xs text-ink-muted">
        Amounts in {memo.currency}. Each line is computed exactly and rounded once, {ROUNDING_RULE}; the total is the sum of the lines.
        Negative amounts, in parentheses, are owed by the dealer.
      </p>
    </article>
  );
}
