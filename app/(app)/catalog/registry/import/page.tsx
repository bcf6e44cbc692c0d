import type { Metadata } from 'next';
import { RegistryImport } from '@/components/catalog/registry-import';
import { requireRole } from '@/lib/auth/session';
import { REGISTRY_COLUMNS, REGISTRY_LIMITS, sampleRegistryCsv } from '@/lib/registry';

export const metadata: Metadata = { title: 'Import the registry · Catalog' };

export default async function RegistryImportPage() {
  await requireRole('brand_admin');
  const sample = `data:text/csv;charset=utf-8,${encodeURIComponent(sampleRegistryCsv())}`;
  return (
    <div className="space-y-6">
      <section className="card p-5">
        <h2 className="mb-1">Import sold bikes</h2>
        <p className="mb-4 max-w-3xl text-sm text-ink-muted">
          A registered bike needs no receipt when a shop files a claim: its model, sale date and component serials come from
          here. Upload a CSV file, check the preview row by row, then import the rows that are ready. Nothing is saved until you
          confirm, and then all ready rows are saved together or none.
        </p>
        <RegistryImport />
      </section>
      <section className="card overflow-x-auto p-5">
        <h2 className="mb-1 text-base">File layout</h2>
        <p className="mb-3 text-sm text-ink-muted">
          Comma-separated, UTF-8, the column names in the first row (any order). Up to {REGISTRY_LIMITS.maxRows.toLocaleString('en-GB')} rows and{' '}
          {REGISTRY_LIMITS.maxBytes / 1024 / 1024} MB a file. <a href={sample} download="registry-layout.csv" className="font-bold text-charge-700 underline">Download a sample</a>
        </p>
        <table className="w-full text-left text-sm">
          <thead className="text-xs uppercase tracking-wide text-ink-muted">
            <tr>
              <th className="py-1 pr-4">Column</th>
              <th className="py-1 pr-4">Needed</th>
              <th className="py-1 pr-4">Example</th>
              <th className="py-1">Rule</th>
            </tr>
          </thead>
          <tbody>
            {REGISTRY_COLUMNS.map((c) => (
              <tr key={c.name} className="border-t border-paper-line align-top">
                <td className="py-2 pr-4 font-mono text-xs font-bold">{c.name}</td>
                <td className="py-2 pr-4">{c.required ? 'yes' : 'optional'}</td>
                <td className="py-2 pr-4 font-mono text-xs">{c.example}</td>
                <td className="py-2 text-ink-soft">{c.description}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>
    </div>
  );
}
