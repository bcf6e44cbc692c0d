import 'server-only';
import { addDays, isIsoDate } from '@/lib/calendar';
import { localDate, localDateOfEpoch } from '@/lib/calendar/time-zone';
import { approvedLinesOf } from '@/lib/credits/from-claim';
import { memosWithLines, type StoredMemo } from '@/lib/db/credit-memos';
import { brandSettings, claimParts, insertLiabilityEntry, liabilityEntries, partCosts, shippedClaims, type LiabilityEntry } from '@/lib/db/liability';
import type { AppUser } from '@/lib/db/users';
import { ConflictError, ForbiddenError, ValidationError } from '@/lib/errors';
import { formatMoney, type CurrencyCode } from '@/lib/money';
import { ageOpenItems, type OpenItem } from '@/lib/reconciliation';
import {
  exportMemosCsv,
  liabilityRollForward,
  warrantyCost,
  type CostGrouping,
  type LiabilityMovement,
  type MemoForExport,
  type ShipmentAtCost,
} from '@/lib/reports';

function requireAccountant(user: AppUser): void {
  if (user.role !== 'accountant') throw new ForbiddenError('Only the brand accountant sees the warranty accounts.');
}

export function todayFor(timeZone: string): string {
  return localDateOfEpoch(Date.now(), timeZone);
}

/**
 * Memos still open: not confirmed against a statement. A memo and its reversal that were both
 * never paid settle each other and are left out.
 */
export function openMemos(memos: readonly StoredMemo[]): StoredMemo[] {
  const byId = new Map(memos.map((m) => [m.id, m]));
  const cancelled = new Set<string>();
  for (const m of memos) {
    if (m.kind !== 'reversal' || !m.reversesMemoId) continue;
    const original = byId.get(m.reversesMemoId);
    if (original && !original.reconciledAt && !m.reconciledAt) {
      cancelled.add(m.id);
      cancelled.add(original.id);
    }
  }
  return memos.filter((m) => !m.reconciledAt && !cancelled.has(m.id));
}

export function asOpenItems(memos: readonly StoredMemo[]): OpenItem[] {
  return openMemos(memos).map((m) => ({ id: m.id, dealerId: m.dealerId, currency: m.currency, amountMinor: m.totalMinor, issuedOn: m.issuedOn }));
}

export async function agingReport(user: AppUser, asOfInput?: string) {
  requireAccountant(user);
  const brand = await brandSettings(user.organisationId);
  const asOf = asOfInput && isIsoDate(asOfInput) ? asOfInput : todayFor(brand.timeZone);
  const memos = (await memosWithLines({ brandId: user.organisationId })).filter((m) => m.issuedOn <= asOf);
  const report = ageOpenItems(asOpenItems(memos), asOf);
  const dealerNames = Object.fromEntries(memos.map((m) => [m.dealerId, m.dealerName]));
  return { ...report, dealerNames, currency: brand.currency as CurrencyCode };
}

/** Replacement parts shipped by the brand, at its cost: a settlement of the warranty in kind. */
async function shipmentsAtCost(brandId: string, currency: CurrencyCode, timeZone: string): Promise<ShipmentAtCost[]> {
  const [claims, costs] = await Promise.all([shippedClaims(brandId), partCosts(brandId)]);
  const out: ShipmentAtCost[] = [];
  for (const c of claims) {
    const approved = approvedLinesOf({ requested: c.requestedLines, approved: c.approvedLines, approvalFlags: c.approvalFlags ?? [] });
    for (const p of approved.parts) {
      if (p.fromDealerStock || p.approvedQuantity === 0) continue;
      const cost = costs.get(p.line.partNumber);
      if (!cost || cost.unitCostMinor === null) continue;
      out.push({
        rmaNumber: c.rmaNumber ?? c.claimId, shippedOn: localDate(c.shippedAt, timeZone), currency, partNumber: p.line.partNumber,
        category: cost.category, quantity: p.approvedQuantity, unitCostMinor: cost.unitCostMinor,
      });
    }
  }
  return out;
}

export type Period = { from: string; to: string };

function checkPeriod(p: Period): void {
  if (!isIsoDate(p.from) || !isIsoDate(p.to)) throw new ValidationError('Give the period as two dates.', { from: ['Use a date like 2026-01-01.'] });
  if (p.to < p.from) throw new ValidationError('The period ends before it starts.', { to: ['The end is before the start.'] });
}

export async function warrantyCostReport(user: AppUser, period: Period, groupBy: CostGrouping) {
  requireAccountant(user);
  checkPeriod(period);
  const brand = await brandSettings(user.organisationId);
  const currency = brand.currency as CurrencyCode;
  const memos = await memosWithLines({ brandId: user.organisationId }, period);
  const parts = await claimParts([...new Set(memos.map((m) => m.claimId))]);
  const shipments = await shipmentsAtCost(user.organisationId, currency, brand.timeZone);
  return warrantyCost(
    {
      currency,
      memos: memos.map((m) => ({ number: m.number, issuedOn: m.issuedOn, currency: m.currency, claimPart: parts.get(m.claimId) ?? { partNumber: 'no part', category: 'other' }, lines: m.lines })),
      shipments,
      from: period.from,
      to: period.to,
    },
    groupBy,
  );
}

