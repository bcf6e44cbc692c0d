'use client';

import { createColumnHelper, flexRender, getCoreRowModel, useReactTable, type SortingState } from '@tanstack/react-table';
import Link from 'next/link';
import { useEffect, useMemo, useState } from 'react';
import { StageBadge } from '@/components/claims/stage-badge';
import { Button } from '@/components/ui/button';
import type { ClaimListRow } from '@/lib/db/claim-list';
import { formatDay } from '@/lib/format/dates';

const STAGE_FILTERS = [
  { value: '', label: 'All' },
  { value: 'draft', label: 'Drafts' },
  { value: 'submitted,in_review,appealed', label: 'With the brand' },
  { value: 'waiting_on_dealer', label: 'Waiting on you' },
  { value: 'approved', label: 'Approved' },
  { value: 'credit_pending,credited,reconciled', label: 'Credit' },
  { value: 'denied,withdrawn', label: 'Closed' },
];

const SORT_KEYS: Record<string, string> = { number: 'number', stage: 'stage', failureDate: 'failure', updatedAt: 'updated' };

export function stageLabel(r: Pick<ClaimListRow, 'stage' | 'replacementStep' | 'coreStep'>): string {
  const base: Record<string, string> = {
    draft: 'Draft', submitted: 'Submitted', in_review: 'In review', waiting_on_dealer: 'Waiting on dealer', denied: 'Denied',
    appealed: 'Appealed', withdrawn: 'Withdrawn', approved: 'Approved', credit_pending: 'Credit pending', credited: 'Credited', reconciled: 'Reconciled',
  };
  if (r.stage === 'approved' && r.replacementStep) return `Approved · ${r.replacementStep.replace(/_/g, ' ')} · core ${r.coreStep?.replace(/_/g, ' ')}`;
  return base[r.stage] ?? r.stage;
}

const col = createColumnHelper<ClaimListRow>();

