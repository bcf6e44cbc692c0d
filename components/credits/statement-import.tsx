'use client';

import Link from 'next/link';
import Papa from 'papaparse';
import { useRouter } from 'next/navigation';
import { useMemo, useState } from 'react';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { STATEMENT_FIELDS, STATEMENT_FIELD_LABELS, suggestMapping, type HeaderMapping, type StatementField } from '@/lib/reconciliation/suggest-mapping';

type Source = { id: string; name: string; dealerId: string | null; mapping: HeaderMapping; options: Partial<Options> };
type Options = { dateFormat: 'YYYY-MM-DD' | 'DD.MM.YYYY' | 'DD/MM/YYYY' | 'MM/DD/YYYY'; decimalSeparator: '.' | ','; negate: boolean; dateWindowDays: number };
type RowError = { row: number; column?: string; field?: string; message: string };

const DEFAULTS: Options = { dateFormat: 'YYYY-MM-DD', decimalSeparator: '.', negate: false, dateWindowDays: 14 };
const DATE_FORMATS: Options['dateFormat'][] = ['YYYY-MM-DD', 'DD.MM.YYYY', 'DD/MM/YYYY', 'MM/DD/YYYY'];
const MAX_BYTES = 5 * 1024 * 1024;

/**
 * Step 1: the file, where it comes from and whose it is. Step 2: which column is what, guessed
 * from the headers and from what this source used last time. Nothing is stored until the server
 * has read every row; a file with problems comes back with each row's problem.
 */
