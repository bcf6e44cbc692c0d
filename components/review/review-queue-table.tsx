'use client';

import { createColumnHelper, flexRender, getCoreRowModel, useReactTable, type SortingState } from '@tanstack/react-table';
import clsx from 'clsx';
import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useCallback, useEffect, useMemo, useState } from 'react';
import { StageBadge } from '@/components/claims/stage-badge';
import { postStep } from '@/components/review/post-json';
import { TimeLeft } from '@/components/review/time-left';
import { Button } from '@/components/ui/button';
import { formatDay } from '@/lib/format/dates';
import type { ReviewQueueItem, ReviewQueuePage } from '@/lib/services/review-queue';
import { STAGE_LABELS, type Stage } from '@/machines/claim-states';

const VIEWS = [
  { value: 'open', label: 'Open' },
  { value: 'needs_rep', label: 'Needs a rep' },
  { value: 'in_review', label: 'In review' },
  { value: 'waiting', label: 'Waiting on dealer' },
  { value: 'decided', label: 'Decided' },
  { value: 'all', label: 'All' },
];

const SORT_KEYS: Record<string, string> = { number: 'number', submittedAt: 'age', clock: 'deadline' };

type Option = { value: string; label: string };

const col = createColumnHelper<ReviewQueueItem>();

function ageText(iso: string | null): string {
  if (!iso) return '';
  const daysOld = Math.floor((Date.now() - Date.parse(iso)) / 86_400_000);
  return daysOld === 0 ? 'today' : `${daysOld} day${daysOld === 1 ? '' : 's'} ago`;
}

/**
 * The brand rep's queue: the claims against the brand, oldest deadline first, with the business
 * days left on each. Paging, sorting and filtering happen on the server (GET /api/review).
 */
