'use client';

import clsx from 'clsx';
import { useRouter } from 'next/navigation';
import { useMemo, useState } from 'react';
import { postStep } from '@/components/review/post-json';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { formatMoney, type CurrencyCode } from '@/lib/money';
import { buildApproval, describeChange, REQUEST_ITEMS, type ApprovalDraft, type ClaimLines, type LineStatus, type ScheduleOperation } from '@/lib/review';

type Props = {
  claimId: string;
  version: number;
  currency: string;
  requested: ClaimLines;
  draft: ApprovalDraft;
  schedule: ScheduleOperation[];
  appealDays: number;
  denialReasons: { value: string; label: string }[];
};

type Tab = 'approve' | 'ask' | 'deny';
type Errors = Record<string, string[]>;

const TABS: { key: Tab; label: string }[] = [
  { key: 'approve', label: 'Approve' },
  { key: 'ask', label: 'Ask for more' },
  { key: 'deny', label: 'Deny' },
];

/** The rep's three ways to move a claim on; each form sends one step and shows the server's refusal as it was worded. */
export function DecisionPanel(props: Props) {
  const [tab, setTab] = useState<Tab>('approve');
  return (
    <section className="card p-5 lg:sticky lg:top-4" data-testid="decision-panel">
      <h2>Decide</h2>
      <div role="tablist" aria-label="Decision" className="mt-3 flex gap-1 border-b border-paper-line">
        {TABS.map((t) => (
          <button
            key={t.key}
            role="tab"
            type="button"
            aria-selected={tab === t.key}
            onClick={() => setTab(t.key)}
            className={clsx('-mb-px rounded-t-md border px-3 py-2 text-sm font-bold', tab === t.key ? 'border-paper-line border-b-paper-raised bg-paper-raised' : 'border-transparent text-ink-muted hover:text-ink')}
          >
            {t.label}
          </button>
        ))}
      </div>
      <div className="pt-4">
        {tab === 'approve' ? <ApprovalForm {...props} /> : tab === 'ask' ? <AskForm {...props} /> : <DenyForm {...props} />}
      </div>
    </section>
  );
}

function useSend(claimId: string) {
  const router = useRouter();
  const [pending, setPending] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  const [errors, setErrors] = useState<Errors>({});
  async function send(body: Record<string, unknown>) {
    setPending(true);
    setMessage(null);
    const r = await postStep(claimId, body);
    setPending(false);
    if (!r.ok) {
      setMessage(r.message);
      setErrors(r.fieldErrors);
      // A state refusal means the claim moved on: show where it stands now.
      if (r.status === 409) router.refresh();
      return false;
    }
    setErrors({});
    router.refresh();
    return true;
  }
  return { send, pending, message, errors };
}

function FieldErrors({ errors, name }: { errors: Errors; name: string }) {
  return (
    <>
      {errors[name]?.map((e) => (
        <p key={e} className="field-error" role="alert">
          {e}
        </p>
      ))}
    </>
  );
}

const STATUS_TEXT: Record<LineStatus, string> = { as_requested: 'as requested', changed: 'changed', not_approved: 'not approved' };
const STATUS_CLASS: Record<LineStatus, string> = { as_requested: 'text-charge-700', changed: 'text-volt-700', not_approved: 'text-fault-700' };

