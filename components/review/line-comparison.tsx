import { Badge } from '@/components/ui/badge';
import { formatMoney, type CurrencyCode } from '@/lib/money';
import type { LineComparison, LineStatus } from '@/lib/review';

const STATUS: Record<LineStatus, { label: string; tone: 'charge' | 'volt' | 'fault' }> = {
  as_requested: { label: 'as requested', tone: 'charge' },
  changed: { label: 'changed', tone: 'volt' },
  not_approved: { label: 'not approved', tone: 'fault' },
};

/** What was asked for against what was approved, line by line. */
export function LineComparisonTable({ lines, currency }: { lines: LineComparison[]; currency: string }) {
  const money = (m: number) => formatMoney(m, currency as CurrencyCode);
  return (
    <table className="w-full text-left text-sm" data-testid="line-comparison">
      <thead className="text-xs uppercase tracking-wide text-ink-muted">
        <tr>
          <th className="py-1 pr-3">Line</th>
          <th className="py-1 pr-3">Asked for</th>
          <th className="py-1 pr-3">Approved</th>
          <th className="py-1" />
        </tr>
      </thead>
      <tbody>
        {lines.map((l) => (
          <tr key={l.lineId} className="border-t border-paper-line align-top" data-testid="compared-line" data-status={l.status}>
            {l.kind === 'part' ? (
              <>
                <td className="py-2 pr-3">
                  <span className="font-mono text-xs">{l.partNumber}</span> {l.name}
                </td>
                <td className="figure py-2 pr-3">× {l.requestedQuantity}</td>
                <td className="figure py-2 pr-3">{l.status === 'not_approved' ? '—' : `× ${l.approvedQuantity}`}</td>
              </>
            ) : l.kind === 'labor' ? (
              <>
                <td className="py-2 pr-3">
                  Labor <span className="font-mono text-xs">{l.requested.code}</span>
                  <span className="block text-xs text-ink-muted">{l.requested.description}</span>
                </td>
                <td className="figure py-2 pr-3">{l.requested.hours} h</td>
                <td className="figure py-2 pr-3">
                  {l.approved === null ? '—' : l.approved.code === l.requested.code ? `${l.approved.hours} h` : `${l.approved.code} ${l.approved.hours} h`}
                </td>
              </>
            ) : (
              <>
                <td className="py-2 pr-3">Freight</td>
                <td className="figure py-2 pr-3">{money(l.requestedMinor)}</td>
                <td className="figure py-2 pr-3">{l.status === 'not_approved' ? '—' : money(l.approvedMinor)}</td>
              </>
            )}
            <td className="py-2 text-right">
              <Badge tone={STATUS[l.status].tone}>{STATUS[l.status].label}</Badge>
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