export function StatementImport({ sources, dealers, currency }: { sources: Source[]; dealers: { id: string; name: string }[]; currency: string }) {
  const router = useRouter();
  const [file, setFile] = useState<{ name: string; text: string } | null>(null);
  const [sourceName, setSourceName] = useState('');
  const [dealerId, setDealerId] = useState<string>('');
  const [mapping, setMapping] = useState<HeaderMapping>({});
  const [options, setOptions] = useState<Options>(DEFAULTS);
  const [pending, setPending] = useState(false);
  const [message, setMessage] = useState<{ text: string; importId?: string } | null>(null);
  const [rowErrors, setRowErrors] = useState<{ errors: RowError[]; count: number } | null>(null);

  const preview = useMemo(() => {
    if (!file) return null;
    const parsed = Papa.parse<string[]>(file.text.replace(/^\uFEFF/, ''), { preview: 6, skipEmptyLines: true });
    const [header = [], ...rows] = parsed.data;
    return { header: header.map((h) => h.trim()), rows };
  }, [file]);

  const source = sources.find((s) => s.name.toLowerCase() === sourceName.trim().toLowerCase()) ?? null;

  function applySource(name: string, header: string[] | undefined) {
    const s = sources.find((x) => x.name.toLowerCase() === name.trim().toLowerCase());
    if (s) {
      setDealerId(s.dealerId ?? '');
      setOptions({ ...DEFAULTS, ...s.options });
    }
    if (header) setMapping(suggestMapping(header, s?.mapping));
  }

  async function chooseFile(f: File | undefined) {
    setRowErrors(null);
    setMessage(null);
    if (!f) return setFile(null);
    if (f.size > MAX_BYTES) {
      setFile(null);
      return setMessage({ text: `${f.name} is larger than 5 MB; split it by month.` });
    }
    const text = await f.text();
    setFile({ name: f.name, text });
    const header = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { preview: 1 }).data[0]?.map((h) => h.trim()) ?? [];
    setMapping(suggestMapping(header, source?.mapping));
  }

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    if (!file || pending) return;
    setPending(true);
    setMessage(null);
    setRowErrors(null);
    const clean = Object.fromEntries(Object.entries(mapping).filter(([, v]) => v)) as HeaderMapping;
    try {
      const res = await fetch('/api/accounts/statements', {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ sourceName, dealerId: dealerId || null, fileName: file.name, csv: file.text, mapping: clean, options }),
      });
      const data = await res.json().catch(() => ({}));
      if (res.status === 201) {
        router.push(`/accounts/statements/${data.importId}`);
        return;
      }
      if (data.rowErrors) setRowErrors({ errors: data.rowErrors, count: data.errorCount });
      const fields = data.fieldErrors ? Object.values(data.fieldErrors as Record<string, string[]>).flat().join(' ') : '';
      setMessage({ text: `${data.error ?? 'The statement was not imported.'}${fields ? ` ${fields}` : ''}`, importId: data.importId });
    } catch {
      setMessage({ text: 'No answer from the server; nothing was imported. Try again.' });
    } finally {
      setPending(false);
    }
  }

  const columnOptions = preview?.header ?? [];
  const select = (field: StatementField) => (
    <label key={field} className="block text-sm">
      <span className="field-label">{STATEMENT_FIELD_LABELS[field]} column</span>
      <select
        className="field-input"
        aria-label={`${STATEMENT_FIELD_LABELS[field]} column`}
        value={mapping[field] ?? ''}
        onChange={(e) => setMapping((m) => ({ ...m, [field]: e.target.value || undefined }))}
      >
        <option value="">— not in this file —</option>
        {columnOptions.map((h) => (
          <option key={h} value={h}>{h}</option>
        ))}
      </select>
    </label>
  );

  return (
    <form onSubmit={submit} className="space-y-6" data-testid="statement-import">
      <section className="card grid gap-4 p-5 md:grid-cols-3">
        <h2 className="md:col-span-3">1. The file</h2>
        <label className="block text-sm">
          <span className="field-label">Statement file (CSV)</span>
          <input type="file" accept=".csv,text/csv,text/plain" aria-label="Statement file" onChange={(e) => chooseFile(e.target.files?.[0])} className="field-input" />
        </label>
        <label className="block text-sm">
          <span className="field-label">Source</span>
          <input
            list="statement-sources"
            className="field-input"
            aria-label="Source"
            value={sourceName}
            placeholder="e.g. Kettenblatt Radwerk — monthly statement"
            onChange={(e) => {
              setSourceName(e.target.value);
              applySource(e.target.value, preview?.header);
            }}
            required
          />
          <datalist id="statement-sources">
            {sources.map((s) => (
              <option key={s.id} value={s.name} />
            ))}
          </datalist>
          <span className="mt-1 block text-xs text-ink-muted">{source ? 'Known source: its last column choices are filled in.' : 'A new source is remembered with the columns you choose.'}</span>
        </label>
        <label className="block text-sm">
          <span className="field-label">Dealer</span>
          <select className="field-input" aria-label="Dealer" value={dealerId} onChange={(e) => setDealerId(e.target.value)}>
            <option value="">Several dealers (from an account column, or not known)</option>
            {dealers.map((d) => (
              <option key={d.id} value={d.id}>{d.name}</option>
            ))}
          </select>
        </label>
      </section>

      {preview ? (
        <section className="card space-y-4 p-5">
          <h2>2. Which column is what</h2>
          <div className="overflow-x-auto">
            <table className="w-full text-left text-xs" data-testid="statement-preview">
              <thead className="bg-paper-sunk uppercase tracking-wide text-ink-muted">
                <tr>{preview.header.map((h) => <th key={h} className="px-2 py-1">{h}</th>)}</tr>
              </thead>
              <tbody>
                {preview.rows.map((r, i) => (
                  <tr key={i} className="border-t border-paper-line">{r.map((c, j) => <td key={j} className="px-2 py-1 font-mono">{c}</td>)}</tr>
                ))}
              </tbody>
            </table>
            <p className="mt-1 text-xs text-ink-muted">The first rows of {file?.name}.</p>
          </div>
          <div className="grid gap-3 md:grid-cols-4">{STATEMENT_FIELDS.map(select)}</div>
          <div className="grid gap-3 md:grid-cols-4">
            <label className="block text-sm">
              <span className="field-label">Date format</span>
              <select className="field-input" aria-label="Date format" value={options.dateFormat} onChange={(e) => setOptions((o) => ({ ...o, dateFormat: e.target.value as Options['dateFormat'] }))}>
                {DATE_FORMATS.map((f) => <option key={f} value={f}>{f}</option>)}
              </select>
            </label>
            <label className="block text-sm">
              <span className="field-label">Decimal separator</span>
              <select className="field-input" aria-label="Decimal separator" value={options.decimalSeparator} onChange={(e) => setOptions((o) => ({ ...o, decimalSeparator: e.target.value as '.' | ',' }))}>
                <option value=".">Dot: 1,234.50</option>
                <option value=",">Comma: 1.234,50</option>
              </select>
            </label>
            <label className="block text-sm">
              <span className="field-label">Date window for amount matches (days)</span>
              <input type="number" min={0} max={90} className="field-input" aria-label="Date window (days)" value={options.dateWindowDays} onChange={(e) => setOptions((o) => ({ ...o, dateWindowDays: Number(e.target.value) }))} />
            </label>
            <label className="flex items-center gap-2 self-end pb-2 text-sm">
              <input type="checkbox" checked={options.negate} onChange={(e) => setOptions((o) => ({ ...o, negate: e.target.checked }))} />
              The file shows credits as negative amounts (flip the signs)
            </label>
          </div>
          <p className="text-xs text-ink-muted">
            Amounts are read in {currency} unless a currency column says otherwise, exactly as written: nothing is rounded. A reference is searched
            for memo, claim and RMA numbers; a line without one is matched by the exact amount within the date window.
          </p>
        </section>
      ) : null}

      {message ? (
        <Notice tone="danger">
          {message.text}{' '}
          {message.importId ? <Link href={`/accounts/statements/${message.importId}`} className="font-bold underline">Open that statement</Link> : null}
        </Notice>
      ) : null}
      {rowErrors ? (
        <section className="card p-5" data-testid="row-errors">
          <h2 className="mb-2 text-fault-700">{rowErrors.count} problem{rowErrors.count === 1 ? '' : 's'} in the file — nothing was imported</h2>
          <table className="w-full text-left text-sm">
            <thead className="text-xs uppercase tracking-wide text-ink-muted">
              <tr><th className="py-1 pr-3">Row</th><th className="py-1 pr-3">Column</th><th className="py-1">What is wrong</th></tr>
            </thead>
            <tbody>
              {rowErrors.errors.map((r, i) => (
                <tr key={i} className="border-t border-paper-line">
                  <td className="py-1 pr-3 figure">{r.row === 0 ? '—' : r.row}</td>
                  <td className="py-1 pr-3">{r.column ?? r.field ?? '—'}</td>
                  <td className="py-1">{r.message}</td>
                </tr>
              ))}
            </tbody>
          </table>
          {rowErrors.count > rowErrors.errors.length ? <p className="mt-2 text-xs text-ink-muted">The first {rowErrors.errors.length} are listed.</p> : null}
          <p className="mt-2 text-sm">Row 1 is the header. Fix the file or the column choices, then import again.</p>
        </section>
      ) : null}

      <Button type="submit" disabled={!file || !sourceName.trim() || pending}>
        {pending ? 'Reading every row…' : 'Import the statement'}
      </Button>
    </form>
  );
}