function ApprovalForm({ claimId, version, currency, requested, draft, schedule }: Props) {
  const [d, setD] = useState<ApprovalDraft>(draft);
  const [note, setNote] = useState('');
  const { send, pending, message, errors } = useSend(claimId);
  const cur = currency as CurrencyCode;
  // The same rules as the server, run as the rep types: a preview, never the check.
  const preview = useMemo(() => buildApproval(requested, d, schedule, cur), [requested, d, schedule, cur]);
  const comparison = preview.ok ? preview.comparison : null;
  const statusOf = (lineId: string): LineStatus | null => comparison?.find((c) => c.lineId === lineId)?.status ?? null;
  const ops = schedule.filter((o) => o.active || requested.labor.some((l) => l.operationId === o.id));
  const shown = { ...(preview.ok ? {} : preview.fieldErrors), ...errors };
  const extent = preview.ok ? preview.extent : null;

  const setPart = (i: number, quantity: number) => setD((x) => ({ ...x, parts: x.parts.map((p, j) => (j === i ? { ...p, quantity } : p)) }));
  const setLabor = (i: number, patch: Partial<ApprovalDraft['labor'][number]>) => setD((x) => ({ ...x, labor: x.labor.map((l, j) => (j === i ? { ...l, ...patch } : l)) }));

  return (
    <form
      data-testid="approve-form"
      onSubmit={(e) => {
        e.preventDefault();
        void send({ type: 'APPROVE', version, parts: d.parts, labor: d.labor, freight: d.freight, ...(note.trim() ? { message: note.trim() } : {}) });
      }}
      className="space-y-4"
    >
      <p className="text-sm text-ink-muted">Approve every line as asked, or lower a quantity, the hours or the freight, or pick another operation; 0 leaves a line out.</p>
      <div className="space-y-3">
        {requested.parts.map((p, i) => (
          <div key={p.lineId} className="rounded-md border border-paper-line p-3" data-testid={`approve-line-${p.lineId}`}>
            <div className="flex items-start justify-between gap-2 text-sm">
              <p>
                <span className="font-mono text-xs">{p.partNumber}</span> {p.name}
                <span className="block text-xs text-ink-muted">asked × {p.quantity}</span>
              </p>
              <LineStatusText status={statusOf(p.lineId)} />
            </div>
            <label className="field-label mt-2" htmlFor={`qty-${p.lineId}`}>
              Quantity approved
            </label>
            <input
              id={`qty-${p.lineId}`}
              type="number"
              step={1}
              min={0}
              max={p.quantity}
              className="field-input w-28"
              value={Number.isNaN(d.parts[i]?.quantity) ? '' : (d.parts[i]?.quantity ?? '')}
              onChange={(e) => setPart(i, e.target.value === '' ? Number.NaN : Number(e.target.value))}
              aria-invalid={!!shown[`parts.${i}.quantity`]}
            />
            <FieldErrors errors={shown} name={`parts.${i}.quantity`} />
          </div>
        ))}
        {requested.labor.map((l, i) => {
          const current = d.labor[i];
          return (
            <div key={l.lineId} className="rounded-md border border-paper-line p-3" data-testid={`approve-line-${l.lineId}`}>
              <div className="flex items-start justify-between gap-2 text-sm">
                <p>
                  Labor <span className="font-mono text-xs">{l.code}</span>
                  <span className="block text-xs text-ink-muted">asked {l.hours} h · {l.description}</span>
                </p>
                <LineStatusText status={statusOf(l.lineId)} />
              </div>
              <div className="mt-2 grid grid-cols-[minmax(0,1fr)_6rem] gap-2">
                <div>
                  <label className="field-label" htmlFor={`op-${l.lineId}`}>
                    Operation
                  </label>
                  <select
                    id={`op-${l.lineId}`}
                    className="field-input"
                    value={current?.operationId ?? ''}
                    onChange={(e) => {
                      const op = schedule.find((o) => o.id === e.target.value);
                      setLabor(i, { operationId: e.target.value, ...(op ? { hours: op.standardHours } : {}) });
                    }}
                  >
                    {ops.map((o) => (
                      <option key={o.id} value={o.id}>
                        {o.code} — {o.description} ({o.standardHours} h)
                      </option>
                    ))}
                  </select>
                  <FieldErrors errors={shown} name={`labor.${i}.operationId`} />
                </div>
                <div>
                  <label className="field-label" htmlFor={`hours-${l.lineId}`}>
                    Hours
                  </label>
                  <input
                    id={`hours-${l.lineId}`}
                    inputMode="decimal"
                    className="field-input"
                    value={current?.hours ?? ''}
                    onChange={(e) => setLabor(i, { hours: e.target.value })}
                    aria-invalid={!!shown[`labor.${i}.hours`]}
                  />
                </div>
              </div>
              <FieldErrors errors={shown} name={`labor.${i}.hours`} />
            </div>
          );
        })}
        {requested.freightMinor > 0 ? (
          <div className="rounded-md border border-paper-line p-3" data-testid="approve-line-freight">
            <div className="flex items-start justify-between gap-2 text-sm">
              <p>
                Freight
                <span className="block text-xs text-ink-muted">asked {formatMoney(requested.freightMinor, cur)}</span>
              </p>
              <LineStatusText status={statusOf('freight')} />
            </div>
            <label className="field-label mt-2" htmlFor="freight">
              Freight approved ({currency})
            </label>
            <input id="freight" inputMode="decimal" className="field-input w-36" value={d.freight} onChange={(e) => setD((x) => ({ ...x, freight: e.target.value }))} aria-invalid={!!shown.freight} />
            <FieldErrors errors={shown} name="freight" />
          </div>
        ) : null}
      </div>
      {comparison && extent === 'partial' ? (
        <div className="rounded-md bg-volt-50 px-3 py-2 text-sm text-volt-700" data-testid="approval-changes">
          <p className="font-bold">Changed from the request</p>
          <ul className="list-disc pl-5">
            {comparison.map((c) => describeChange(c, cur)).filter(Boolean).map((t) => (
              <li key={t}>{t}</li>
            ))}
          </ul>
        </div>
      ) : null}
      <div>
        <label className="field-label" htmlFor="approve-note">
          Note to the dealer (optional)
        </label>
        <textarea id="approve-note" rows={2} className="field-input" value={note} onChange={(e) => setNote(e.target.value)} />
      </div>
      {shown.parts || shown.labor || shown._form ? (
        <div>
          <FieldErrors errors={shown} name="parts" />
          <FieldErrors errors={shown} name="labor" />
          <FieldErrors errors={shown} name="_form" />
        </div>
      ) : null}
      {message ? <Notice tone="danger">{message}</Notice> : null}
      <Button type="submit" disabled={pending || !preview.ok} className="w-full">
        {pending ? 'Approving…' : extent === 'partial' ? 'Approve in part' : 'Approve in full'}
      </Button>
      <p className="text-xs text-ink-muted">Approving issues the RMA number; the warehouse ships the replacement (nothing ships when every approved part is from the shop’s own stock) and the core return starts.</p>
    </form>
  );
}

