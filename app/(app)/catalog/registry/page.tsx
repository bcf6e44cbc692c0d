import type { Metadata } from 'next';
import Link from 'next/link';
import { ButtonLink } from '@/components/ui/button';
import { requireRole } from '@/lib/auth/session';
import { listRegistryImports, searchRegisteredUnits } from '@/lib/db/catalog';
import { formatDateTime, formatDay } from '@/lib/format/dates';
import { formatComponentList } from '@/lib/registry';
import { registryQuerySchema } from '@/lib/validation/catalog';

export const metadata: Metadata = { title: 'Registry · Catalog' };

const PAGE_SIZE = 50;

export default async function RegistryPage({ searchParams }: { searchParams: Promise<Record<string, string | undefined>> }) {
  const user = await requireRole('brand_admin');
  const { q, page } = registryQuerySchema.parse(await searchParams);
  const [{ rows, total }, imports] = await Promise.all([
    searchRegisteredUnits(user.organisationId, { q, page, pageSize: PAGE_SIZE }),
    listRegistryImports(user.organisationId, 5),
  ]);
  const pages = Math.max(1, Math.ceil(total / PAGE_SIZE));
  const href = (p: number) => `/catalog/registry?${new URLSearchParams({ ...(q ? { q } : {}), page: String(p) })}`;

  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-end gap-3">
        <form className="flex flex-1 gap-2" role="search" action="/catalog/registry">
          <input type="search" name="q" defaultValue={q} placeholder="Frame or component serial, model, shop" aria-label="Search the registry" className="field-input max-w-md" />
          <button type="submit" className="rounded-md border border-paper-line bg-paper-raised px-4 text-sm font-bold hover:bg-paper-sunk">Search</button>
          {q ? <Link href="/catalog/registry" className="self-center text-sm text-charge-700 underline">Clear</Link> : null}
        </form>
        <ButtonLink href="/catalog/registry/import">Import from CSV</ButtonLink>
      </div>

      <section className="card overflow-x-auto">
        <table className="w-full text-left text-sm" data-testid="registry-table">
          <thead className="bg-paper-sunk text-xs uppercase tracking-wide text-ink-muted">
            <tr>
              <th className="px-4 py-2">Frame serial</th>
              <th className="px-4 py-2">Model</th>
              <th className="px-4 py-2">Sold</th>
              <th className="px-4 py-2">Selling shop</th>
              <th className="px-4 py-2">Component serials</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((u) => (
              <tr key={u.id} className="border-t border-paper-line" data-testid={`unit-${u.frameSerial}`}>
                <td className="px-4 py-2 font-mono text-xs font-bold">{u.frameSerial}</td>
                <td className="px-4 py-2">{u.modelName} <span className="font-mono text-xs text-ink-muted">{u.modelCode}</span></td>
                <td className="px-4 py-2">{formatDay(u.retailSaleDate)}</td>
                <td className="px-4 py-2">{u.sellingDealerName ?? <span className="text-ink-faint">—</span>}</td>
                <td className="px-4 py-2 font-mono text-xs text-ink-soft">{formatComponentList(u.componentSerials).replaceAll(';', '; ') || '—'}</td>
              </tr>
            ))}
            {rows.length === 0 ? (
              <tr><td colSpan={5} className="px-4 py-8 text-center text-ink-muted">{q ? `Nothing registered matches “${q}”.` : 'No bikes registered yet.'}</td></tr>
            ) : null}
          </tbody>
        </table>
      </section>
      <div className="flex items-center justify-between text-sm text-ink-muted">
        <span>{total} bike{total === 1 ? '' : 's'}{q ? ` matching “${q}”` : ' registered'}</span>
        {pages > 1 ? (
          <span className="flex items-center gap-3">
            {page > 1 ? <Link href={href(page - 1)} className="font-bold text-charge-700">Previous</Link> : null}
            Page {page} of {pages}
            {page < pages ? <Link href={href(page + 1)} className="font-bold text-charge-700">Next</Link> : null}
          </span>
        ) : null}
      </div>

      <section className="card p-5">
        <h2 className="mb-3 text-base">Recent imports</h2>
        {imports.length ? (
          <ul className="space-y-2 text-sm" data-testid="registry-imports">
            {imports.map((i) => (
              <li key={i.id}>
                <span className="font-bold">{i.fileName}</span>: {i.rowsAdded} registered{i.rowsSkipped ? `, ${i.rowsSkipped} left out` : ''} — {i.importedByName},{' '}
                {formatDateTime(i.createdAt, user.timeZone)}
                {i.refusedRows.length ? (
                  <details className="mt-1 text-xs text-ink-muted">
                    <summary className="cursor-pointer">Rows left out</summary>
                    <ul className="mt-1 space-y-0.5 pl-4">
                      {i.refusedRows.map((r) => <li key={r.row}>Row {r.row} ({r.frameSerial || 'no serial'}): {r.problems.join(' ')}</li>)}
                    </ul>
                  </details>
                ) : null}
              </li>
            ))}
          </ul>
        ) : (
          <p className="text-sm text-ink-muted">None yet.</p>
        )}
      </section>
    </div>
  );
}
