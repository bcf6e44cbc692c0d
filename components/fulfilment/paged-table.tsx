'use client';

import { flexRender, getCoreRowModel, useReactTable, type ColumnDef, type SortingState } from '@tanstack/react-table';
import { useEffect, useState } from 'react';
import { Button } from '@/components/ui/button';

export type Filter = { value: string; label: string };

/**
 * A queue fetched page by page from a route handler: filter chips, search, sortable headers.
 * Paging, sorting and filtering happen on the server (same pattern as the claims table).
 */
export function PagedTable<Row extends { id: string }>({
  endpoint, columns, filters, sortKeys, defaultSort, searchLabel, testId, empty, pageSize = 20,
}: {
  endpoint: string;
  columns: ColumnDef<Row, unknown>[];
  filters: Filter[];
  /** Column id → the server's sort key. */
  sortKeys: Record<string, string>;
  defaultSort: { id: string; desc: boolean };
  searchLabel: string;
  testId: string;
  empty: string;
  pageSize?: number;
}) {
  const [rows, setRows] = useState<Row[]>([]);
  const [total, setTotal] = useState(0);
  const [page, setPage] = useState(1);
  const [filter, setFilter] = useState(filters[0]?.value ?? '');
  const [q, setQ] = useState('');
  const [search, setSearch] = useState('');
  const [sorting, setSorting] = useState<SortingState>([defaultSort]);
  const [loading, setLoading] = useState(true);
  const [error, setError] = useState<string | null>(null);

  useEffect(() => {
    const t = setTimeout(() => setSearch(q.trim()), 250);
    return () => clearTimeout(t);
  }, [q]);

  useEffect(() => {
    const ctrl = new AbortController();
    const s = sorting[0];
    const params = new URLSearchParams({ page: String(page), pageSize: String(pageSize), filter, sort: sortKeys[s?.id ?? defaultSort.id] ?? '', dir: s?.desc ? 'desc' : 'asc' });
    if (search) params.set('q', search);
    setLoading(true);
    fetch(`${endpoint}?${params}`, { signal: ctrl.signal })
      .then(async (r) => {
        const d = await r.json();
        if (!r.ok) throw new Error(d.error ?? 'Could not load the queue.');
        return d as { rows: Row[]; total: number };
      })
      .then((d) => {
        setRows(d.rows);
        setTotal(d.total);
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
  }, [endpoint, page, pageSize, filter, search, sorting, sortKeys, defaultSort.id]);

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
  });
  const pages = Math.max(1, Math.ceil(total / pageSize));

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-center gap-2">
        <div role="group" aria-label="Filter" className="flex flex-wrap gap-1">
          {filters.map((f) => (
            <button
              key={f.value}
              type="button"
              aria-pressed={filter === f.value}
              onClick={() => {
                setFilter(f.value);
                setPage(1);
              }}
              className={`rounded-full border px-3 py-1 text-sm ${filter === f.value ? 'border-ink bg-ink text-paper' : 'border-paper-line bg-paper-raised hover:bg-paper-sunk'}`}
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
          placeholder={searchLabel}
          aria-label={searchLabel}
          className="field-input ml-auto max-w-xs"
        />
      </div>
      {error ? <p className="text-fault-700" role="alert">{error}</p> : null}
      <div className="card overflow-x-auto">
        <table className="w-full text-left text-sm" data-testid={testId}>
          <thead className="bg-paper-sunk text-xs uppercase tracking-wide text-ink-muted">
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id}>
                {hg.headers.map((h) => (
                  <th key={h.id} className="px-3 py-2">
                    {h.column.getCanSort() && sortKeys[h.column.id] ? (
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
              <tr key={r.original.id} className="border-t border-paper-line hover:bg-paper" data-row-id={r.original.id}>
                {r.getVisibleCells().map((c) => (
                  <td key={c.id} className="px-3 py-2 align-middle">
                    {flexRender(c.column.columnDef.cell, c.getContext())}
                  </td>
                ))}
              </tr>
            ))}
            {!loading && rows.length === 0 ? (
              <tr>
                <td colSpan={columns.length} className="px-3 py-8 text-center text-ink-muted">{empty}</td>
              </tr>
            ) : null}
          </tbody>
        </table>
      </div>
      <div className="flex items-center justify-between text-sm text-ink-muted">
        <span>{total} in this view</span>
        <div className="flex items-center gap-2">
          <Button variant="secondary" disabled={page <= 1} onClick={() => setPage((p) => p - 1)}>Previous</Button>
          <span>Page {page} of {pages}</span>
          <Button variant="secondary" disabled={page >= pages} onClick={() => setPage((p) => p + 1)}>Next</Button>
        </div>
      </div>
    </div>
  );
}
