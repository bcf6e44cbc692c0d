import type { Metadata } from 'next';
import Link from 'next/link';
import { PartForm } from '@/components/catalog/part-form';
import { Badge } from '@/components/ui/badge';
import { requireRole } from '@/lib/auth/session';
import { localDate } from '@/lib/calendar';
import { batteryEnergy, CATEGORY_NAMES, describeSpec, describeWeight } from '@/lib/catalog';
import { brandSettings, currentPrices, listParts } from '@/lib/db/catalog';
import { formatMoney, type CurrencyCode } from '@/lib/money';

export const metadata: Metadata = { title: 'Parts · Catalog' };

export default async function PartsPage({ searchParams }: { searchParams: Promise<{ edit?: string }> }) {
  const user = await requireRole('brand_admin');
  const { edit } = await searchParams;
  const [parts, brand, prices] = await Promise.all([
    listParts(user.organisationId), brandSettings(user.organisationId), currentPrices(user.organisationId, localDate(new Date().toISOString(), user.timeZone)),
  ]);
  const currency = (brand?.currency ?? 'EUR') as CurrencyCode;
  const price = new Map(prices.map((p) => [p.partId, p.netPriceMinor]));
  const editing = edit ? parts.find((p) => p.id === edit) : undefined;
  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
      <section className="card self-start overflow-x-auto">
        <table className="w-full text-left text-sm" data-testid="parts-table">
          <thead className="bg-paper-sunk text-xs uppercase tracking-wide text-ink-muted">
            <tr>
              <th className="px-4 py-2">Part</th>
              <th className="px-4 py-2">Kind</th>
              <th className="px-4 py-2">Load-test spec</th>
              <th className="px-4 py-2 text-right">Dealer net</th>
              <th className="px-4 py-2" />
            </tr>
          </thead>
          <tbody>
            {parts.map((p) => {
              const spec = describeSpec(p, user.units);
              const energy = batteryEnergy(p.nominalVoltageV, p.ratedCapacityAh);
              const net = price.get(p.id);
              return (
                <tr key={p.id} className={`border-t border-paper-line ${p.id === edit ? 'bg-charge-50' : ''}`} data-testid={`part-${p.partNumber}`}>
                  <td className="px-4 py-3">
                    <span className="font-mono text-xs font-bold">{p.partNumber}</span>
                    <span className="block">{p.name}</span>
                    {!p.active ? <Badge className="mt-1">Not offered</Badge> : null}
                  </td>
                  <td className="px-4 py-3">
                    {CATEGORY_NAMES[p.category]}
                    {p.weightKg !== null ? <span className="block text-xs text-ink-muted">{describeWeight(p.weightKg, user.units)}</span> : null}
                  </td>
                  <td className="px-4 py-3">
                    {spec.length ? spec.map((s) => <span key={s} className="figure block text-xs">{s}</span>) : <span className="text-ink-faint">—</span>}
                    {energy?.fullyRegulated ? <Badge tone="volt" className="mt-1">Class 9 when shipped</Badge> : null}
                  </td>
                  <td className="figure px-4 py-3 text-right">{net !== undefined ? formatMoney(net, currency) : <span className="text-ink-faint">no price</span>}</td>
                  <td className="px-4 py-3 text-right">
                    <Link href={`/catalog/parts?edit=${p.id}`} className="font-bold text-charge-700 hover:underline" aria-label={`Edit ${p.partNumber}`}>Edit</Link>
                  </td>
                </tr>
              );
            })}
            {parts.length === 0 ? <tr><td colSpan={5} className="px-4 py-8 text-center text-ink-muted">No parts yet. Add the first one.</td></tr> : null}
          </tbody>
        </table>
        <p className="border-t border-paper-line px-4 py-2 text-xs text-ink-muted">
          Specs are stored in SI units and shown in yours ({user.units}); switch units in the top bar.
        </p>
      </section>
      <section className="card self-start p-5">
        <h2 className="mb-4">{editing ? `Edit ${editing.partNumber}` : 'New part'}</h2>
        <PartForm key={`${editing?.id ?? 'new'}-${user.units}`} part={editing} units={user.units} currency={currency} />
      </section>
    </div>
  );
}
