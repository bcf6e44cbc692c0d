import type { Metadata } from 'next';
import Link from 'next/link';
import { LaborForm } from '@/components/catalog/labor-form';
import { Badge } from '@/components/ui/badge';
import { requireRole } from '@/lib/auth/session';
import { CATEGORY_NAMES } from '@/lib/catalog';
import { listLaborOperations } from '@/lib/db/catalog';

export const metadata: Metadata = { title: 'Labor times · Catalog' };

export default async function LaborPage({ searchParams }: { searchParams: Promise<{ edit?: string }> }) {
  const user = await requireRole('brand_admin');
  const { edit } = await searchParams;
  const ops = await listLaborOperations(user.organisationId);
  const editing = edit ? ops.find((o) => o.id === edit) : undefined;
  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
      <section className="card self-start overflow-x-auto">
        <table className="w-full text-left text-sm" data-testid="labor-table">
          <thead className="bg-paper-sunk text-xs uppercase tracking-wide text-ink-muted">
            <tr>
              <th className="px-4 py-2">Code</th>
              <th className="px-4 py-2">Operation</th>
              <th className="px-4 py-2">For</th>
              <th className="px-4 py-2 text-right">Standard hours</th>
              <th className="px-4 py-2" />
            </tr>
          </thead>
          <tbody>
            {ops.map((o) => (
              <tr key={o.id} className={`border-t border-paper-line ${o.id === edit ? 'bg-charge-50' : ''}`}>
                <td className="px-4 py-3 font-mono text-xs font-bold">{o.code}</td>
                <td className="px-4 py-3">{o.description} {!o.active ? <Badge className="ml-1">Not offered</Badge> : null}</td>
                <td className="px-4 py-3 text-ink-soft">{o.category ? CATEGORY_NAMES[o.category] : 'Any part'}</td>
                <td className="figure px-4 py-3 text-right">{o.standardHours} h</td>
                <td className="px-4 py-3 text-right">
                  <Link href={`/catalog/labor?edit=${o.id}`} className="font-bold text-charge-700 hover:underline" aria-label={`Edit ${o.code}`}>Edit</Link>
                </td>
              </tr>
            ))}
            {ops.length === 0 ? <tr><td colSpan={5} className="px-4 py-8 text-center text-ink-muted">No operations yet.</td></tr> : null}
          </tbody>
        </table>
        <p className="border-t border-paper-line px-4 py-2 text-xs text-ink-muted">
          A credit pays standard hours × the dealer’s agreed rate, capped by your maximum rate.
        </p>
      </section>
      <section className="card self-start p-5">
        <h2 className="mb-4">{editing ? `Edit ${editing.code}` : 'New operation'}</h2>
        <LaborForm key={editing?.id ?? 'new'} operation={editing} />
      </section>
    </div>
  );
}
