import { AppealForm, ResubmitForm } from '@/components/review/dealer-forms';
import { DecisionSummary } from '@/components/review/decision-summary';
import { Badge } from '@/components/ui/badge';
import { ATTACHMENT_LABELS } from '@/lib/claims/attachment-rules';
import type { AppUser } from '@/lib/db/users';
import { formatDateTime, formatDay } from '@/lib/format/dates';
import type { ClaimView } from '@/lib/services/claim-view';
import { loadDealerReview } from '@/lib/services/review-view';

const WITH_BRAND = new Set(['submitted', 'in_review', 'appealed']);

/** The shop's view of the review: when to expect a decision, what the rep asked for, the decision and the appeal. */
export async function DealerReview({ user, view }: { user: AppUser; view: ClaimView }) {
  const { claim } = view;
  if (claim.stage === 'draft' || claim.stage === 'withdrawn') return null;
  const r = await loadDealerReview(view);

  if (WITH_BRAND.has(claim.stage)) {
    return (
      <section className="card p-5" data-testid="dealer-review">
        <h2>{claim.stage === 'appealed' ? 'Your appeal is with the brand' : 'With the brand'}</h2>
        <p className="mt-1 text-sm text-ink-soft">
          {claim.stage === 'in_review' ? 'A warranty rep is reviewing your claim.' : 'Waiting for a warranty rep to take it.'}
          {r.clock ? ` The brand decides by ${formatDay(r.clock.clock.dueDate)} (${r.clock.reviewDays ?? 5} business days in its calendar).` : ''}
        </p>
      </section>
    );
  }

  if (claim.stage === 'waiting_on_dealer' && r.since) {
    const added = view.attachments.filter((a) => r.since!.attachmentIds.includes(a.id));
    return (
      <section className="card border-volt-300 p-5" data-testid="info-request">
        <div className="flex flex-wrap items-baseline justify-between gap-2">
          <h2>The brand needs more from you</h2>
          <p className="text-xs text-ink-muted">asked {formatDateTime(r.since.askedAt, user.timeZone)}{r.since.askedBy ? ` by ${r.since.askedBy}` : ''}</p>
        </div>
        <ul className="mt-3 space-y-1 text-sm" data-testid="info-checklist">
          {r.since.checklist.map((c) => (
            <li key={c} className="flex gap-2">
              <span aria-hidden className="text-volt-700">☐</span>
              {c}
            </li>
          ))}
        </ul>
        {r.since.message ? <p className="mt-3 whitespace-pre-wrap rounded-md bg-paper-sunk px-3 py-2 text-sm">{r.since.message}</p> : null}
        {added.length ? (
          <div className="mt-3 text-sm">
            <p className="text-xs font-bold uppercase tracking-wide text-ink-muted">Added since the request</p>
            <ul className="mt-1 space-y-0.5">
              {added.map((a) => (
                <li key={a.id}>
                  <Badge tone="charge">new</Badge> {ATTACHMENT_LABELS[a.kind]}: {a.fileName}
                </li>
              ))}
            </ul>
          </div>
        ) : null}
        <p className="mt-3 text-xs text-ink-muted">The brand’s review deadline is paused until you send the requested items.</p>
        {r.canResubmit ? (
          <div className="mt-4 border-t border-paper-line pt-4">
            <ResubmitForm claimId={claim.id} version={claim.version} newFiles={added.length} />
          </div>
        ) : null}
      </section>
    );
  }

  return (
    <div className="space-y-4" data-testid="dealer-review">
      <DecisionSummary view={view} audience="dealer" timeZone={user.timeZone} />
      {r.canAppeal ? (
        <section className="card p-5" data-testid="appeal">
          <h2>Appeal</h2>
          <div className="mt-3">
            <AppealForm claimId={claim.id} version={claim.version} />
          </div>
        </section>
      ) : null}
    </div>
  );
}
