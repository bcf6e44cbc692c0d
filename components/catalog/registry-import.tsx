'use client';

import clsx from 'clsx';
import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useDropzone } from 'react-dropzone';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import type { RegistryColumn } from '@/lib/registry';
import type { RegistryImportResult, RegistryPreview } from '@/lib/services/registry';

type Phase =
  | { kind: 'idle' }
  | { kind: 'reading'; file: File }
  | { kind: 'preview'; file: File; preview: RegistryPreview; note?: string }
  | { kind: 'importing'; file: File; preview: RegistryPreview }
  | { kind: 'done'; result: RegistryImportResult };

type Filter = 'all' | 'refused' | 'ready';
const SHOWN_MAX = 500;
const COLUMNS: { key: RegistryColumn; label: string }[] = [
  { key: 'frame_serial', label: 'Frame serial' },
  { key: 'model_code', label: 'Model' },
  { key: 'retail_sale_date', label: 'Sold' },
  { key: 'selling_dealer_account', label: 'Shop account' },
  { key: 'component_serials', label: 'Components' },
];

const fileForm = (file: File, extra: Record<string, string> = {}) => {
  const f = new FormData();
  f.set('file', file);
  for (const [k, v] of Object.entries(extra)) f.set(k, v);
  return f;
};

/** Upload → preview with each row's status → confirm; the server writes only on confirmation. */
export function RegistryImport() {
  const router = useRouter();
  const [phase, setPhase] = useState<Phase>({ kind: 'idle' });
  const [error, setError] = useState<string | null>(null);
  const [filter, setFilter] = useState<Filter>('all');

  async function read(file: File) {
    setError(null);
    setFilter('all');
    setPhase({ kind: 'reading', file });
    try {
      const res = await fetch('/api/registry/imports/preview', { method: 'POST', body: fileForm(file) });
      const body = await res.json();
      if (!res.ok) {
        setError(body.error ?? 'The file could not be read.');
        return setPhase({ kind: 'idle' });
      }
      setPhase({ kind: 'preview', file, preview: body as RegistryPreview });
    } catch {
      setError('The connection failed while sending the file; nothing was saved. Try again.');
      setPhase({ kind: 'idle' });
    }
  }

  async function confirm(file: File, preview: RegistryPreview) {
    setError(null);
    setPhase({ kind: 'importing', file, preview });
    try {
      const res = await fetch('/api/registry/imports', { method: 'POST', body: fileForm(file, { sha256: preview.sha256, readyKey: preview.readyKey }) });
      const body = await res.json();
      if (res.status === 409 && body.preview) return setPhase({ kind: 'preview', file, preview: body.preview, note: body.error });
      if (!res.ok) {
        setError(body.error ?? 'The import failed; nothing was saved.');
        return setPhase({ kind: 'preview', file, preview });
      }
      setPhase({ kind: 'done', result: body as RegistryImportResult });
      router.refresh();
    } catch {
      setError('The connection failed during the import. Reload the registry to see whether it went through before trying again.');
      setPhase({ kind: 'preview', file, preview });
    }
  }

  const { getRootProps, getInputProps, isDragActive } = useDropzone({
    multiple: false,
    onDrop: (files) => files[0] && read(files[0]),
    disabled: phase.kind === 'reading' || phase.kind === 'importing',
  });

  const dropzone = (
    <div
      {...getRootProps()}
      data-testid="registry-dropzone"
      className={clsx(
        'flex cursor-pointer flex-col items-center justify-center gap-1 rounded-card border-2 border-dashed px-6 py-8 text-center',
        isDragActive ? 'border-charge-500 bg-charge-50' : 'border-paper-line bg-paper hover:border-charge-300',
      )}
    >
      <input {...getInputProps()} aria-label="Registry CSV file" />
      <p className="font-bold">{phase.kind === 'reading' ? `Reading ${phase.file.name}…` : 'Drop the registry CSV here, or click to choose it'}</p>
      <p className="text-sm text-ink-muted">The file is checked first; nothing is saved yet.</p>
    </div>
  );

  if (phase.kind === 'done') {
    return (
      <div className="space-y-4">
        <Notice tone="success" title="Import done">
          {phase.result.message} <Link href="/catalog/registry" className="font-bold underline">See the registry</Link>
        </Notice>
        <Button variant="secondary" onClick={() => setPhase({ kind: 'idle' })}>Import another file</Button>
      </div>
    );
  }

  if (phase.kind === 'preview' || phase.kind === 'importing') {
    const { preview, file } = phase;
    const rows = preview.rows.filter((r) => filter === 'all' || r.status === filter);
    return (
      <div className="space-y-4" data-testid="registry-preview">
        {phase.kind === 'preview' && phase.note ? <Notice tone="warning">{phase.note}</Notice> : null}
        {error ? <Notice tone="danger">{error}</Notice> : null}
        {preview.importedBefore ? (
          <Notice tone="warning">
            This exact file was imported on {new Date(preview.importedBefore.at).toLocaleString('en-GB')} by {preview.importedBefore.by} ({preview.importedBefore.added} bikes).
          </Notice>
        ) : null}
        <div className="flex flex-wrap items-center gap-3">
          <p className="text-sm">
            <b>{preview.fileName}</b>: {preview.total} row{preview.total === 1 ? '' : 's'} —{' '}
            <span className="font-bold text-charge-700" data-testid="ready-count">{preview.ready} ready</span>,{' '}
            <span className={clsx('font-bold', preview.refused ? 'text-fault-700' : 'text-ink-muted')} data-testid="refused-count">{preview.refused} refused</span>
          </p>
          <div role="group" aria-label="Show rows" className="ml-auto flex gap-1">
            {(['all', 'refused', 'ready'] as Filter[]).map((f) => (
              <button
                key={f}
                type="button"
                aria-pressed={filter === f}
                onClick={() => setFilter(f)}
                className={`rounded-full border px-3 py-1 text-sm ${filter === f ? 'border-ink bg-ink text-paper' : 'border-paper-line bg-paper-raised hover:bg-paper-sunk'}`}
              >
                {f === 'all' ? 'All rows' : f === 'refused' ? 'Refused' : 'Ready'}
              </button>
            ))}
          </div>
        </div>
        <div className="overflow-x-auto rounded-card border border-paper-line">
          <table className="w-full text-left text-sm" data-testid="preview-table">
            <thead className="bg-paper-sunk text-xs uppercase tracking-wide text-ink-muted">
              <tr>
                <th className="px-3 py-2">Row</th>
                {COLUMNS.map((c) => <th key={c.key} className="px-3 py-2">{c.label}</th>)}
                <th className="px-3 py-2">Status</th>
              </tr>
            </thead>
            <tbody>
              {rows.slice(0, SHOWN_MAX).map((r) => {
                const bad = new Set(r.problems.map((p) => p.column));
                return (
                  <tr key={r.row} className={clsx('border-t border-paper-line align-top', r.status === 'refused' && 'bg-fault-50/50')} data-testid={`preview-row-${r.row}`}>
                    <td className="figure px-3 py-2 text-ink-muted">{r.row}</td>
                    {COLUMNS.map((c) => (
                      <td key={c.key} className={clsx('px-3 py-2 font-mono text-xs', bad.has(c.key) && 'font-bold text-fault-700')}>{r.fields[c.key] || <span className="text-ink-faint">—</span>}</td>
                    ))}
                    <td className="px-3 py-2">
                      {r.status === 'ready' ? <Badge tone="charge">Ready</Badge> : <Badge tone="fault">Refused</Badge>}
                      {r.problems.map((p) => <p key={p.message} className="mt-1 text-xs text-fault-700">{p.message}</p>)}
                    </td>
                  </tr>
                );
              })}
              {rows.length === 0 ? <tr><td colSpan={COLUMNS.length + 2} className="px-3 py-6 text-center text-ink-muted">No rows of this kind.</td></tr> : null}
            </tbody>
          </table>
        </div>
        {rows.length > SHOWN_MAX ? <p className="text-xs text-ink-muted">Showing the first {SHOWN_MAX} of {rows.length} rows.</p> : null}
        <div className="flex flex-wrap items-center gap-3">
          <Button onClick={() => confirm(file, preview)} disabled={preview.ready === 0 || phase.kind === 'importing'}>
            {phase.kind === 'importing' ? 'Importing…' : `Import ${preview.ready} ready row${preview.ready === 1 ? '' : 's'}`}
          </Button>
          <Button variant="secondary" onClick={() => setPhase({ kind: 'idle' })} disabled={phase.kind === 'importing'}>Choose another file</Button>
          <p className="text-sm text-ink-muted">
            {preview.refused ? `Refused rows are left out; fix them in the file and import it again later.` : 'Every row is ready.'}
          </p>
        </div>
      </div>
    );
  }

  return (
    <div className="space-y-3">
      {error ? <Notice tone="danger">{error}</Notice> : null}
      {dropzone}
    </div>
  );
}
