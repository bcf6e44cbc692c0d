import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { z } from 'zod';
import { CoveragePanel } from '@/components/claims/coverage-panel';
import { DraftChecklist } from '@/components/claims/draft-checklist';
import { RequestedLinesView } from '@/components/claims/requested-lines-view';
import { SafetyNotes } from '@/components/claims/safety-notes';
import { StageBadge } from '@/components/claims/stage-badge';
import { StepButton } from '@/components/claims/step-button';
import { Timeline } from '@/components/claims/timeline';
import { ClaimCreditSection } from '@/components/credits/claim-credit-section';
import { EvidenceDropzone } from '@/components/evidence/evidence-dropzone';
import { EvidenceGallery } from '@/components/evidence/evidence-gallery';
import { FulfilmentPanel } from '@/components/fulfilment/fulfilment-panel';
import { LoadTestPanel } from '@/components/loadtest/load-test-panel';
import { DealerReview } from '@/components/review/dealer-review';
import { MessageThread } from '@/components/review/message-thread';
import { RepReview } from '@/components/review/rep-review';
import { ButtonLink } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { requireUser } from '@/lib/auth/session';
import { canAttach, type AttachmentKind } from '@/lib/claims/attachment-rules';
import { NotFoundError } from '@/lib/errors';
import { formatDay } from '@/lib/format/dates';
import { loadClaimView } from '@/lib/services/claim-view';
import { MILE_M } from '@/lib/units/constants';

export const metadata: Metadata = { title: 'Claim' };

