import { randomUUID } from 'node:crypto';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { GET as dealerExportRoute } from '@/app/api/credits/export/route';
import { GET as brandExportRoute } from '@/app/api/accounts/memos/export/route';
import { db } from '@/db/connection';
import { localDateOfEpoch } from '@/lib/calendar/time-zone';
import { issueCredit, loadCreditView } from '@/lib/services/credits';
import { addLiabilityEntry, agingReport, rollForwardReport, warrantyCostReport } from '@/lib/services/accounting-reports';
import { dealerCredits } from '@/lib/services/dealer-credits';
import { MEMO_EXPORT_COLUMNS } from '@/lib/reports';
import { claimFor, PEOPLE, signedIn } from '../../support/credit-claims';

const accountant = () => signedIn(PEOPLE.torvane.accountant);
const orgId = async (slug: string) => (await db()('organisations').where({ slug }).first('id')).id as string;
// Memos are dated in the brand's calendar (Torvane: Europe/Amsterdam), not the server's.
const today = () => localDateOfEpoch(Date.now(), 'Europe/Amsterdam');

async function issued(spec: Parameters<typeof claimFor>[0] = {}) {
  const claim = await claimFor(spec);
  const user = await accountant();
  const memo = await issueCredit(user, claim.id, (await loadCreditView(user, claim.id)).computed!.hash);
  return { claim, memo };
}

describe('aging of open credits', () => {
  it('an issued, unreconciled memo is open in the 0–30 day bucket of its dealer', async () => {
    const before = await agingReport(await accountant());
    const tidewheel = await orgId('tidewheel');
    const row = (r: typeof before) => r.rows.find((x) => x.dealerId === tidewheel);
    const { memo } = await issued({ dealer: 'tidewheel' });
    const after = await agingReport(await accountant());
    const gained = (row(after)?.credits.amounts.days_0_30 ?? 0) - (row(before)?.credits.amounts.days_0_30 ?? 0);
    expect(gained).toBe(memo.totalMinor);
    expect(after.dealerNames[tidewheel]).toBe('Tidewheel Cycles');
  });

  it('a wrong role is refused', async () => {
    await expect(agingReport(await signedIn(PEOPLE.torvane.rep))).rejects.toMatchObject({ status: 403 });
  });
});

describe('warranty liability roll-forward (ASC 460-10-50-8(c))', () => {
  it('beginning − settlements in cash − in kind + accruals ± changes = ending, and an issued memo is a cash settlement', async () => {
    const period = { from: today(), to: today() };
    const before = (await rollForwardReport(await accountant(), period)).table;
    const { memo } = await issued();
    await addLiabilityEntry(await accountant(), { entryDate: today(), kind: 'accrual', amountMinor: 123_45, note: 'test accrual' });
    await addLiabilityEntry(await accountant(), { entryDate: today(), kind: 'change_in_estimate', amountMinor: -10_00, note: 'test change' });
    const after = (await rollForwardReport(await accountant(), period)).table;
    expect(after.settlementsInCashMinor - before.settlementsInCashMinor).toBe(memo.totalMinor);
    expect(after.accrualsMinor - before.accrualsMinor).toBe(123_45);
    expect(after.changesInEstimateMinor - before.changesInEstimateMinor).toBe(-10_00);
    // The test claim's drive unit was shipped by the brand weeks ago, before the period: a settlement
    // in kind at its cost (TV-DU85, 410.00) that lowers the balance the period begins with.
    expect(before.beginningBalanceMinor - after.beginningBalanceMinor).toBe(41000);
    // The presentation identity, recomputed here.
    expect(after.endingBalanceMinor).toBe(
      after.beginningBalanceMinor - after.settlementsInCashMinor - after.settlementsInKindMinor + after.accrualsMinor + after.changesInEstimateMinor,
    );
    expect(after.lines.slice(0, 5).reduce((s, l) => s + l.amountMinor, 0)).toBe(after.endingBalanceMinor);
  });

  it('rolls the demo starting balance forward to the beginning of a later period', async () => {
    const first = await rollForwardReport(await accountant(), { from: '2026-01-01', to: '2026-06-30' });
    const second = await rollForwardReport(await accountant(), { from: '2026-07-01', to: '2026-09-30' });
    expect(first.opening?.amountMinor).toBe(4_800_000);
    expect(second.table.beginningBalanceMinor).toBe(first.table.endingBalanceMinor);
  });

  it('an entry sent twice with its form key is recorded once', async () => {
    const period = { from: today(), to: today() };
    const before = (await rollForwardReport(await accountant(), period)).table;
    const entry = { entryDate: today(), kind: 'accrual' as const, amountMinor: 77_00, note: 'double-clicked accrual', clientKey: randomUUID() };
    const [a, b] = await Promise.all([addLiabilityEntry(await accountant(), entry), addLiabilityEntry(await accountant(), entry)]);
    expect(a.id).toBe(b.id);
    expect([a.replayed, b.replayed].sort()).toEqual([false, true]);
    const after = (await rollForwardReport(await accountant(), period)).table;
    expect(after.accrualsMinor - before.accrualsMinor).toBe(77_00);
    // The same key with other figures (the first answer was lost, the form then changed): refused, nothing added.
    await expect(addLiabilityEntry(await accountant(), { ...entry, amountMinor: 78_00 })).rejects.toMatchObject({ status: 409, message: expect.stringMatching(/saved already/) });
    expect((await rollForwardReport(await accountant(), period)).table.accrualsMinor - before.accrualsMinor).toBe(77_00);
    // A new key is a new entry.
    const c = await addLiabilityEntry(await accountant(), { ...entry, clientKey: randomUUID() });
    expect(c.replayed).toBe(false);
    expect(c.id).not.toBe(a.id);
  });

  it('refuses a negative accrual and a reversed period', async () => {
    await expect(addLiabilityEntry(await accountant(), { entryDate: today(), kind: 'accrual', amountMinor: -1, note: 'x' })).rejects.toMatchObject({ status: 422 });
    await expect(rollForwardReport(await accountant(), { from: '2026-05-01', to: '2026-04-01' })).rejects.toMatchObject({ status: 422 });
  });
});