export function ReviewQueueTable({ dealers, categories }: { dealers: Option[]; categories: Option[] }) {
  const router = useRouter();
  const [data, setData] = useState<ReviewQueuePage | null>(null);
  const [page, setPage] = useState(1);
  const [view, setView] = useState('open');
  const [assigned, setAssigned] = useState('');
  const [dealer, setDealer] = useState('');
  const [category, setCategory] = useState('');
  const [age, setAge] = useState('');
  const [deadline, setDeadline] = useState('');
  const [q, setQ] = useState('');
  const [search, setSearch] = useState('');
  const [sorting, setSorting] = useState<SortingState>([{ id: 'clock', desc: false }]);
  const [loading, setLoading] = useState(true);
  const [error, setError] = useState<string | null>(null);
  const [reload, setReload] = useState(0);
  const [busy, setBusy] = useState<string | null>(null);
  const pageSize = 25;

  useEffect(() => {
    const t = setTimeout(() => setSearch(q.trim()), 250);
    return () => clearTimeout(t);
  }, [q]);

  useEffect(() => {
    const ctrl = new AbortController();
    const s = sorting[0];
    const params = new URLSearchParams({ page: String(page), pageSize: String(pageSize), view, sort: SORT_KEYS[s?.id ?? 'clock'] ?? 'deadline', dir: s?.desc ? 'desc' : 'asc' });
    for (const [k, v] of Object.entries({ assigned, dealer, category, age, deadline, q: search })) if (v) params.set(k, v);
    setLoading(true);
    fetch(`/api/review?${params}`, { signal: ctrl.signal })
      .then(async (r) => {
        if (!r.ok) throw new Error((await r.json()).error ?? 'Could not load the queue.');
        return r.json();
      })
      .then((d: ReviewQueuePage) => {
        setData(d);
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
  }, [page, view, assigned, dealer, category, age, deadline, search, sorting, reload]);

  const act = useCallback(
    async (row: ReviewQueueItem, type: 'TAKE' | 'RELEASE') => {
      setBusy(row.id);
      const r = await postStep(row.id, { type, version: row.version });
      setBusy(null);
      if (!r.ok) {
        setError(`${row.number}: ${r.message}`);
        setReload((n) => n + 1);
        return;
      }
      if (type === 'TAKE') router.push(`/claims/${row.id}`);
      else setReload((n) => n + 1);
    },
    [router],
  );

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
      col.accessor('stage', {
        header: 'Where it stands',
        enableSorting: false,
        cell: (c) => {
          const r = c.row.original;
          return (
            <div className="space-y-0.5">
              <StageBadge stage={r.stage} label={STAGE_LABELS[r.stage as Stage] ?? r.stage} />
              <p className="text-xs text-ink-muted">
                {r.assignedRepName ? `with ${r.assignedRepName}` : r.stage === 'submitted' || r.stage === 'appealed' ? 'nobody has it yet' : ''}
                {r.appealsUsed > 0 && r.stage === 'appealed' ? ' · appeal' : ''}
              </p>
            </div>
          );
        },
      }),
      col.accessor('dealerName', { header: 'Dealer', enableSorting: false }),
      col.accessor('partNumber', {
        header: 'Part',
        enableSorting: false,
        cell: (c) => (
          <span>
            <span className="font-mono text-xs">{c.getValue() ?? '—'}</span>
            <span className="block text-xs text-ink-muted">{c.row.original.partCategory?.replace(/_/g, ' ')}</span>
          </span>
        ),
      }),
      col.accessor('frameSerial', { header: 'Frame', enableSorting: false, cell: (c) => <span className="font-mono text-xs">{c.getValue()}</span> }),
      col.accessor('submittedAt', {
        header: 'Submitted',
        cell: (c) => (
          <span>
            {c.getValue() ? formatDay(c.getValue()!.slice(0, 10)) : '—'}
            <span className="block text-xs text-ink-muted">{ageText(c.getValue())}</span>
          </span>
        ),
      }),
      col.accessor('clock', {
        header: 'Time left',
        cell: (c) => (c.getValue() ? <TimeLeft clock={c.getValue()!} /> : <span className="text-xs text-ink-muted">decided</span>),
      }),
      col.display({
        id: 'actions',
        header: '',
        cell: (c) => {
          const r = c.row.original;
          if (r.canTake) {
            return (
              <Button variant="secondary" className="min-h-8 px-3 py-1" disabled={busy === r.id} onClick={() => act(r, 'TAKE')} aria-label={`Take ${r.number}`}>
                Take
              </Button>
            );
          }
          if (r.canRelease) {
            return (
              <Button variant="quiet" className="min-h-8 px-3 py-1" disabled={busy === r.id} onClick={() => act(r, 'RELEASE')} aria-label={`Release ${r.number}`}>
                Release
              </Button>
            );
          }
          return null;
        },
      }),
    ],
    [act, busy],
  );

  const rows = data?.rows ?? [];
  const total = data?.total ?? 0;
  const capped = data?.totalCapped ?? false;
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
  const filter = (set: (v: string) => void) => (e: React.ChangeEvent<HTMLSelectElement | HTMLInputElement>) => {
    set(e.target.value);
    setPage(1);
  };

  return (
    <div className="space-y-3">
      <div role="group" aria-label="Which claims" className="flex flex-wrap gap-1">
        {VIEWS.map((v) => (
          <button
            key={v.value}
            type="button"
            aria-pressed={view === v.value}
            onClick={() => {
              setView(v.value);
              setPage(1);
            }}
            className={clsx('rounded-full border px-3 py-1 text-sm', view === v.value ? 'border-ink bg-ink text-paper' : 'border-paper-line bg-paper-raised hover:bg-paper-sunk')}
          >
            {v.label}
          </button>
        ))}
      </div>
      <div className="grid gap-2 sm:grid-cols-3 lg:grid-cols-6">
        <QueueSelect label="Assigned" value={assigned} onChange={filter(setAssigned)} options={[{ value: '', label: 'Anyone' }, { value: 'me', label: 'To me' }, { value: 'nobody', label: 'Nobody yet' }]} />
        <QueueSelect label="Dealer" value={dealer} onChange={filter(setDealer)} options={[{ value: '', label: 'All dealers' }, ...dealers]} />
        <QueueSelect label="Part" value={category} onChange={filter(setCategory)} options={[{ value: '', label: 'All parts' }, ...categories]} />
        <QueueSelect
          label="Age"
          value={age}
          onChange={filter(setAge)}
          options={[{ value: '', label: 'Any age' }, { value: '0-2', label: 'Up to 2 days' }, { value: '3-7', label: '3 to 7 days' }, { value: '8-30', label: '8 to 30 days' }, { value: '31+', label: 'Over 30 days' }]}
        />
        <QueueSelect
          label="Deadline"
          value={deadline}
          onChange={filter(setDeadline)}
          options={[{ value: '', label: 'Any deadline' }, { value: 'overdue', label: 'Overdue' }, { value: 'due_soon', label: 'Due within 2 days' }, { value: 'on_track', label: 'On track' }, { value: 'paused', label: 'Paused (dealer’s turn)' }]}
        />
        <div>
          <label htmlFor="queue-search" className="field-label">
            Search
          </label>
          <input id="queue-search" type="search" value={q} onChange={filter(setQ)} placeholder="Claim or serial" className="field-input" />
        </div>
      </div>
      {error ? <p className="text-fault-700" role="alert">{error}</p> : null}
      <div className="card overflow-x-auto">
        <table className="w-full text-left text-sm" data-testid="review-queue">
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
            {table.getRowModel().rows.map((r) => {
              const overdue = r.original.clock?.status === 'overdue';
              return (
                <tr
                  key={r.id}
                  data-testid="queue-row"
                  data-overdue={overdue || undefined}
                  className={clsx('border-t border-paper-line', overdue ? 'bg-fault-50' : 'hover:bg-paper')}
                >
                  {r.getVisibleCells().map((c, i) => (
                    <td key={c.id} className={clsx('px-3 py-2 align-middle', i === 0 && (overdue ? 'border-l-4 border-l-fault-500' : 'border-l-4 border-l-transparent'))}>
                      {flexRender(c.column.columnDef.cell, c.getContext())}
                    </td>
                  ))}
                </tr>
              );
            })}
            {!loading && rows.length === 0 ? (
              <tr>
                <td colSpan={columns.length} className="px-3 py-10 text-center text-ink-muted">
                  {view === 'open' && !assigned && !dealer && !category && !age && !deadline && !search
                    ? 'Nothing to review. Claims dealers submit against your brand will line up here.'
                    : 'No claims match these filters.'}
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

function QueueSelect({ label, value, onChange, options }: { label: string; value: string; onChange: React.ChangeEventHandler<HTMLSelectElement>; options: Option[] }) {
  const id = `queue-${label.toLowerCase()}`;
  return (
    <div>
      <label htmlFor={id} className="field-label">
        {label}
      </label>
      <select id={id} value={value} onChange={onChange} className="field-input">
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    </div>
  );
}
