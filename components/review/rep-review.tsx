import clsx from 'clsx';
import Link from 'next/link';
import { StageBadge } from '@/components/claims/stage-badge';
import { StepButton } from '@/components/claims/step-button';
import { DecisionPanel } from '@/components/review/decision-panel';
import { DecisionSummary } from '@/components/review/decision-summary';
import { TimeLeft } from '@/components/review/time-left';
import { Badge } from '@/components/ui/badge';
import { Notice } from '@/components/ui/notice';
import { ATTACHMENT_LABELS, PHOTO_KINDS } from '@/lib/claims/attachment-rules';
import type { Attachment } from '@/lib/db/attachments';
import type { AppUser } from '@/lib/db/users';
import { formatDateTime, formatDay } from '@/lib/format/dates';
import { APPROVAL_RATE_RULE } from '@/lib/review';
import type { ClaimView } from '@/lib/services/claim-view';
import { loadRepReview, type RepReview as RepData } from '@/lib/services/review-view';
import { formatPower, formatTorque } from '@/lib/units';
import { DENIAL_REASON_LABELS, STAGE_LABELS, type Stage } from '@/machines/claim';

const DECIDED = new Set(['approved', 'credit_pending', 'credited', 'reconciled', 'denied']);
const SHOWN_SAME_SERIAL = 6;

/** The brand rep's side of a claim: deadline and assignment, what changed, the evidence against the claim, the dealer's record, and the decision. */
export async function RepReview({ user, view }: { user: AppUser; view: ClaimView }) {
  const r = await loadRepReview(user, view);
  const { claim } = view;
  const newIds = new Set([...(r.since && claim.stage !== 'waiting_on_dealer' ? r.since.attachmentIds : []), ...(r.appeal?.attachmentIds ?? [])]);
  return (
    <section className="space-y-6" data-testid="rep-review">
      <StatusBar view={view} r={r} />
      <div className="grid gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <div className="space-y-6">
          {r.appeal ? <AppealCard view={view} r={r} timeZone={user.timeZone} /> : null}
          {r.since ? <SinceRequest view={view} r={r} timeZone={user.timeZone} /> : null}
          <EvidenceCheck view={view} r={r} units={user.units} newIds={newIds} />
          <div className="grid gap-6 md:grid-cols-2">
            <DealerRecord view={view} r={r} />
            <SameSerial r={r} />
          </div>
        </div>
        <div className="space-y-6">
          {r.canDecide ? (
            <DecisionPanel
              claimId={claim.id}
              version={claim.version}
              currency={claim.currency}
              requested={claim.requestedLines}
              draft={r.approvalDraft}
              schedule={r.schedule}
              appealDays={r.appealDays}
              denialReasons={Object.entries(DENIAL_REASON_LABELS).map(([value, label]) => ({ value, label }))}
            />
          ) : DECIDED.has(claim.stage) ? (
            <DecisionSummary view={view} audience="brand" />
          ) : (
            <section className="card p-5" data-testid="decision-closed">
              <h2>Decision</h2>
              <p className="mt-2 text-sm text-ink-muted">{whyNoDecision(view, r)}</p>
            </section>
          )}
        </div>
      </div>
    </section>
  );
}

function whyNoDecision(view: ClaimView, r: RepData): string {
  const s = view.claim.stage;
  if (s === 'waiting_on_dealer') return 'The dealer was asked for more. You can decide once they send it; the review clock is paused meanwhile.';
  if (s === 'submitted' || s === 'appealed') {
    if (r.deniedByMe && !r.canTake) return 'You denied this claim, so another rep of the brand reviews the appeal.';
    return 'Take the claim to review it; then you can ask for more, approve or deny.';
  }
  if (s === 'in_review') return `${r.assignedRepName ?? 'Another rep'} is reviewing this claim; only they can decide it.`;
  if (s === 'withdrawn') return 'The dealer withdrew this claim.';
  return 'There is nothing to decide here.';
}