function LineStatusText({ status }: { status: LineStatus | null }) {
  if (!status) return null;
  return <span className={clsx('shrink-0 text-xs font-bold', STATUS_CLASS[status])}>{STATUS_TEXT[status]}</span>;
}

function AskForm({ claimId, version }: Props) {
  const [picked, setPicked] = useState<Record<string, boolean>>({});
  const [details, setDetails] = useState<Record<string, string>>({});
  const [text, setText] = useState('');
  const { send, pending, message, errors } = useSend(claimId);
  return (
    <form
      data-testid="ask-form"
      className="space-y-4"
      onSubmit={(e) => {
        e.preventDefault();
        const items = REQUEST_ITEMS.filter((i) => picked[i.key]).map((i) => ({ key: i.key, detail: details[i.key] ?? '' }));
        void send({ type: 'REQUEST_INFO', version, items, message: text });
      }}
    >
      <fieldset>
        <legend className="field-label">What the dealer must send</legend>
        <div className="space-y-2">
          {REQUEST_ITEMS.map((i) => (
            <div key={i.key}>
              <label className="flex items-center gap-2 text-sm">
                <input type="checkbox" checked={!!picked[i.key]} onChange={(e) => setPicked((p) => ({ ...p, [i.key]: e.target.checked }))} />
                {i.label}
              </label>
              {picked[i.key] && i.detail ? (
                <input
                  aria-label={i.detail}
                  placeholder={i.detail}
                  className="field-input mt-1"
                  value={details[i.key] ?? ''}
                  onChange={(e) => setDetails((d) => ({ ...d, [i.key]: e.target.value }))}
                />
              ) : null}
              <FieldErrors errors={errors} name={`detail.${i.key}`} />
            </div>
          ))}
        </div>
        <FieldErrors errors={errors} name="items" />
      </fieldset>
      <div>
        <label className="field-label" htmlFor="ask-message">
          Message to the dealer
        </label>
        <textarea id="ask-message" rows={3} className="field-input" value={text} onChange={(e) => setText(e.target.value)} placeholder="What is missing and why it matters for the decision." />
        <FieldErrors errors={errors} name="message" />
      </div>
      {message ? <Notice tone="danger">{message}</Notice> : null}
      <Button type="submit" variant="secondary" disabled={pending} className="w-full">
        {pending ? 'Sending…' : 'Ask the dealer'}
      </Button>
      <p className="text-xs text-ink-muted">The review clock pauses until the dealer sends the items; the dealer gets an e-mail with the checklist.</p>
    </form>
  );
}

function DenyForm({ claimId, version, appealDays, denialReasons }: Props) {
  const [reason, setReason] = useState('');
  const [text, setText] = useState('');
  const { send, pending, message, errors } = useSend(claimId);
  return (
    <form
      data-testid="deny-form"
      className="space-y-4"
      onSubmit={(e) => {
        e.preventDefault();
        if (!window.confirm('Deny this claim? The dealer may appeal once.')) return;
        void send({ type: 'DENY', version, reasonCode: reason, message: text });
      }}
    >
      <div>
        <label className="field-label" htmlFor="deny-reason">
          Reason
        </label>
        <select id="deny-reason" className="field-input" value={reason} onChange={(e) => setReason(e.target.value)}>
          <option value="">Choose a reason…</option>
          {denialReasons.map((r) => (
            <option key={r.value} value={r.value}>
              {r.label}
            </option>
          ))}
        </select>
        <FieldErrors errors={errors} name="reasonCode" />
      </div>
      <div>
        <label className="field-label" htmlFor="deny-message">
          Message to the dealer
        </label>
        <textarea id="deny-message" rows={3} className="field-input" value={text} onChange={(e) => setText(e.target.value)} placeholder="What you found, in a sentence or two." />
        <FieldErrors errors={errors} name="message" />
      </div>
      {message ? <Notice tone="danger">{message}</Notice> : null}
      <Button type="submit" variant="danger" disabled={pending} className="w-full">
        {pending ? 'Denying…' : 'Deny the claim'}
      </Button>
      <p className="text-xs text-ink-muted">The dealer may appeal once within {appealDays} days, with a message and new evidence; another rep reviews the appeal.</p>
    </form>
  );
}
