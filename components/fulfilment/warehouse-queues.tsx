'use client';

import { createColumnHelper, type ColumnDef } from '@tanstack/react-table';
import Link from 'next/link';
import { useMemo } from 'react';
import { Badge } from '@/components/ui/badge';
import { carrierName, TRACKING_LABELS, isTrackingStatus } from '@/lib/carrier/carriers';
import type { LineAvailability } from '@/lib/fulfilment/stock';
import { formatDay } from '@/lib/format/dates';
import { PagedTable } from './paged-table';

type ToShip = {
  id: string; number: string; rmaNumber: string | null; dealerName: string; dealerCity: string; dealerCountry: string; approvedAt: string | null;
  backordered: boolean; hasBattery: boolean; availability: LineAvailability[];
};

type Return = {
  id: string; number: string; rmaNumber: string | null; dealerName: string; partNumber: string | null; partName: string | null; partCategory: string | null;
  coreStep: string; labelTracking: string | null; labelCarrier: string | null; trackingStatus: string | null; batteryCondition: string | null;
  coreDueOn: string | null; deliveredAt: string | null; receivedAt: string | null; nothingShips: boolean;
};

function age(iso: string | null): string {
  if (!iso) return '—';
  const h = Math.max(0, Math.round((Date.now() - Date.parse(iso)) / 3_600_000));
  return h < 48 ? `${h} h ago` : `${Math.round(h / 24)} days ago`;
}

// Module-level so the table's fetch effect sees stable values.
const SHIP_FILTERS = [
  { value: 'all', label: 'All' },
  { value: 'ready', label: 'Ready to pick' },
  { value: 'backordered', label: 'Back-ordered' },
  { value: 'batteries', label: 'Batteries' },
];
const SHIP_SORTS = { rma: 'rma', dealer: 'dealer', approved: 'approved' };
const SHIP_DEFAULT_SORT = { id: 'approved', desc: false };
const RETURN_FILTERS = [
  { value: 'open', label: 'Open' },
  { value: 'label_needed', label: 'Label needed' },
  { value: 'awaiting_dealer', label: 'With the dealer' },
  { value: 'in_transit', label: 'On the way' },
  { value: 'received', label: 'To inspect' },
  { value: 'overdue', label: 'Overdue' },
  { value: 'closed', label: 'Done' },
];
const RETURN_SORTS = { rma: 'rma', dealer: 'dealer', due: 'due' };
const RETURN_DEFAULT_SORT = { id: 'due', desc: false };

const ship = createColumnHelper<ToShip>();
const ret = createColumnHelper<Return>();

export function ToShipQueue() {
  const columns = useMemo(
    () =>
      [
        ship.accessor('rmaNumber', {
          id: 'rma',
          header: 'RMA',
          cell: (c) => <Link href={`/warehouse/claims/${c.row.original.id}`} className="font-mono font-bold text-charge-700 hover:underline">{c.getValue()}</Link>,
        }),
        ship.accessor('dealerName', {
          id: 'dealer',
          header: 'Ship to',
          cell: (c) => <span>{c.getValue()} <span className="block text-xs text-ink-muted">{c.row.original.dealerCity}, {c.row.original.dealerCountry}</span></span>,
        }),
        ship.display({
          id: 'lines',
          header: 'Lines',
          cell: (c) => (
            <ul>
              {c.row.original.availability.map((a) => (
                <li key={a.lineId} className="font-mono text-xs">{a.quantity} × {a.partNumber}</li>
              ))}
            </ul>
          ),
        }),
        ship.display({
          id: 'stock',
          header: 'Stock',
          cell: (c) => {
            const short = c.row.original.availability.filter((a) => !a.inStock);
            if (!c.row.original.availability.length) return <Badge>Nothing to send</Badge>;
            return short.length ? (
              <Badge tone="volt">Back-ordered{short[0]?.expectedOn ? ` · expected ${formatDay(short[0].expectedOn)}` : ' · no date'}</Badge>
            ) : (
              <Badge tone="charge">Ready to pick</Badge>
            );
          },
        }),
        ship.accessor('hasBattery', { header: 'Goods', enableSorting: false, cell: (c) => (c.getValue() ? <Badge tone="fault">Lithium · UN3480</Badge> : <span className="text-ink-muted">—</span>) }),
        ship.accessor('approvedAt', { id: 'approved', header: 'Approved', cell: (c) => age(c.getValue()) }),
        ship.display({
          id: 'go',
          header: '',
          cell: (c) => <Link href={`/warehouse/claims/${c.row.original.id}`} className="font-bold text-charge-700 hover:underline">Pick & ship →</Link>,
        }),
      ] as ColumnDef<ToShip, unknown>[],
    [],
  );
  return (
    <PagedTable<ToShip>
      endpoint="/api/warehouse/to-ship"
      columns={columns}
      testId="to-ship-table"
      filters={SHIP_FILTERS}
      sortKeys={SHIP_SORTS}
      defaultSort={SHIP_DEFAULT_SORT}
      searchLabel="RMA, claim or dealer"
      empty="Nothing waiting to ship."
    />
  );
}

