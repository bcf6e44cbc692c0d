import type { Metadata } from 'next';
import Link from 'next/link';
import { StockEditor } from '@/components/fulfilment/stock-editor';
import { PageHeader } from '@/components/ui/page-header';
import { requireRole } from '@/lib/auth/session';
import { listMovements, listStock } from '@/lib/db/stock';
import { ADJUSTMENT_REASON_LABELS, ADJUSTMENT_REASONS, type AdjustmentReason } from '@/lib/fulfilment/stock';
import { formatDateTime, formatDay } from '@/lib/format/dates';

export const metadata: Metadata = { title: 'Stock' };

function reasonText(kind: string, reason: string, expectedOn: string | null): string {
  if (kind === 'expected_date') return expectedOn ? `More expected on ${formatDay(expectedOn)}` : 'Expected date cleared';
  if ((ADJUSTMENT_REASONS as readonly string[]).includes(reason)) return ADJUSTMENT_REASON_LABELS[reason as AdjustmentReason];
  return reason.charAt(0).toUpperCase() + reason.slice(1);
}

export default async function StockPage() {
  const user = await requireRole('warehouse');
  const [lines, movements] = await Promise.all([listStock(user.organisationId), listMovements(user.organisationId, { limit: 40 })]);
  return (
    <div className="space-y-8">
      <PageHeader title="Stock" lead="Replacement parts on the shelf. A shipment takes its parts in the same step; every change is logged below." />
      <StockEditor lines={lines.map((l) => ({ partId: l.partId, partNumber: l.partNumber, name: l.name, category: l.category, onHand: l.onHand, waiting: l.waiting, restockExpectedOn: l.restockExpectedOn }))} />
      <section className="space-y-3">
        <h2>Latest changes</h2>
        <div className="card overflow-x-auto">
          <table className="w-full text-left text-sm" data-testid="stock-log">
            <thead className="bg-paper-sunk text-xs uppercase tracking-wide text-ink-muted">
              <tr>
                <th className="px-3 py-2">When</th>
                <th className="px-3 py-2">Part</th>
                <th className="px-3 py-2 text-right">Change</th>
                <th className="px-3 py-2 text-right">After</th>
                <th className="px-3 py-2">Why</th>
                <th className="px-3 py-2">Who</th>
              </tr>
            </thead>
            <tbody>
              {movements.map((m) => (
                <tr key={m.id} className="border-t border-paper-line">
                  <td className="px-3 py-2 text-ink-muted">{formatDateTime(m.createdAt, user.timeZone)}</td>
                  <td className="px-3 py-2 font-mono">{m.partNumber}</td>
                  <td className={`figure px-3 py-2 text-right ${m.delta < 0 ? 'text-fault-700' : m.delta > 0 ? 'text-charge-700' : ''}`}>{m.delta > 0 ? `+${m.delta}` : m.delta === 0 ? '—' : m.delta}</td>
                  <td className="figure px-3 py-2 text-right">{m.onHandAfter}</td>
                  <td className="px-3 py-2">
                    {reasonText(m.kind, m.reason, m.expectedOn)}
                    {m.claimId ? <> · <Link className="font-mono underline" href={`/warehouse/claims/${m.claimId}`}>{m.claimNumber}</Link></> : null}
                    {m.note ? <span className="block text-xs text-ink-muted">{m.note}</span> : null}
                  </td>
                  <td className="px-3 py-2 text-ink-soft">{m.userName ?? 'Loadproof'}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </section>
    </div>
  );
}
