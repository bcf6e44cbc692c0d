import type { RequestedLines } from '@/lib/db/claims';
import { formatMoney, type CurrencyCode } from '@/lib/money';

export function RequestedLinesView({ lines, currency }: { lines: RequestedLines; currency: string }) {
  const money = (m: number) => formatMoney(m, currency as CurrencyCode);
  return (
    <table className="w-full text-left text-sm">
      <thead className="text-xs uppercase tracking-wide text-ink-muted">
        <tr>
          <th className="py-1 pr-3">Line</th>
          <th className="py-1 pr-3">What</th>
          <th className="py-1 text-right">Quantity</th>
        </tr>
      </thead>
      <tbody>
        {lines.parts.map((p) => (
          <tr key={p.lineId} className="border-t border-paper-line">
            <td className="py-2 pr-3">Part</td>
            <td className="py-2 pr-3">
              <span className="font-mono text-xs">{p.partNumber}</span> {p.name}
              {p.fromDealerStock ? <span className="ml-2 text-xs text-ink-muted">(fitted from shop stock)</span> : null}
            </td>
            <td className="figure py-2 text-right">× {p.quantity}</td>
          </tr>
        ))}
        {lines.labor.map((l) => (
          <tr key={l.lineId} className="border-t border-paper-line">
            <td className="py-2 pr-3">Labor</td>
            <td className="py-2 pr-3">
              <span className="font-mono text-xs">{l.code}</span> {l.description}
            </td>
            <td className="figure py-2 text-right">{l.hours} h</td>
          </tr>
        ))}
        <tr className="border-t border-paper-line">
          <td className="py-2 pr-3">Freight</td>
          <td className="py-2 pr-3 text-ink-muted">As paid by the shop</td>
          <td className="figure py-2 text-right">{money(lines.freightMinor)}</td>
        </tr>
      </tbody>
    </table>
  );
}
