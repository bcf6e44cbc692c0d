'use client';

import { useRouter } from 'next/navigation';
import { Fragment, useState } from 'react';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { ADJUSTMENT_REASONS, ADJUSTMENT_REASON_LABELS, adjustmentProblem, type AdjustmentReason } from '@/lib/fulfilment/stock';
import { formatDay } from '@/lib/format/dates';

export type StockLine = { partId: string; partNumber: string; name: string; category: string; onHand: number; waiting: number; restockExpectedOn: string | null };

function AdjustForm({ line, onDone }: { line: StockLine; onDone: () => void }) {
  const router = useRouter();
  const [delta, setDelta] = useState('');
  const [reason, setReason] = useState<AdjustmentReason>('delivery_received');
  const [note, setNote] = useState('');
  const [expected, setExpected] = useState(line.restockExpectedOn ?? '');
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const local = delta.trim() ? adjustmentProblem(reason, Number(delta), note) : null;

  async function post(method: 'POST' | 'PUT', body: unknown) {
    setBusy(true);
    setError(null);
    const res = await fetch(`/api/warehouse/stock/${line.partId}`, { method, headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
    const data = await res.json().catch(() => ({}));
    setBusy(false);
    if (!res.ok) return setError(data.fieldErrors ? (Object.values(data.fieldErrors as Record<string, string[]>)[0]?.[0] ?? data.error) : data.error ?? 'Not saved.');
    router.refresh();
    onDone();
  }

  return (
    <div className="grid gap-4 rounded-md bg-paper p-3 md:grid-cols-2" data-testid={`adjust-${line.partNumber}`}>
      <form
        className="space-y-2"
        onSubmit={(e) => {
          e.preventDefault();
          void post('POST', { delta: Number(delta), reason, note, expectedOnHand: line.onHand });
        }}
      >
        <p className="text-sm font-bold">Change the quantity</p>
        <div className="flex gap-2">
          <label className="sr-only" htmlFor={`delta-${line.partId}`}>Change by</label>
          <input id={`delta-${line.partId}`} className="field-input w-28 font-mono" inputMode="numeric" placeholder="+5 or -2" value={delta} onChange={(e) => setDelta(e.target.value)} />
          <label className="sr-only" htmlFor={`reason-${line.partId}`}>Reason</label>
          <select id={`reason-${line.partId}`} className="field-input" value={reason} onChange={(e) => setReason(e.target.value as AdjustmentReason)}>
            {ADJUSTMENT_REASONS.map((r) => (
              <option key={r} value={r}>{ADJUSTMENT_REASON_LABELS[r]}</option>
            ))}
          </select>
        </div>
        <label className="sr-only" htmlFor={`note-${line.partId}`}>Note</label>
        <input id={`note-${line.partId}`} className="field-input" placeholder="Note (delivery number, count sheet…)" value={note} onChange={(e) => setNote(e.target.value)} />
        {local ? <p className="text-xs text-fault-700">{local}</p> : null}
        <Button type="submit" disabled={busy || !delta.trim() || local !== null}>Save the change</Button>
      </form>
      <form
        className="space-y-2"
        onSubmit={(e) => {
          e.preventDefault();
          void post('PUT', { expectedOn: expected });
        }}
      >
        <p className="text-sm font-bold">More expected on</p>
        <label className="sr-only" htmlFor={`expected-${line.partId}`}>Expected date</label>
        <input id={`expected-${line.partId}`} type="date" className="field-input w-48" value={expected} onChange={(e) => setExpected(e.target.value)} />
        <p className="text-xs text-ink-muted">Dealers waiting for this part see the date on their claims.</p>
        <Button type="submit" variant="secondary" disabled={busy}>Save the date</Button>
      </form>
      {error ? <p className="text-sm text-fault-700 md:col-span-2" role="alert">{error}</p> : null}
    </div>
  );
}

/** The brand's parts: on the shelf, waiting on approved claims, and the date more comes; each row adjustable. */
export function StockEditor({ lines }: { lines: StockLine[] }) {
  const [open, setOpen] = useState<string | null>(null);
  return (
    <div className="card overflow-x-auto">
      <table className="w-full text-left text-sm" data-testid="stock-table">
        <thead className="bg-paper-sunk text-xs uppercase tracking-wide text-ink-muted">
          <tr>
            <th className="px-3 py-2">Part</th>
            <th className="px-3 py-2 text-right">On hand</th>
            <th className="px-3 py-2 text-right">Waiting to ship</th>
            <th className="px-3 py-2">Standing</th>
            <th className="px-3 py-2">More expected</th>
            <th className="px-3 py-2" />
          </tr>
        </thead>
        <tbody>
          {lines.map((l) => (
            <Fragment key={l.partId}>
              <tr className="border-t border-paper-line" data-part={l.partNumber}>
                <td className="px-3 py-2"><span className="font-mono font-bold">{l.partNumber}</span> <span className="text-ink-soft">{l.name}</span></td>
                <td className="figure px-3 py-2 text-right" data-testid="on-hand">{l.onHand}</td>
                <td className="figure px-3 py-2 text-right">{l.waiting}</td>
                <td className="px-3 py-2">
                  {l.waiting > l.onHand ? <Badge tone="volt">Short by {l.waiting - l.onHand}</Badge> : l.onHand === 0 ? <Badge>None on hand</Badge> : <Badge tone="charge">Covers demand</Badge>}
                </td>
                <td className="px-3 py-2">{l.restockExpectedOn ? formatDay(l.restockExpectedOn) : '—'}</td>
                <td className="px-3 py-2 text-right">
                  <button type="button" className="font-bold text-charge-700 hover:underline" onClick={() => setOpen(open === l.partId ? null : l.partId)} aria-expanded={open === l.partId}>
                    {open === l.partId ? 'Close' : 'Adjust'}
                  </button>
                </td>
              </tr>
              {open === l.partId ? (
                <tr>
                  <td colSpan={6} className="px-3 pb-3">
                    <AdjustForm line={l} onDone={() => setOpen(null)} />
                  </td>
                </tr>
              ) : null}
            </Fragment>
          ))}
        </tbody>
      </table>
    </div>
  );
}