function StatusBar({ view, r }: { view: ClaimView; r: RepData }) {
  const { claim } = view;
  const overdue = r.clock?.clock.status === 'overdue';
  return (
    <section className={clsx('card flex flex-wrap items-center justify-between gap-4 p-4', overdue && 'border-fault-500')} data-testid="review-status">
      <div className="flex flex-wrap items-center gap-6">
        <div>
          <p className="text-xs font-bold uppercase tracking-wide text-ink-muted">Review deadline</p>
          {r.clock ? (
            <div className="mt-1" data-testid="review-clock">
              <TimeLeft clock={r.clock.clock} />
            </div>
          ) : (
            <p className="mt-1 text-sm text-ink-muted">{claim.stage === 'withdrawn' ? 'Withdrawn' : 'Decided'}</p>
          )}
        </div>
        <div>
          <p className="text-xs font-bold uppercase tracking-wide text-ink-muted">With</p>
          <p className="mt-1 text-sm" data-testid="assigned-rep">
            {r.assignedToMe ? 'You' : (r.assignedRepName ?? 'Nobody yet')}
            {claim.context.appealsUsed > 0 ? <span className="ml-2"><Badge tone="volt">appeal</Badge></span> : null}
          </p>
        </div>
        {r.clock && (r.clock.clock.isPaused || r.clock.clock.pausedBusinessDays > 0) ? <p className="max-w-md text-xs text-ink-muted">{r.clock.clock.summary}</p> : null}
      </div>
      <div className="flex gap-2">
        {r.canTake ? <StepButton claimId={claim.id} type="TAKE" version={claim.version} label="Take for review" /> : null}
        {r.canRelease ? <StepButton claimId={claim.id} type="RELEASE" version={claim.version} label="Release to the queue" variant="quiet" /> : null}
      </div>
      {r.clock ? <p className="basis-full text-xs text-ink-muted">{r.clock.rule}</p> : null}
    </section>
  );
}

function SinceRequest({ view, r, timeZone }: { view: ClaimView; r: RepData; timeZone: string }) {
  const s = r.since!;
  const added = view.attachments.filter((a) => s.attachmentIds.includes(a.id));
  const answered = s.resubmittedAt !== null;
  return (
    <section className={clsx('card p-5', answered ? 'border-charge-300' : 'border-volt-300')} data-testid="since-request">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2>{answered ? 'What the dealer sent since you asked' : 'Asked for more; waiting on the dealer'}</h2>
        <p className="text-xs text-ink-muted">
          asked {formatDateTime(s.askedAt, timeZone)}
          {s.askedBy ? ` by ${s.askedBy}` : ''}
          {answered ? ` · sent ${formatDateTime(s.resubmittedAt!, timeZone)}` : ''}
        </p>
      </div>
      <div className="mt-3 grid gap-4 md:grid-cols-2">
        <div>
          <p className="text-xs font-bold uppercase tracking-wide text-ink-muted">The checklist</p>
          <ul className="mt-1 list-disc space-y-0.5 pl-5 text-sm">
            {s.checklist.map((c) => (
              <li key={c}>{c}</li>
            ))}
          </ul>
        </div>
        <div>
          <p className="text-xs font-bold uppercase tracking-wide text-ink-muted">New since the request</p>
          {added.length === 0 && s.messages.length === 0 ? <p className="mt-1 text-sm text-ink-muted">Nothing yet.</p> : null}
          <ul className="mt-1 space-y-1 text-sm">
            {added.map((a) => (
              <li key={a.id} data-testid="new-evidence">
                <Badge tone="charge">new</Badge> {ATTACHMENT_LABELS[a.kind]}:{' '}
                <a className="text-charge-700 underline" href={`/api/attachments/${a.id}`} target="_blank" rel="noreferrer">
                  {a.fileName}
                </a>
              </li>
            ))}
            {s.messages.map((m) => (
              <li key={m.id} className="rounded-md bg-paper-sunk px-3 py-2">
                <span className="whitespace-pre-wrap">{m.text}</span>
                <span className="block text-xs text-ink-muted">{m.by}</span>
              </li>
            ))}
          </ul>
        </div>
      </div>
    </section>
  );
}

function AppealCard({ view, r, timeZone }: { view: ClaimView; r: RepData; timeZone: string }) {
  const a = r.appeal!;
  const added = view.attachments.filter((x) => a.attachmentIds.includes(x.id));
  return (
    <section className="card border-volt-300 p-5" data-testid="appeal-review">
      <h2>The dealer appealed the denial</h2>
      <div className="mt-3 grid gap-4 md:grid-cols-2">
        <div>
          <p className="text-xs font-bold uppercase tracking-wide text-ink-muted">The denial</p>
          <p className="mt-1 text-sm font-bold">{a.reasonCode ? (DENIAL_REASON_LABELS[a.reasonCode as keyof typeof DENIAL_REASON_LABELS] ?? a.reasonCode) : '—'}</p>
          {a.denialMessage ? <p className="mt-1 whitespace-pre-wrap text-sm">{a.denialMessage}</p> : null}
          <p className="mt-1 text-xs text-ink-muted">{a.deniedBy ?? 'A rep'} · {a.deniedAt ? formatDateTime(a.deniedAt, timeZone) : ''}</p>
        </div>
        <div>
          <p className="text-xs font-bold uppercase tracking-wide text-ink-muted">The appeal</p>
          {a.appealMessage ? <p className="mt-1 whitespace-pre-wrap rounded-md bg-paper-sunk px-3 py-2 text-sm">{a.appealMessage}</p> : null}
          <p className="mt-1 text-xs text-ink-muted">{formatDateTime(a.appealedAt, timeZone)}</p>
          {added.length ? (
            <ul className="mt-2 space-y-0.5 text-sm">
              {added.map((x) => (
                <li key={x.id}>
                  <Badge tone="charge">new</Badge> {ATTACHMENT_LABELS[x.kind]}: {x.fileName}
                </li>
              ))}
            </ul>
          ) : (
            <p className="mt-2 text-sm text-ink-muted">No new evidence with the appeal.</p>
          )}
        </div>
      </div>
      <p className="mt-3 text-xs text-ink-muted">An appeal is decided once; a second denial is final.</p>
    </section>
  );
}

