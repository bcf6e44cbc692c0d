import type { Metadata } from 'next';
import Link from 'next/link';
import { ModelForm } from '@/components/catalog/model-form';
import { Badge } from '@/components/ui/badge';
import { requireRole } from '@/lib/auth/session';
import { LEGAL_CLASS_LABELS } from '@/lib/catalog';
import { listModels } from '@/lib/db/catalog';
import { formatLength, isoCircumferenceM, parseTyreSize } from '@/lib/units';

export const metadata: Metadata = { title: 'Models · Catalog' };

export default async function ModelsPage({ searchParams }: { searchParams: Promise<{ edit?: string }> }) {
  const user = await requireRole('brand_admin');
  const { edit } = await searchParams;
  const models = await listModels(user.organisationId);
  const editing = edit ? models.find((m) => m.id === edit) : undefined;
  const rollout = (tyre: string) => {
    const t = parseTyreSize(tyre);
    return t.ok ? formatLength(isoCircumferenceM(t.tyre), user.units).text : null;
  };
  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
      <section className="card self-start overflow-x-auto">
        <table className="w-full text-left text-sm" data-testid="models-table">
          <thead className="bg-paper-sunk text-xs uppercase tracking-wide text-ink-muted">
            <tr>
              <th className="px-4 py-2">Code</th>
              <th className="px-4 py-2">Model</th>
              <th className="px-4 py-2">Sold as</th>
              <th className="px-4 py-2">Tyre (ISO 5775)</th>
              <th className="px-4 py-2" />
            </tr>
          </thead>
          <tbody>
            {models.map((m) => (
              <tr key={m.id} className={`border-t border-paper-line ${m.id === edit ? 'bg-charge-50' : ''}`}>
                <td className="px-4 py-3 font-mono text-xs">{m.code}</td>
                <td className="px-4 py-3">
                  <span className="font-bold">{m.name}</span> {m.modelYear ? <span className="text-ink-muted">({m.modelYear})</span> : null}
                  {!m.active ? <Badge className="ml-2">Not offered</Badge> : null}
                </td>
                <td className="px-4 py-3">{LEGAL_CLASS_LABELS[m.legalClass]}</td>
                <td className="px-4 py-3">
                  <span className="font-mono">{m.tyreSize}</span>
                  {rollout(m.tyreSize) ? <span className="block text-xs text-ink-muted">roll-out ≈ {rollout(m.tyreSize)} (π × (BSD + 2 × width))</span> : null}
                </td>
                <td className="px-4 py-3 text-right">
                  <Link href={`/catalog/models?edit=${m.id}`} className="font-bold text-charge-700 hover:underline" aria-label={`Edit ${m.name}`}>Edit</Link>
                </td>
              </tr>
            ))}
            {models.length === 0 ? <tr><td colSpan={5} className="px-4 py-8 text-center text-ink-muted">No models yet. Add the first one.</td></tr> : null}
          </tbody>
        </table>
      </section>
      <section className="card self-start p-5">
        <h2 className="mb-4">{editing ? `Edit ${editing.name}` : 'New model'}</h2>
        <ModelForm key={editing?.id ?? 'new'} model={editing} />
      </section>
    </div>
  );
}
