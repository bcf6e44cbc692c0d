import type { Metadata } from 'next';
import Link from 'next/link';
import { z } from 'zod';
import { CostChart } from '@/components/credits/cost-chart';
import { LiabilityEntryForm } from '@/components/credits/liability-entry-form';
import { MoneyFigure } from '@/components/credits/money-figure';
import { ButtonLink } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { requireRole } from '@/lib/auth/session';
import { brandSettings } from '@/lib/db/liability';
import { formatDay } from '@/lib/format/dates';
import { AGING_BUCKETS, AGING_BUCKET_LABELS } from '@/lib/reconciliation';
import { agingReport, rollForwardReport, todayFor, warrantyCostReport } from '@/lib/services/accounting-reports';

export const metadata: Metadata = { title: 'Reports' };

const GROUPS = [
  { key: 'month', label: 'By month' },
  { key: 'category', label: 'By part category' },
  { key: 'part_number', label: 'By part number' },
] as const;
const CATEGORY_LABELS: Record<string, string> = { drive_unit: 'Drive units', battery: 'Batteries', controller: 'Controllers', display: 'Displays', charger: 'Chargers', frame: 'Frames', other: 'Other' };
const ENTRY_LABELS = { opening_balance: 'Starting balance', accrual: 'Accrual', change_in_estimate: 'Change in estimate' } as const;