/** The dealer's claims; paging, sorting and filtering happen on the server. */
export function ClaimsTable({ showDealer = false }: { showDealer?: boolean }) {
  const [rows, setRows] = useState<ClaimListRow[]>([]);
  const [total, setTotal] = useState(0);
  const [capped, setCapped] = useState(false);
  const [page, setPage] = useState(1);
  const [stage, setStage] = useState('');
  const [q, setQ] = useState('');
  const [search, setSearch] = useState('');
  const [sorting, setSorting] = useState<SortingState>([{ id: 'updatedAt', desc: true }]);
  const [loading, setLoading] = useState(true);
  const [error, setError] = useState<string | null>(null);
  const pageSize = 25;

  useEffect(() => {
    const t = setTimeout(() => setSearch(q.trim()), 250);
    return () => clearTimeout(t);
  }, [q]);

  useEffect(() => {
    const ctrl = new AbortController();
    const s = sorting[0];
    const params = new URLSearchParams({ page: String(page), pageSize: String(pageSize), sort: SORT_KEYS[s?.id ?? 'updatedAt'] ?? 'updated', dir: s?.desc === false ? 'asc' : 'desc' });
    if (stage) params.set('stage', stage);
    if (search) params.set('q', search);
    setLoading(true);
    fetch(`/api/claims?${params}`, { signal: ctrl.signal })
      .then(async (r) => {
        if (!r.ok) throw new Error((await r.json()).error ?? 'Could not load the claims.');
        return r.json();
      })
      .then((d: { rows: ClaimListRow[]; total: number; totalCapped: boolean }) => {
        setRows(d.rows);
        setTotal(d.total);
        setCapped(d.totalCapped);
        setError(null);
        setLoading(false);
      })
      .catch((e: Error) => {
        if (e.name !== 'AbortError') {
          setError(e.message);
          setLoading(false);
        }
      });
    return () => ctrl.abort();
  }, [page, stage, search, sorting]);

  const columns = useMemo(
    () => [
      col.accessor('number', {
        header: 'Claim',
        cell: (c) => (
          <Link href={`/claims/${c.row.original.id}`} className="font-mono font-bold text-charge-700 hover:underline">
            {c.getValue()}
          </Link>
        ),
      }),
      col.accessor('stage', { header: 'Where it stands', cell: (c) => <StageBadge stage={c.getValue()} label={stageLabel(c.row.original)} /> }),
      ...(showDealer ? [col.accessor('dealerName', { header: 'Dealer', enableSorting: false })] : [col.accessor('brandName', { header: 'Brand', enableSorting: false })]),
      col.accessor('partNumber', {
        header: 'Part',
        enableSorting: false,
        cell: (c) => <span className="font-mono text-xs">{c.getValue() ?? '—'}</span>,
      }),
      col.accessor('frameSerial', { header: 'Frame', enableSorting: false, cell: (c) => <span className="font-mono text-xs">{c.getValue()}</span> }),
      col.accessor('customerName', { header: 'Customer', enableSorting: false, cell: (c) => c.getValue() || '—' }),
      col.accessor('failureDate', { header: 'Failed', cell: (c) => formatDay(c.getValue()) }),
      col.accessor('updatedAt', { header: 'Last change', cell: (c) => new Date(c.getValue()).toLocaleDateString('en-GB', { day: 'numeric', month: 'short' }) }),
    ],
    [showDealer],
  );

  const table = useReactTable({
    data: rows,
    columns,
    getCoreRowModel: getCoreRowModel(),
    manualSorting: true,
    manualPagination: true,
    state: { sorting },
    onSortingChange: (u) => {
      setSorting(u);
      setPage(1);
    },
    pageCount: Math.max(1, Math.ceil(total / pageSize)),
  });

  const pages = Math.max(1, Math.ceil(total / pageSize));
  // Past the count cap the last page is unknown: "Next" stays while pages come back full.
  const lastPage = capped ? rows.length < pageSize : page >= pages;

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-center gap-2">
        <div role="group" aria-label="Filter by stage" className="flex flex-wrap gap-1">
          {STAGE_FILTERS.map((f) => (
            <button
              key={f.value}
              type="button"
              aria-pressed={stage === f.value}
              onClick={() => {
                setStage(f.value);
                setPage(1);
              }}
              className={`rounded-full border px-3 py-1 text-sm ${stage === f.value ? 'border-ink bg-ink text-paper' : 'border-paper-line bg-paper-raised hover:bg-paper-sunk'}`}
            >
              {f.label}
            </button>
          ))}
        </div>
        <input
          type="search"
          value={q}
          onChange={(e) => {
            setQ(e.target.value);
            setPage(1);
          }}
          placeholder="Claim, RMA, frame serial or customer"
          aria-label="Search claims"
          className="field-input ml-auto max-w-xs"
        />
      </div>
      {error ? <p className="text-fault-700" role="alert">{error}</p> : null}
      <div className="card overflow-x-auto">
        <table className="w-full text-left text-sm" data-testid="claims-table">
          <thead className="bg-paper-sunk text-xs uppercase tracking-wide text-ink-muted">
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id}>
                {hg.headers.map((h) => (
                  <th key={h.id} className="px-3 py-2">
                    {h.column.getCanSort() ? (
                      <button type="button" onClick={h.column.getToggleSortingHandler()} className="inline-flex items-center gap-1 uppercase">
                        {flexRender(h.column.columnDef.header, h.getContext())}
                        <span aria-hidden>{{ asc: '▲', desc: '▼' }[h.column.getIsSorted() as string] ?? ''}</span>
                      </button>
                    ) : (
                      flexRender(h.column.columnDef.header, h.getContext())
                    )}
                  </th>
                ))}
              </tr>
            ))}
          </thead>
          <tbody className={loading ? 'opacity-60' : undefined}>
            {table.getRowModel().rows.map((r) => (
              <tr key={r.id} className="border-t border-paper-line hover:bg-paper">
                {r.getVisibleCells().map((c) => (
                  <td key={c.id} className="px-3 py-2 align-middle">
                    {flexRender(c.column.columnDef.cell, c.getContext())}
                  </td>
                ))}
              </tr>
            ))}
            {!loading && rows.length === 0 ? (
              <tr>
                <td colSpan={columns.length} className="px-3 py-8 text-center text-ink-muted">
                  No claims match.
                </td>
              </tr>
            ) : null}
          </tbody>
        </table>
      </div>
      <div className="flex items-center justify-between text-sm text-ink-muted">
        <span>
          {total.toLocaleString('en-GB')}
          {capped ? '+' : ''} claim{total === 1 && !capped ? '' : 's'}
        </span>
        <div className="flex items-center gap-2">
          <Button variant="secondary" disabled={page <= 1} onClick={() => setPage((p) => p - 1)}>
            Previous
          </Button>
          <span>
            Page {page} of {capped ? 'many' : pages}
          </span>
          <Button variant="secondary" disabled={lastPage} onClick={() => setPage((p) => p + 1)}>
            Next
          </Button>
        </div>
      </div>
    </div>
  );
}