export default async function ClaimPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requireUser();
  const { id } = await params;
  if (!z.uuid().safeParse(id).success) notFound();
  const view = await loadClaimView(user, id).catch((e) => {
    if (e instanceof NotFoundError) notFound();
    throw e;
  });
  const { claim, attachments, events, readiness, warnings, coverage, state, allowed } = view;
  const isDealer = user.orgKind === 'dealer';
  const draft = claim.stage === 'draft';
  const dealerSlots: { kind: AttachmentKind; hint?: string }[] = [
    { kind: 'serial_label_photo', hint: 'The part’s label with its serial readable.' },
    { kind: 'photo', hint: 'The fault itself: damage, error on the display, the part on the bench.' },
    ...(claim.registeredUnitId ? [] : [{ kind: 'proof_of_purchase' as const, hint: 'Receipt or invoice with the sale date (PDF or photo).' }]),
    { kind: 'diagnostic_log', hint: 'Optional: the diagnostic tool’s log.' },
  ];
  const slots = isDealer ? dealerSlots.filter((s) => canAttach(s.kind, 'dealer', claim.stage)) : [];
  const odometer =
    claim.odometerKm === null ? '—' : user.units === 'imperial' ? `${(claim.odometerKm / (MILE_M / 1000)).toFixed(0)} mi` : `${claim.odometerKm.toFixed(0)} km`;

  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-start justify-between gap-4">
        <div>
          <p className="text-sm text-ink-muted">
            {isDealer ? claim.brandName : claim.dealerName} · account {claim.accountNumber}
          </p>
          <h1 className="flex flex-wrap items-center gap-3">
            <span className="font-mono" data-testid="claim-number">{claim.number}</span>
            <StageBadge stage={state.stage} label={state.label} />
          </h1>
          <p className="mt-1 text-ink-soft">
            {claim.partName ?? 'Part not chosen yet'} · {claim.modelName ?? 'model not chosen yet'} · frame <span className="font-mono">{claim.frameSerial}</span>
          </p>
          {claim.rmaNumber ? <p className="mt-1 font-bold">RMA <span className="font-mono" data-testid="rma-number">{claim.rmaNumber}</span></p> : null}
        </div>
        <div className="flex gap-2">
          {isDealer && draft ? <ButtonLink href={`/claims/${claim.id}/edit`} variant="secondary">Edit details</ButtonLink> : null}
          {isDealer && allowed.includes('WITHDRAW') ? (
            <StepButton claimId={claim.id} type="WITHDRAW" version={claim.version} label="Withdraw" variant="quiet" confirm="Withdraw this claim? The brand will stop reviewing it." />
          ) : null}
        </div>
      </div>

      {warnings.length ? (
        <Notice tone="warning" title="Another open claim on the same frame or part">
          {warnings.map((w, i) =>
            w.visible ? (
              <Link key={w.id} href={`/claims/${w.id}`} className="mr-3 font-bold underline">
                {w.number}
              </Link>
            ) : (
              <span key={i} className="mr-3">one from another shop</span>
            ),
          )}
        </Notice>
      ) : null}

      {isDealer && draft ? <DraftChecklist claimId={claim.id} version={claim.version} missing={readiness.missing} /> : null}
      {isDealer ? <DealerReview user={user} view={view} /> : null}
      {user.role === 'brand_rep' ? <RepReview user={user} view={view} /> : null}

      <FulfilmentPanel claim={claim} user={user} attachments={attachments} />

      <div className="grid gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <div className="space-y-6">
          <section className="card p-5">
            <h2 className="mb-3">Evidence</h2>
            {slots.length ? (
              <div className="mb-5 grid gap-3 md:grid-cols-2">
                {slots.map((s) => (
                  <EvidenceDropzone key={s.kind} claimId={claim.id} kind={s.kind} hint={s.hint} />
                ))}
              </div>
            ) : null}
            <EvidenceGallery claimId={claim.id} attachments={attachments} removable={isDealer && draft} />
          </section>

          <LoadTestPanel user={user} claim={claim} allowed={allowed} />

          <section className="card p-5">
            <h2 className="mb-3">The fault</h2>
            {claim.partCategory ? <div className="mb-4"><SafetyNotes category={claim.partCategory} /></div> : null}
            <dl className="grid gap-x-6 gap-y-3 text-sm sm:grid-cols-2">
              <Item label="Failed part">{claim.partNumber ? <><span className="font-mono">{claim.partNumber}</span> {claim.partName}</> : '—'}</Item>
              <Item label="Part serial"><span className="font-mono">{claim.partSerial || '—'}</span></Item>
              <Item label="Failure date">{formatDay(claim.failureDate)}</Item>
              <Item label="Odometer">{odometer}</Item>
              {claim.partCategory === 'battery' ? <Item label="Charge cycles">{claim.batteryCycles ?? '—'}</Item> : null}
              <Item label="Error codes">{claim.errorCodes || '—'}</Item>
              <Item label="What the rider noticed" wide>{claim.symptom || '—'}</Item>
              <Item label="Dealer’s diagnosis" wide><span className="whitespace-pre-wrap">{claim.description || '—'}</span></Item>
            </dl>
          </section>

          <section className="card p-5">
            <h2 className="mb-3">Requested</h2>
            <RequestedLinesView lines={claim.requestedLines} currency={claim.currency} />
          </section>
        </div>

        <div className="space-y-6">
          <ClaimCreditSection claimId={claim.id} stage={claim.stage} role={user.role} />
          <section className="card p-5">
            <h2 className="mb-3">Coverage</h2>
            <CoveragePanel coverage={coverage} />
          </section>
          <section className="card p-5">
            <h2 className="mb-3">The bike</h2>
            <dl className="grid gap-3 text-sm">
              <Item label="Model">{claim.modelName ?? '—'}</Item>
              <Item label="Frame serial"><span className="font-mono">{claim.frameSerial}</span></Item>
              <Item label="Retail sale date">{formatDay(claim.saleDate)} {claim.registeredUnitId ? <span className="text-ink-muted">(registered)</span> : <span className="text-ink-muted">(from proof of purchase)</span>}</Item>
              {claim.customerName || claim.customerEmail || claim.customerPhone ? (
                <Item label="Customer">
                  {claim.customerName} {claim.customerEmail ? <span className="block text-ink-muted">{claim.customerEmail}</span> : null}
                  {claim.customerPhone ? <span className="block text-ink-muted">{claim.customerPhone}</span> : null}
                </Item>
              ) : null}
            </dl>
          </section>
          <MessageThread user={user} view={view} />
          <section className="card p-5">
            <h2 className="mb-4">Timeline</h2>
            <Timeline events={events} timeZone={user.timeZone} />
          </section>
        </div>
      </div>
    </div>
  );
}

function Item({ label, children, wide }: { label: string; children: React.ReactNode; wide?: boolean }) {
  return (
    <div className={wide ? 'sm:col-span-2' : undefined}>
      <dt className="text-xs font-bold uppercase tracking-wide text-ink-muted">{label}</dt>
      <dd className="mt-0.5">{children}</dd>
    </div>
  );
}
