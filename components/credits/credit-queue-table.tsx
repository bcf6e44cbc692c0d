'use client';

import { createColumnHelper, flexRender, getCoreRowModel, useReactTable, type SortingState } from '@tanstack/react-table';
import Link from 'next/link';
import { useEffect, useMemo, useState } from 'react';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import type { QueueItem } from '@/lib/services/credits';
import { AFTER_TEST_LABELS, coreLabel } from './labels';
import { MoneyFigure } from './money-figure';

const col = createColumnHelper<QueueItem>();
const SORT_KEYS: Record<string, string> = { number: 'number', dealerName: 'dealer', waitingSince: 'waiting' };

/** Claims waiting for their credit memo; paging and sorting happen on the server. */
export function CreditQueueTable() {
  const [rows, setRows] = useState<QueueItem[]>([]);
  const [total, setTotal] = useState(0);
  const [page, setPage] = useState(1);
  const [q, setQ] = useState('');
  const [search, setSearch] = useState('');
  const [sorting, setSorting] = useState<SortingState>([{ id: 'waitingSince', desc: false }]);
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
    const params = new URLSearchParams({ page: String(page), pageSize: String(pageSize), sort: SORT_KEYS[s?.id ?? 'waitingSince'] ?? 'waiting', dir: s?.desc ? 'desc' : 'asc' });
    if (search) params.set('q', search);
    setLoading(true);
    fetch(`/api/accounts/queue?${params}`, { signal: ctrl.signal })
      .then(async (r) => {
        if (!r.ok) throw new Error((await r.json()).error ?? 'Could not load the queue.');
        return r.json();
      })
      .then((d: { rows: QueueItem[]; total: number }) => {
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
  }, [page, search, sorting]);

  const columns = useMemo(
    () => [
      col.accessor('number', {
        header: 'Claim',
        cell: (c) => (
          <Link href={`/accounts/claims/${c.row.original.id}`} className="whitespace-nowrap font-mono font-bold text-charge-700 hover:underline">
            {c.getValue()}
          </Link>
        ),
      }),
      col.accessor('dealerName', {
        header: 'Dealer',
        cell: (c) => (
          <span>
            {c.getValue()} <span className="block font-mono text-xs text-ink-muted">{c.row.original.accountNumber}</span>
          </span>
        ),
      }),
      col.accessor('partNumber', {
        header: 'Failed part',
        enableSorting: false,
        cell: (c) => (
          <span>
            <span className="font-mono text-xs">{c.getValue() ?? '—'}</span>
            <span className="block text-xs text-ink-muted">{c.row.original.partName}</span>
          </span>
        ),
      }),
      col.accessor('rmaNumber', { header: 'RMA', enableSorting: false, cell: (c) => <span className="whitespace-nowrap font-mono text-xs">{c.getValue() ?? '—'}</span> }),
      col.accessor('afterTest', {
        header: 'Repair',
        enableSorting: false,
        cell: (c) => <Badge tone={c.getValue() === 'passed' ? 'charge' : 'cell'}>{AFTER_TEST_LABELS[c.getValue()] ?? c.getValue()}</Badge>,
      }),
      col.accessor('core', {
        header: 'Core',
        enableSorting: false,
        cell: (c) => {
          const label = coreLabel(c.getValue(), c.row.original.inspection);
          const bad = c.row.original.chargeback;
          return <Badge tone={bad ? 'fault' : 'neutral'}>{label}</Badge>;
        },
      }),
      col.accessor('totalMinor', {
        header: 'Credit as computed',
        enableSorting: false,
        cell: (c) =>
          c.getValue() === null ? (
            <span className="text-sm text-fault-700">Cannot compute: {c.row.original.problem}</span>
          ) : (
            <span className="flex flex-col items-end">
              <MoneyFigure minor={c.getValue()!} currency={c.row.original.currency} strong />
              {c.row.original.chargeback ? <span className="text-xs text-fault-700">includes a chargeback</span> : null}
            </span>
          ),
      }),
      col.accessor('waitingSince', {
        header: 'Waiting since',
        cell: (c) => <span className="whitespace-nowrap">{new Date(c.getValue()).toLocaleDateString('en-GB', { day: 'numeric', month: 'short', year: 'numeric' })}</span>,
      }),
    ],
    [],
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

  return (
    <div className="space-y-3">
      <div className="flex items-center gap-2">
        <input
          type="search"
          value={q}
          onChange={(e) => {
            setQ(e.target.value);
            setPage(1);
          }}
          placeholder="Claim, RMA or dealer"
          aria-label="Search the credits queue"
          className="field-input ml-auto max-w-xs"
        />
      </div>
      {error ? <p className="text-fault-700" role="alert">{error}</p> : null}
      <div className="card overflow-x-auto">
        <table className="w-full text-left text-sm" data-testid="credit-queue">
          <thead className="bg-paper-sunk text-xs uppercase tracking-wide text-ink-muted">
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id}>
                {hg.headers.map((h) => (
                  <th key={h.id} className={`px-3 py-2 ${h.column.id === 'totalMinor' ? 'text-right' : ''}`}>
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
                  <td key={c.id} className={`px-3 py-2 align-middle ${c.column.id === 'totalMinor' ? 'text-right' : ''}`}>
                    {flexRender(c.column.columnDef.cell, c.getContext())}
                  </td>
                ))}
              </tr>
            ))}
            {!loading && rows.length === 0 ? (
              <tr>
                <td colSpan={columns.length} className="px-3 py-8 text-center text-ink-muted">
                  {search ? 'No claim matches.' : 'No claim is waiting for its credit.'}
                </td>
              </tr>
            ) : null}
          </tbody>
        </table>
      </div>
      <div className="flex items-center justify-between text-sm text-ink-muted">
        <span>
          {total} claim{total === 1 ? '' : 's'} waiting
        </span>
        <div className="flex items-center gap-2">
          <Button variant="secondary" disabled={page <= 1} onClick={() => setPage((p) => p - 1)}>
            Previous
          </Button>
          <span>
            Page {page} of {pages}
          </span>
          <Button variant="secondary" disabled={page >= pages} onClick={() => setPage((p) => p + 1)}>
            Next
          </Button>
        </div>
      </div>
    </div>
  );
}
