import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { z } from 'zod';
import { StageBadge } from '@/components/claims/stage-badge';
import { ChargebackForm } from '@/components/credits/chargeback-form';
import { CreditLinesTable } from '@/components/credits/credit-lines-table';
import { IssueCreditButton } from '@/components/credits/issue-credit-button';
import { AFTER_TEST_LABELS, coreLabel, money } from '@/components/credits/labels';
import { MemoDocument } from '@/components/credits/memo-document';
import { ReverseMemoForm } from '@/components/credits/reverse-memo-form';
import { Notice } from '@/components/ui/notice';
import { requireRole } from '@/lib/auth/session';
import { NotFoundError } from '@/lib/errors';
import { formatDateTime } from '@/lib/format/dates';
import { loadCreditView } from '@/lib/services/credits';

export const metadata: Metadata = { title: 'Credit' };

export default async function ClaimCreditPage({ params, searchParams }: { params: Promise<{ id: string }>; searchParams: Promise<{ issued?: string }> }) {
  const user = await requireRole('accountant');
  const { id } = await params;
  const { issued } = await searchParams;
  if (!z.uuid().safeParse(id).success) notFound();
  const view = await loadCreditView(user, id).catch((e) => {
    if (e instanceof NotFoundError) notFound();
    throw e;
  });
  const { claim, state, open, computed, problems, edits, memos } = view;
  const ctx = claim.context;
  const reissue = open && claim.stage !== 'credit_pending';
  const justIssued = issued ? memos.find((m) => m.number === issued) : undefined;

  return (
    <div className="space-y-6">
      <div>
        <p className="text-sm text-ink-muted">
          <Link href="/accounts" className="underline">Credits to issue</Link> · {claim.dealerName} · account <span className="font-mono">{claim.accountNumber}</span>
        </p>
        <h1 className="flex flex-wrap items-center gap-3">
          <span>Credit for claim</span>
          <Link href={`/claims/${claim.id}`} className="font-mono underline" data-testid="claim-number">{claim.number}</Link>
          <StageBadge stage={state.stage} label={state.label} />
        </h1>
        <p className="mt-1 text-ink-soft">
          {claim.partName ?? 'No part'} · RMA <span className="font-mono">{claim.rmaNumber ?? '—'}</span> · {AFTER_TEST_LABELS[ctx.afterTest.outcome]}
          {ctx.afterTest.outcome === 'accepted_by_hand' && ctx.afterTest.acceptedReason ? ` (“${ctx.afterTest.acceptedReason}”)` : ''} · core: {coreLabel(ctx.core.outcome, ctx.core.inspection?.result ?? null)}
        </p>
      </div>

      {justIssued ? (
        <Notice tone="success" title={`Memo ${justIssued.number} issued`}>
          {money(justIssued.totalMinor, justIssued.currency)} for {claim.dealerName}; the shop has been told. It waits for the dealer’s statement to be
          reconciled.
        </Notice>
      ) : null}
      {!open && claim.stage === 'approved' ? (
        <Notice tone="warning" title="Not ready for its credit yet">
          A memo is issued once the replacement is verified and the core is inspected, waived or written off. Now: {state.label}. The
          draft below shows what it would come to today.
        </Notice>
      ) : null}
      {!open && memos.length === 0 && claim.stage !== 'approved' ? (
        <Notice tone="info" title="No credit for this claim yet">
          It is {state.label.toLowerCase()}. A credit is computed once the claim is approved, and issued when its replacement is verified and its
          core is dealt with.
        </Notice>
      ) : null}
      {problems.length ? (
        <Notice tone="danger" title="The credit cannot be computed">
          <ul className="list-disc pl-5">
            {problems.map((p) => (
              <li key={p.path + p.message}>{p.message}</li>
            ))}
          </ul>
          <p className="mt-1">Fix the price list or the approved lines first; nothing can be issued meanwhile.</p>
        </Notice>
      ) : null}

      {computed && (open || claim.stage === 'approved') ? (
        <section className="card p-5" data-testid="credit-draft">
          <div className="mb-3 flex flex-wrap items-end justify-between gap-3">
            <div>
              <h2>{reissue ? 'Corrected memo (draft)' : 'Draft memo'}</h2>
              <p className="text-sm text-ink-muted">
                Price list read on {computed.input.priceDate} (the day the replacement was fitted). Labor at the dealer’s agreed rate,
                capped at the brand maximum.
              </p>
            </div>
            {open ? (
              <IssueCreditButton
                claimId={claim.id}
                version={claim.version}
                draftHash={computed.hash}
                label={`${reissue ? 'Issue the corrected memo' : 'Issue the credit memo'} for ${money(computed.draft.totalMinor, claim.currency)}`}
              />
            ) : null}
          </div>
          <CreditLinesTable lines={computed.draft.lines} currency={claim.currency} totalMinor={computed.draft.totalMinor} edit={open ? { claimId: claim.id } : undefined} />
        </section>
      ) : null}

      {edits.length ? (
        <section className="card p-5">
          <h2 className="mb-2">Adjustments</h2>
          <ol className="space-y-1 text-sm" data-testid="credit-edits">
            {edits.map((e) => (
              <li key={e.id}>
                Line {e.lineNo} set to <span className="figure">{money(e.amountMinor, claim.currency)}</span>: “{e.reason}” — {e.byName},{' '}
                {formatDateTime(e.at, user.timeZone)}
              </li>
            ))}
          </ol>
        </section>
      ) : null}

      {memos.length ? (
        <section className="space-y-4">
          <h2>Issued memos</h2>
          {memos.map((m) => (
            <div key={m.id} className="space-y-2">
              <MemoDocument memo={m} memoHref={(mid) => `/accounts/memos/${mid}`} claimHref={`/claims/${claim.id}`} />
              {m.kind !== 'reversal' && !m.reversedByMemoId ? <ReverseMemoForm memoId={m.id} number={m.number} /> : null}
            </div>
          ))}
          {view.chargebackAllowed ? <ChargebackForm claimId={claim.id} /> : null}
        </section>
      ) : null}
    </div>
  );
}
