import type { Metadata } from 'next';
import Link from 'next/link';
import { LaborRateForm } from '@/components/catalog/labor-rate-form';
import { Badge } from '@/components/ui/badge';
import { requireRole } from '@/lib/auth/session';
import { brandSettings } from '@/lib/db/catalog';
import { brandDealerList } from '@/lib/db/dealer-accounts';
import { formatMoney, toDecimalString, type CurrencyCode } from '@/lib/money';

export const metadata: Metadata = { title: 'Dealers · Catalog' };

export default async function DealersPage({ searchParams }: { searchParams: Promise<{ edit?: string }> }) {
  const user = await requireRole('brand_admin');
  const { edit } = await searchParams;
  const [dealers, brand] = await Promise.all([brandDealerList(user.organisationId), brandSettings(user.organisationId)]);
  const currency = (brand?.currency ?? 'EUR') as CurrencyCode;
  const cap = brand?.maxLaborRateMinor ?? 0;
  const money = (m: number) => formatMoney(m, currency);
  const editing = edit ? dealers.find((d) => d.id === edit) : undefined;
  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
      <section className="card self-start overflow-x-auto">
        <table className="w-full text-left text-sm" data-testid="dealers-table">
          <thead className="bg-paper-sunk text-xs uppercase tracking-wide text-ink-muted">
            <tr>
              <th className="px-4 py-2">Shop</th>
              <th className="px-4 py-2">Account</th>
              <th className="px-4 py-2 text-right">Labor rate</th>
              <th className="px-4 py-2 text-right">Claims</th>
              <th className="px-4 py-2" />
            </tr>
          </thead>
          <tbody>
            {dealers.map((d) => (
              <tr key={d.id} className={`border-t border-paper-line ${d.id === edit ? 'bg-charge-50' : ''}`}>
                <td className="px-4 py-3">
                  <span className="font-bold">{d.dealerName}</span>
                  <span className="block text-xs text-ink-muted">{[d.city, d.country].filter(Boolean).join(', ')}</span>
                </td>
                <td className="px-4 py-3 font-mono text-xs">{d.accountNumber}</td>
                <td className="figure px-4 py-3 text-right">
                  {money(d.laborRateMinor)}/h
                  {d.laborRateMinor > cap ? <Badge tone="volt" className="ml-2">paid at cap</Badge> : null}
                </td>
                <td className="figure px-4 py-3 text-right">{d.claims}</td>
                <td className="px-4 py-3 text-right">
                  <Link href={`/catalog/dealers?edit=${d.id}`} className="font-bold text-charge-700 hover:underline" aria-label={`Change the labor rate of ${d.dealerName}`}>Change rate</Link>
                </td>
              </tr>
            ))}
            {dealers.length === 0 ? <tr><td colSpan={5} className="px-4 py-8 text-center text-ink-muted">No dealer accounts yet.</td></tr> : null}
          </tbody>
        </table>
        <p className="border-t border-paper-line px-4 py-2 text-xs text-ink-muted">Your maximum labor rate: {money(cap)} an hour. Opening a new dealer account is not done on this screen.</p>
      </section>
      <section className="card self-start p-5">
        {editing ? (
          <>
            <h2 className="mb-4">{editing.dealerName}</h2>
            <LaborRateForm key={editing.id} accountId={editing.id} dealerName={editing.dealerName} rate={toDecimalString(editing.laborRateMinor, currency)} currency={currency} cap={money(cap)} />
          </>
        ) : (
          <>
            <h2 className="mb-2">Agreed labor rates</h2>
            <p className="text-sm text-ink-muted">Choose a shop to change the hourly rate its labor credits are paid at.</p>
          </>
        )}
      </section>
    </div>
  );
}