describe('warranty cost', () => {
  it('by part category: labor and freight of a claim go to its failed part; parts shipped count at cost', async () => {
    const period = { from: today(), to: today() };
    const before = await warrantyCostReport(await accountant(), period, 'category');
    await issued({ partNumber: 'TV-CT20', parts: [{ partNumber: 'TV-CT20', quantity: 1, fromDealerStock: true }], labor: ['CT-RR'], freightMinor: 0 });
    const after = await warrantyCostReport(await accountant(), period, 'category');
    const ctl = (r: typeof before) => r.rows.find((x) => x.key === 'controller');
    // 129.00 dealer net + 0.80 h × 79.00 = 63.20.
    expect((ctl(after)?.partsCreditedMinor ?? 0) - (ctl(before)?.partsCreditedMinor ?? 0)).toBe(12900);
    expect((ctl(after)?.laborMinor ?? 0) - (ctl(before)?.laborMinor ?? 0)).toBe(6320);
    const year = await warrantyCostReport(await accountant(), { from: '2026-01-01', to: '2026-12-31' }, 'month');
    expect(year.rows.map((r) => r.key)).toEqual(expect.arrayContaining(['2026-07', '2026-08', '2026-09']));
    // The demo cargo-bike drive unit shipped in June 2026, settled at its cost of 410.00; its memo came in July.
    expect(year.rows.find((r) => r.key === '2026-06')?.shippedPartsAtCostMinor).toBe(41000);
    expect(year.rows.find((r) => r.key === '2026-07')?.laborMinor).toBe(9480);
  });
});

describe('CSV export in the LP-MEMO-LINES-1 layout', () => {
  it('the accountant exports a period; papaparse reads it back and each memo foots', async () => {
    const { memo } = await issued();
    await signedIn(PEOPLE.torvane.accountant);
    const res = await brandExportRoute(new Request(`http://x/api/accounts/memos/export?from=${today()}&to=${today()}`), { params: Promise.resolve({}) });
    expect(res.headers.get('content-type')).toMatch(/text\/csv/);
    const parsed = Papa.parse<Record<string, string>>(await res.text(), { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.meta.fields).toEqual([...MEMO_EXPORT_COLUMNS]);
    const rows = parsed.data.filter((r) => r.memo_number === memo.memoNumber);
    expect(rows.map((r) => r.line_amount)).toEqual(['0.00', '94.80', '63.20', '18.50']);
    expect(rows.every((r) => r.memo_total === '176.50' && r.dealer_account === 'TV-DE-0791')).toBe(true);
  });

  it('a shop admin downloads only its own memos of one brand; a service-desk user is refused', async () => {
    const { memo } = await issued({ dealer: 'lanternhill' });
    const other = await issued({ dealer: 'kettenblatt' });
    await signedIn(PEOPLE.dealers.lanternhill.admin);
    const res = await dealerExportRoute(new Request(`http://x/api/credits/export?brand=${await orgId('torvane')}`), { params: Promise.resolve({}) });
    const text = await res.text();
    expect(text).toContain(memo.memoNumber);
    expect(text).not.toContain(other.memo.memoNumber);
    expect(text).not.toContain('TV-DE-0791');
    await signedIn(PEOPLE.dealers.lanternhill.dealer);
    expect((await dealerExportRoute(new Request(`http://x/api/credits/export?brand=${await orgId('torvane')}`), { params: Promise.resolve({}) })).status).toBe(403);
    await signedIn(PEOPLE.dealers.lanternhill.admin);
    expect((await dealerExportRoute(new Request(`http://x/api/credits/export?brand=not-a-uuid`), { params: Promise.resolve({}) })).status).toBe(422);

    const view = await dealerCredits(await signedIn(PEOPLE.dealers.lanternhill.admin));
    const torvane = view.find((v) => v.brandName === 'Torvane Drive Systems')!;
    expect(torvane.memos.map((m) => m.number)).toContain(memo.memoNumber);
    expect(torvane.memos.map((m) => m.number)).not.toContain(other.memo.memoNumber);
  });
});
