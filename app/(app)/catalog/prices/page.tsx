import type { Metadata } from 'next';
import { PriceForm } from '@/components/catalog/price-form';
import { requireRole } from '@/lib/auth/session';
import { localDate } from '@/lib/calendar';
import { brandSettings, listParts, priceHistory } from '@/lib/db/catalog';
import { formatDay } from '@/lib/format/dates';
import { formatMoney, type CurrencyCode } from '@/lib/money';

export const metadata: Metadata = { title: 'Dealer prices · Catalog' };

export default async function PricesPage() {
  const user = await requireRole('brand_admin');
  const today = localDate(new Date().toISOString(), user.timeZone);
  const [parts, brand, history] = await Promise.all([listParts(user.organisationId), brandSettings(user.organisationId), priceHistory(user.organisationId)]);
  const currency = (brand?.currency ?? 'EUR') as CurrencyCode;
  const money = (m: number) => formatMoney(m, currency);
  const byPart = new Map<string, typeof history>();
  for (const h of history) byPart.set(h.partId, [...(byPart.get(h.partId) ?? []), h]);

  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
      <section className="card self-start overflow-x-auto">
        <table className="w-full text-left text-sm" data-testid="prices-table">
          <thead className="bg-paper-sunk text-xs uppercase tracking-wide text-ink-muted">
            <tr>
              <th className="px-4 py-2">Part</th>
              <th className="px-4 py-2 text-right">Net price today</th>
              <th className="px-4 py-2">Since</th>
              <th className="px-4 py-2">Scheduled and earlier</th>
            </tr>
          </thead>
          <tbody>
            {parts.map((p) => {
              const entries = byPart.get(p.id) ?? [];
              const current = entries.find((e) => e.effectiveFrom <= today);
              const others = entries.filter((e) => e !== current);
              return (
                <tr key={p.id} className="border-t border-paper-line align-top" data-testid={`price-${p.partNumber}`}>
                  <td className="px-4 py-3">
                    <span className="font-mono text-xs font-bold">{p.partNumber}</span>
                    <span className="block text-ink-soft">{p.name}</span>
                  </td>
                  <td className="figure px-4 py-3 text-right font-bold">{current ? money(current.netPriceMinor) : <span className="font-normal text-ink-faint">none</span>}</td>
                  <td className="px-4 py-3">{current ? formatDay(current.effectiveFrom) : '—'}</td>
                  <td className="px-4 py-3 text-xs text-ink-muted">
                    {others.map((e) => (
                      <span key={e.id} className="block">
                        <span className="figure">{money(e.netPriceMinor)}</span> from {formatDay(e.effectiveFrom)}
                        {e.effectiveFrom > today ? ' (scheduled)' : ''}
                      </span>
                    ))}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
        <p className="border-t border-paper-line px-4 py-2 text-xs text-ink-muted">Amounts are exact, in {currency}.</p>
      </section>
      <section className="card self-start p-5">
        <h2 className="mb-4">New price</h2>
        <PriceForm parts={parts.map((p) => ({ id: p.id, label: `${p.partNumber} — ${p.name}` }))} currency={currency} today={today} />
      </section>
    </div>
  );
}