function Thumb({ a, isNew }: { a: Attachment; isNew: boolean }) {
  return (
    <a href={`/api/attachments/${a.id}`} target="_blank" rel="noreferrer" className="relative block overflow-hidden rounded-md border border-paper-line bg-paper-sunk">
      {/* eslint-disable-next-line @next/next/no-img-element -- presigned redirect, not an optimisable asset */}
      <img src={`/api/attachments/${a.id}?thumb`} alt={`${ATTACHMENT_LABELS[a.kind]}: ${a.fileName}`} className="aspect-[4/3] w-full object-cover" loading="lazy" />
      {isNew ? <span className="absolute left-1 top-1"><Badge tone="charge">new</Badge></span> : null}
    </a>
  );
}

function Row({ title, evidence, children, testId }: { title: string; evidence: React.ReactNode; children: React.ReactNode; testId: string }) {
  return (
    <div className="grid gap-3 border-t border-paper-line py-4 first:border-t-0 first:pt-0 md:grid-cols-2" data-testid={testId}>
      <div>
        <p className="mb-2 text-xs font-bold uppercase tracking-wide text-ink-muted">{title}</p>
        {evidence}
      </div>
      <div className="text-sm">{children}</div>
    </div>
  );
}

function Fact({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <p className="mb-1">
      <span className="text-ink-muted">{label}: </span>
      {children}
    </p>
  );
}

/** Each piece of evidence beside the claim it has to prove. */
function EvidenceCheck({ view, r, units, newIds }: { view: ClaimView; r: RepData; units: 'metric' | 'imperial'; newIds: Set<string> }) {
  const { claim, attachments } = view;
  const labels = attachments.filter((a) => a.kind === 'serial_label_photo');
  const faults = attachments.filter((a) => PHOTO_KINDS.includes(a.kind) && a.kind !== 'serial_label_photo');
  const files = attachments.filter((a) => !PHOTO_KINDS.includes(a.kind));
  const registered = r.registry?.componentSerial ?? null;
  const serialMatches = registered !== null && claim.partSerial !== '' && registered.toLowerCase() === claim.partSerial.toLowerCase();
  const photos = (list: Attachment[]) =>
    list.length ? (
      <div className="grid grid-cols-2 gap-2">
        {list.map((a) => (
          <Thumb key={a.id} a={a} isNew={newIds.has(a.id)} />
        ))}
      </div>
    ) : (
      <p className="text-sm text-fault-700">None uploaded.</p>
    );
  const part = r.part;
  return (
    <section className="card p-5" data-testid="evidence-check">
      <h2 className="mb-4">Evidence against the claim</h2>
      <Row title="Serial label" evidence={photos(labels)} testId="check-serial">
        <Fact label="Part serial on the claim"><span className="font-mono">{claim.partSerial || '—'}</span></Fact>
        <Fact label="Registered for this frame">
          {r.registry ? (
            registered ? (
              <>
                <span className="font-mono">{registered}</span>{' '}
                {claim.partSerial ? (serialMatches ? <Badge tone="charge">matches</Badge> : <Badge tone="fault">differs</Badge>) : null}
              </>
            ) : (
              'no serial of this part on record'
            )
          ) : (
            'frame not registered (proof of purchase needed)'
          )}
        </Fact>
        <Fact label="Frame"><span className="font-mono">{claim.frameSerial}</span>{r.registry ? ` · ${r.registry.modelName}, sold ${formatDay(r.registry.saleDate)}` : ''}</Fact>
      </Row>
      <Row title="The fault" evidence={photos(faults)} testId="check-fault">
        <Fact label="What the rider noticed">{claim.symptom || '—'}</Fact>
        <Fact label="Error codes">{claim.errorCodes || '—'}</Fact>
        <Fact label="Dealer’s diagnosis"><span className="whitespace-pre-wrap">{claim.description || '—'}</span></Fact>
      </Row>
      <Row
        title="Load test and documents"
        testId="check-files"
        evidence={
          files.length ? (
            <ul className="space-y-1 text-sm">
              {files.map((f) => (
                <li key={f.id}>
                  {newIds.has(f.id) ? <Badge tone="charge">new</Badge> : null} {ATTACHMENT_LABELS[f.kind]}:{' '}
                  <a className="text-charge-700 underline" href={`/api/attachments/${f.id}`}>
                    {f.fileName}
                  </a>
                </li>
              ))}
            </ul>
          ) : (
            <p className="text-sm text-fault-700">None uploaded.</p>
          )
        }
      >
        {part ? (
          <>
            <Fact label="Part">{part.partNumber} {part.name}</Fact>
            {part.minWheelPowerW ? <Fact label="Spec at the wheel">at least {formatPower(part.minWheelPowerW, units).text} and {part.minWheelTorqueNm ? formatTorque(part.minWheelTorqueNm, units).text : '—'}</Fact> : null}
            {part.ratedCapacityAh && part.nominalVoltageV ? (
              <Fact label="Rated">
                {part.nominalVoltageV} V × {part.ratedCapacityAh} Ah = {(part.nominalVoltageV * part.ratedCapacityAh).toFixed(0)} Wh
              </Fact>
            ) : null}
            <p className="text-xs text-ink-muted">
              {part.category === 'battery'
                ? 'Compare the capacity discharge with the rating and the policy’s capacity threshold.'
                : `${part.minWheelPowerW ? 'Compare the before-test with this spec' : 'The part has no wheel spec in the catalog: judge the runs yourself'}; a run above the legal speed class under motor power is a sign of tampering to look at, not a reason on its own.`}
            </p>
          </>
        ) : (
          <p className="text-ink-muted">No part chosen.</p>
        )}
      </Row>
    </section>
  );
}