export default async function ReportsPage({ searchParams }: { searchParams: Promise<Record<string, string | undefined>> }) {
  const user = await requireRole('accountant');
  const brand = await brandSettings(user.organisationId);
  const today = todayFor(brand.timeZone);
  const sp = await searchParams;
  const date = z.iso.date();
  let from = date.catch(`${today.slice(0, 4)}-01-01`).parse(sp.from);
  let to = date.catch(today).parse(sp.to);
  const swapped = from > to;
  if (swapped) [from, to] = [to, from];
  const group = z.enum(['month', 'category', 'part_number']).catch('month').parse(sp.group);
  const [aging, cost, roll] = await Promise.all([
    agingReport(user),
    warrantyCostReport(user, { from, to }, group),
    rollForwardReport(user, { from, to }),
  ]);
  const currency = brand.currency;
  const qs = (over: Record<string, string>) => `/accounts/reports?${new URLSearchParams({ from, to, group, ...over })}`;
  const entriesInPeriod = roll.entries.filter((e) => e.entryDate >= from && e.entryDate <= to);

  return (
    <>
      <PageHeader
        title="Reports"
        lead={`Open credits, warranty cost and the warranty liability of ${user.orgName}, in ${currency}.`}
        actions={<ButtonLink href={`/api/accounts/memos/export?from=${from}&to=${to}`} variant="secondary" prefetch={false}>Download memos {from} – {to} (CSV)</ButtonLink>}
      />
      <form className="mb-6 flex flex-wrap items-end gap-3" action="/accounts/reports">
        <input type="hidden" name="group" value={group} />
        <label className="text-sm"><span className="field-label">Period from</span><input type="date" name="from" defaultValue={from} className="field-input" /></label>
        <label className="text-sm"><span className="field-label">to</span><input type="date" name="to" defaultValue={to} className="field-input" /></label>
        <button type="submit" className="rounded-md border border-paper-line bg-paper-raised px-4 py-2 text-sm font-bold hover:bg-paper-sunk">Show the period</button>
        {swapped ? <Notice tone="warning">The dates were the wrong way round; they are swapped.</Notice> : null}
      </form>

      <section className="card mb-6 p-5">
        <h2>Open credits by dealer, as of {formatDay(aging.asOf)}</h2>
        <p className="mb-3 text-sm text-ink-muted">Memos issued and not yet matched to a statement, by days since issue. Chargebacks are negative and reduce what is owed.</p>
        <table className="w-full text-left text-sm" data-testid="aging-table">
          <thead className="text-xs uppercase tracking-wide text-ink-muted">
            <tr>
              <th className="py-2 pr-3">Dealer</th>
              {AGING_BUCKETS.map((b) => <th key={b} className="py-2 pr-3 text-right">{AGING_BUCKET_LABELS[b]}</th>)}
              <th className="py-2 text-right">Open, net</th>
            </tr>
          </thead>
          <tbody>
            {aging.rows.map((r) => (
              <tr key={r.dealerId + r.currency} className="border-t border-paper-line">
                <td className="py-2 pr-3">{aging.dealerNames[r.dealerId] ?? r.dealerId}</td>
                {AGING_BUCKETS.map((b) => (
                  <td key={b} className="py-2 pr-3 text-right">
                    {r.net.counts[b] ? <><MoneyFigure minor={r.net.amounts[b]} currency={r.currency} /><span className="block text-xs text-ink-muted">{r.net.counts[b]} memo{r.net.counts[b] === 1 ? '' : 's'}</span></> : <span className="text-ink-faint">—</span>}
                  </td>
                ))}
                <td className="py-2 text-right"><MoneyFigure minor={r.net.totalMinor} currency={r.currency} strong /></td>
              </tr>
            ))}
            {aging.totals.map((t) => (
              <tr key={t.currency} className="border-t-2 border-ink font-bold">
                <td className="py-2 pr-3">All dealers</td>
                {AGING_BUCKETS.map((b) => <td key={b} className="py-2 pr-3 text-right"><MoneyFigure minor={t.net.amounts[b]} currency={t.currency} /></td>)}
                <td className="py-2 text-right"><MoneyFigure minor={t.net.totalMinor} currency={t.currency} strong /></td>
              </tr>
            ))}
            {aging.rows.length === 0 ? <tr><td colSpan={6} className="py-6 text-center text-ink-muted">No memo is open: none issued yet, or every one is on a statement.</td></tr> : null}
          </tbody>
        </table>
      </section>

      <section className="card mb-6 p-5">
        <div className="mb-3 flex flex-wrap items-end justify-between gap-3">
          <div>
            <h2>Warranty cost, {formatDay(from)} – {formatDay(to)}</h2>
            <p className="text-sm text-ink-muted">Memo lines by issue date (parts credited, labor, freight, chargebacks) and replacement parts shipped, at the brand’s cost, by ship date. Labor and freight count for the claim’s failed part.</p>
          </div>
          <span className="flex gap-1" role="group" aria-label="Group the cost">
            {GROUPS.map((g) => (
              <Link key={g.key} href={qs({ group: g.key })} aria-current={group === g.key ? 'true' : undefined}
                className={`rounded-full border px-3 py-1 text-sm ${group === g.key ? 'border-ink bg-ink text-paper' : 'border-paper-line bg-paper-raised hover:bg-paper-sunk'}`}>{g.label}</Link>
            ))}
          </span>
        </div>
        {cost.rows.length ? <CostChart rows={cost.rows} currency={currency} labels={group === 'category' ? CATEGORY_LABELS : undefined} /> : null}
        <table className="mt-4 w-full text-left text-sm" data-testid="cost-table">
          <thead className="text-xs uppercase tracking-wide text-ink-muted">
            <tr>
              <th className="py-2 pr-3">{GROUPS.find((g) => g.key === group)!.label.replace('By ', '')}</th>
              <th className="py-2 pr-3 text-right">Parts shipped (cost)</th>
              <th className="py-2 pr-3 text-right">Parts credited</th>
              <th className="py-2 pr-3 text-right">Labor</th>
              <th className="py-2 pr-3 text-right">Freight</th>
              <th className="py-2 pr-3 text-right">Chargebacks</th>
              <th className="py-2 text-right">Total</th>
            </tr>
          </thead>
          <tbody>
            {[...cost.rows.map((r) => ({ ...r, label: group === 'category' ? (CATEGORY_LABELS[r.key] ?? r.key) : r.key, total: false })), { ...cost.totals, key: 'total', label: 'Total', total: true }].map((r) => (
              <tr key={r.key} className={r.total ? 'border-t-2 border-ink font-bold' : 'border-t border-paper-line'}>
                <td className={`py-2 pr-3 ${group === 'part_number' && !r.total ? 'font-mono text-xs' : ''}`}>{r.label}</td>
                <td className="py-2 pr-3 text-right"><MoneyFigure minor={r.shippedPartsAtCostMinor} currency={currency} /></td>
                <td className="py-2 pr-3 text-right"><MoneyFigure minor={r.partsCreditedMinor} currency={currency} /></td>
                <td className="py-2 pr-3 text-right"><MoneyFigure minor={r.laborMinor} currency={currency} /></td>
                <td className="py-2 pr-3 text-right"><MoneyFigure minor={r.freightMinor} currency={currency} /></td>
                <td className="py-2 pr-3 text-right"><MoneyFigure minor={r.chargebacksMinor} currency={currency} /></td>
                <td className="py-2 text-right"><MoneyFigure minor={r.totalMinor} currency={currency} strong /></td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>

      <section className="card p-5">
        <h2>Warranty liability, {formatDay(from)} – {formatDay(to)}</h2>
        <p className="mb-3 text-sm text-ink-muted">
          The roll-forward presented as US GAAP asks for it (ASC 460-10-50-8(c)): the balance at the start, less settlements in cash (credit memos
          issued, net of chargebacks and reversals) and in kind (replacement parts shipped, at cost), plus accruals for warranties issued and changes
          in estimate, gives the balance at the end.
        </p>
        {roll.countedFromZero ? <Notice tone="warning" className="mb-3">No starting balance is recorded on or before {formatDay(from)}, so the period starts from 0. Record one below.</Notice> : null}
        <table className="w-full max-w-2xl text-left text-sm" data-testid="roll-forward">
          <tbody>
            {roll.table.lines.map((l, i) => (
              <tr key={l.label} className={i === 0 || i === roll.table.lines.length - 1 ? 'border-t-2 border-ink font-bold' : 'border-t border-paper-line'}>
                <td className="py-2 pr-3">{l.label}</td>
                <td className="py-2 text-right"><MoneyFigure minor={l.amountMinor} currency={currency} /></td>
              </tr>
            ))}
          </tbody>
        </table>
        {roll.opening ? <p className="mt-2 text-xs text-ink-muted">Counted from the starting balance of {formatDay(roll.opening.entryDate)} (“{roll.opening.note}”), rolled forward through every movement since.</p> : null}

        <h3 className="mt-6 mb-2 font-bold">Your entries in the period</h3>
        <table className="mb-4 w-full text-left text-sm" data-testid="liability-entries">
          <tbody>
            {entriesInPeriod.map((e) => (
              <tr key={e.id} className="border-t border-paper-line">
                <td className="py-1 pr-3 whitespace-nowrap">{formatDay(e.entryDate)}</td>
                <td className="py-1 pr-3">{ENTRY_LABELS[e.kind]}</td>
                <td className="py-1 pr-3">{e.note}</td>
                <td className="py-1 pr-3 text-xs text-ink-muted">{e.enteredByName}</td>
                <td className="py-1 text-right"><MoneyFigure minor={e.amountMinor} currency={e.currency} /></td>
              </tr>
            ))}
            {entriesInPeriod.length === 0 ? <tr><td className="py-2 text-ink-muted">None yet.</td></tr> : null}
          </tbody>
        </table>
        <LiabilityEntryForm today={today} />
        <p className="mt-2 text-xs text-ink-muted">Entries are kept as recorded; correct one with a change in estimate.</p>
      </section>
    </>
  );
}