/**
 * The warranty liability roll-forward for a period (ASC 460-10-50-8(c)). The beginning balance
 * is the accountant's latest starting balance on or before the period, rolled forward through
 * the movements between it and the period's start.
 */
export async function rollForwardReport(user: AppUser, period: Period) {
  requireAccountant(user);
  checkPeriod(period);
  const brand = await brandSettings(user.organisationId);
  const currency = brand.currency as CurrencyCode;
  const [entries, memos, shipments] = await Promise.all([
    liabilityEntries(user.organisationId),
    memosWithLines({ brandId: user.organisationId }, { to: period.to }),
    shipmentsAtCost(user.organisationId, currency, brand.timeZone),
  ]);
  const opening = [...entries].reverse().find((e) => e.kind === 'opening_balance' && e.entryDate <= period.from) ?? null;
  const start = opening?.entryDate ?? null;
  const movements: LiabilityMovement[] = [
    ...memos.map((m) => ({ date: m.issuedOn, kind: 'settlement_cash' as const, amountMinor: m.totalMinor, note: m.number })),
    ...shipments.map((s) => ({ date: s.shippedOn, kind: 'settlement_in_kind' as const, amountMinor: s.unitCostMinor * s.quantity, note: `${s.rmaNumber} ${s.partNumber}` })),
    ...entries
      .filter((e) => e.kind !== 'opening_balance')
      .map((e) => ({ date: e.entryDate, kind: e.kind as 'accrual' | 'change_in_estimate', amountMinor: e.amountMinor, note: e.note })),
  ];
  let beginning = opening?.amountMinor ?? 0;
  if (start !== null && start < period.from) {
    const before = liabilityRollForward({
      currency, periodStart: start, periodEnd: addDays(period.from, -1), beginningBalanceMinor: beginning,
      movements: movements.filter((m) => m.date >= start && m.date < period.from),
    });
    beginning = before.endingBalanceMinor;
  }
  const inPeriod = movements.filter((m) => m.date >= period.from && m.date <= period.to);
  const table = liabilityRollForward({ currency, periodStart: period.from, periodEnd: period.to, beginningBalanceMinor: beginning, movements: inPeriod });
  return { table, opening, entries, movementCount: inPeriod.length, countedFromZero: opening === null };
}

export async function addLiabilityEntry(
  user: AppUser,
  e: { entryDate: string; kind: LiabilityEntry['kind']; amountMinor: number; note: string; clientKey?: string },
): Promise<{ id: number; replayed: boolean }> {
  requireAccountant(user);
  if (e.kind === 'accrual' && e.amountMinor < 0) {
    throw new ValidationError('An accrual is not negative.', { amount: ['Record a reduction as a change in estimate.'] });
  }
  const brand = await brandSettings(user.organisationId);
  const out = await insertLiabilityEntry({
    brandId: user.organisationId, entryDate: e.entryDate, kind: e.kind, amountMinor: e.amountMinor, currency: brand.currency, note: e.note.trim(), by: user.id,
    ...(e.clientKey ? { clientKey: e.clientKey } : {}),
  });
  const s = out.stored;
  if (out.replayed && (s.entryDate !== e.entryDate || s.kind !== e.kind || s.amountMinor !== e.amountMinor || s.note !== e.note.trim())) {
    // The form's first send was saved though its answer never arrived; this one says something else.
    throw new ConflictError(
      `This form was saved already: ${formatMoney(s.amountMinor, brand.currency as CurrencyCode, { accounting: true })} on ${s.entryDate} (“${s.note}”). Nothing else was recorded; reload the page to enter another.`,
    );
  }
  return { id: out.id, replayed: out.replayed };
}

export function forExport(m: StoredMemo): MemoForExport {
  return {
    kind: m.kind, currency: m.currency, lines: m.lines, totalMinor: m.totalMinor,
    ...(m.kind === 'reversal' && m.reversesMemoNumber ? { reversal: { reversesMemoNumber: m.reversesMemoNumber, reason: m.reason ?? '' } } : {}),
    number: m.number, issuedOn: m.issuedOn, dealerId: m.dealerId, dealerAccount: m.dealerAccountNumber, claimNumber: m.claimNumber, rmaNumber: m.rmaNumber,
  };
}

/** Memos and lines issued in a period, in our documented CSV layout. */
export async function exportBrandMemos(user: AppUser, period: Partial<Period>): Promise<string> {
  requireAccountant(user);
  const memos = await memosWithLines({ brandId: user.organisationId }, period);
  return exportMemosCsv(memos.map(forExport));
}