const CORE_WORDS: Record<string, string> = {
  requested: 'Waiting for the core', in_transit: 'On its way back', received: 'Received: inspect it', inspected: 'Inspected', waived: 'Return waived', written_off: 'Written off',
};

export function ReturnsQueue() {
  const columns = useMemo(
    () =>
      [
        ret.accessor('rmaNumber', {
          id: 'rma',
          header: 'RMA',
          cell: (c) => <Link href={`/warehouse/claims/${c.row.original.id}#core`} className="font-mono font-bold text-charge-700 hover:underline">{c.getValue()}</Link>,
        }),
        ret.accessor('dealerName', { id: 'dealer', header: 'From' }),
        ret.accessor('partNumber', {
          header: 'Core',
          enableSorting: false,
          cell: (c) => (
            <span>
              <span className="font-mono text-xs">{c.getValue() ?? '—'}</span>{' '}
              {c.row.original.partCategory === 'battery' ? <Badge tone={c.row.original.batteryCondition === 'damaged_or_defective' ? 'fault' : 'volt'}>{c.row.original.batteryCondition === 'damaged_or_defective' ? 'Damaged battery' : 'Battery'}</Badge> : null}
            </span>
          ),
        }),
        ret.accessor('coreStep', {
          header: 'Where it stands',
          enableSorting: false,
          cell: (c) => {
            const r = c.row.original;
            const label = r.coreStep === 'requested' && !r.labelTracking ? 'Return label needed' : CORE_WORDS[c.getValue()] ?? c.getValue();
            return (
              <span>
                {label}
                {r.labelTracking ? (
                  <span className="block text-xs text-ink-muted">
                    {carrierName(r.labelCarrier ?? '')} <span className="font-mono">{r.labelTracking}</span>
                    {r.coreStep === 'in_transit' && r.trackingStatus && isTrackingStatus(r.trackingStatus) ? ` · ${TRACKING_LABELS[r.trackingStatus].toLowerCase()}` : ''}
                  </span>
                ) : null}
              </span>
            );
          },
        }),
        ret.accessor('coreDueOn', {
          id: 'due',
          header: 'Due back',
          cell: (c) => {
            const due = c.getValue();
            if (!due) return <span className="text-ink-muted">{c.row.original.deliveredAt || c.row.original.nothingShips ? '—' : 'after delivery'}</span>;
            const late = c.row.original.coreStep === 'requested' && due < new Date().toISOString().slice(0, 10);
            return <span className={late ? 'font-bold text-fault-700' : undefined}>{formatDay(due)}{late ? ' · overdue' : ''}</span>;
          },
        }),
        ret.display({
          id: 'go',
          header: '',
          cell: (c) => {
            const r = c.row.original;
            const action = r.coreStep === 'received' ? 'Inspect →' : r.coreStep === 'requested' && !r.labelTracking ? 'Issue label →' : r.coreStep === 'in_transit' || r.coreStep === 'requested' ? 'Receive →' : 'Open →';
            return <Link href={`/warehouse/claims/${r.id}#core`} className="font-bold text-charge-700 hover:underline">{action}</Link>;
          },
        }),
      ] as ColumnDef<Return, unknown>[],
    [],
  );
  return (
    <PagedTable<Return>
      endpoint="/api/warehouse/returns"
      columns={columns}
      testId="returns-table"
      filters={RETURN_FILTERS}
      sortKeys={RETURN_SORTS}
      defaultSort={RETURN_DEFAULT_SORT}
      searchLabel="RMA, claim, dealer or tracking"
      empty="No cores in this view."
    />
  );
}