function DealerRecord({ view, r }: { view: ClaimView; r: RepData }) {
  const h = r.history;
  return (
    <section className="card p-5" data-testid="dealer-record">
      <h2 className="mb-3">{view.claim.dealerName} with us</h2>
      <dl className="grid grid-cols-2 gap-3 text-sm">
        <Stat label="Claims filed" value={h.filed} />
        <Stat label="Open now" value={h.open} />
        <Stat label="Approved" value={h.approved} />
        <Stat label="Denied" value={h.denied} />
      </dl>
      <p className="mt-3 text-sm">
        Approval rate: <span className="font-bold" data-testid="approval-rate">{h.rateText}</span>
      </p>
      <p className="mt-1 text-xs text-ink-muted">{APPROVAL_RATE_RULE}{h.firstFiledAt ? ` First claim ${formatDay(h.firstFiledAt.slice(0, 10))}.` : ''}</p>
    </section>
  );
}

function Stat({ label, value }: { label: string; value: number }) {
  return (
    <div>
      <dt className="text-xs font-bold uppercase tracking-wide text-ink-muted">{label}</dt>
      <dd className="figure text-lg">{value}</dd>
    </div>
  );
}

function SameSerial({ r }: { r: RepData }) {
  return (
    <section className="card p-5" data-testid="same-serial">
      <h2 className="mb-3">Other claims on this frame or part</h2>
      {r.sameSerial.length === 0 ? (
        <p className="text-sm text-ink-muted">None: this is the first claim on this frame and part serial.</p>
      ) : (
        <ul className="space-y-2 text-sm">
          {r.sameSerial.slice(0, SHOWN_SAME_SERIAL).map((c) => (
            <li key={c.id} className="flex flex-wrap items-center gap-2">
              <Link href={`/claims/${c.id}`} className="font-mono font-bold text-charge-700 hover:underline">
                {c.number}
              </Link>
              <StageBadge stage={c.stage} label={STAGE_LABELS[c.stage as Stage] ?? c.stage} />
              <span className="text-xs text-ink-muted">
                {c.dealerName} · same {c.matchedOn.join(' and ')} serial{c.submittedAt ? ` · ${formatDay(c.submittedAt.slice(0, 10))}` : ''}
              </span>
            </li>
          ))}
        </ul>
      )}
      {r.sameSerial.length > SHOWN_SAME_SERIAL ? (
        <p className="mt-2 text-xs text-ink-muted">
          and {r.sameSerial.length - SHOWN_SAME_SERIAL}
          {r.sameSerial.length >= 20 ? ' or more' : ''} older ones
        </p>
      ) : null}
      {r.sameSerial.some((c) => c.matchedOn.includes('part')) ? (
        <Notice tone="warning" className="mt-3">The same part serial was claimed before: check that the part was really replaced.</Notice>
      ) : null}
    </section>
  );
}
