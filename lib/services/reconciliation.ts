import 'server-only';
import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import { db } from '@/db/connection';
import { daysBetween } from '@/lib/calendar';
import { parseDocumentNumber } from '@/lib/credits';
import { findClaimForUser } from '@/lib/db/claims';
import { findMemoByNumber } from '@/lib/db/credit-memos';
import { brandDealerAccounts } from '@/lib/db/dealer-accounts';
import {
  accountsByNumber,
  decideMatch,
  findImport,
  findImportBySha,
  findMatch,
  findStatementLine,
  insertImport,
  insertMatches,
  insertStatementLines,
  liveMatchOfLine,
  liveMatchOfMemo,
  lockBrandStatements,
  memosOpenForMatching,
  saveSource,
  statementLines,
  unmatchedMemos,
  type LineFilter,
  type LineOutcome,
  type MatchRecord,
  type NewMatch,
  type NewStatementLine,
  type StatementOptions,
} from '@/lib/db/statements';
import type { AppUser } from '@/lib/db/users';
import { AppError, ConflictError, ForbiddenError, NotFoundError, ValidationError } from '@/lib/errors';
import type { CurrencyCode } from '@/lib/money';
import { matchStatement, parseStatementCsv, type StatementLine, type StatementRowError } from '@/lib/reconciliation';
import { toColumnMapping, type HeaderMapping } from '@/lib/reconciliation/suggest-mapping';
import { applyStep, logClaimNote } from '@/lib/services/claim-steps';

function requireAccountant(user: AppUser): void {
  if (user.role !== 'accountant') throw new ForbiddenError('Only the brand accountant can reconcile statements.');
}

/** A statement refused as a whole: every row problem, nothing imported. */
export class StatementRejected extends AppError {
  constructor(readonly rowErrors: StatementRowError[]) {
    super(
      `The statement was not imported: ${rowErrors.length} problem${rowErrors.length === 1 ? '' : 's'} to fix first. Nothing was added.`,
      422,
      { rowErrors: rowErrors.slice(0, 200), errorCount: rowErrors.length },
    );
  }
}

export type ImportRequest = {
  sourceName: string;
  dealerId: string | null;
  fileName: string;
  csv: string;
  mapping: HeaderMapping;
  options: StatementOptions;
};

const pgCode = (e: unknown) => (e as { code?: string } | null)?.code;

const UNMATCHED_WORDS: Record<string, string> = {
  no_candidate: 'no memo by reference, none of this amount in the date window',
  reference_other_dealer: 'the reference names a memo of another dealer',
  reference_other_currency: 'the reference names a memo in another currency',
  no_dealer: 'no reference found, and no dealer to match the amount for',
};
export const unmatchedWords = (reason: string) => UNMATCHED_WORDS[reason] ?? reason.replace(/_/g, ' ');

/**
 * Imports a dealer statement or an accounting export, all or nothing: the CSV is read with the
 * accountant's column mapping (remembered for the source), every row problem is listed and
 * nothing is stored; otherwise the lines are stored with what matching found, and the
 * proposals wait for the accountant. The same file twice is refused.
 */
export async function importStatement(user: AppUser, req: ImportRequest) {
  requireAccountant(user);
  const brand = await db()('organisations').where({ id: user.organisationId, kind: 'brand' }).first('currency');
  const currency = brand.currency as CurrencyCode;
  if (req.dealerId) {
    const accounts = await brandDealerAccounts(user.organisationId);
    if (!accounts.some((a) => a.dealerId === req.dealerId)) {
      throw new ValidationError('That dealer has no account with your brand.', { dealerId: ['Choose one of your dealers, or “several dealers”.'] });
    }
  }
  const sha256 = createHash('sha256').update(req.csv).digest('hex');
  const duplicate = await findImportBySha(user.organisationId, sha256);
  if (duplicate) throw duplicateError(duplicate);

  const mapping = toColumnMapping(req.mapping);
  if (!mapping) throw new ValidationError('Say which column holds the date.', { 'mapping.date': ['Choose the date column.'] });
  const parsed = parseStatementCsv(req.csv, {
    mapping, currency, decimalSeparator: req.options.decimalSeparator, dateFormat: req.options.dateFormat, negate: req.options.negate,
  });
  if (!parsed.ok) throw new StatementRejected(parsed.errors);
  const lines = await resolveDealers(user.organisationId, parsed.lines, req, mapping.dealerId !== undefined);

  try {
    return await db().transaction(async (trx) => {
      await lockBrandStatements(trx, user.organisationId);
      const again = await findImportBySha(user.organisationId, sha256, trx);
      if (again) throw duplicateError(again);
      const sourceId = await saveSource(trx, { brandId: user.organisationId, name: req.sourceName.trim(), dealerId: req.dealerId, mapping: req.mapping, options: req.options });
      const importId = await insertImport(trx, {
        brandId: user.organisationId, sourceId, dealerId: req.dealerId, fileName: req.fileName, sha256, currency,
        dateWindowDays: req.options.dateWindowDays, mapping: req.mapping, options: req.options, lineCount: lines.length, by: user.id,
      });
      const memos = await memosOpenForMatching(trx, user.organisationId);
      const result = matchStatement(lines, memos, {
        dateWindowDays: req.options.dateWindowDays,
        ...(req.dealerId ? { statementDealerId: req.dealerId } : {}),
      });
      const memoNumber = new Map(memos.map((m) => [m.id, m.number]));
      const outcomes = new Map<number, LineOutcome>();
      for (const m of result.matches) outcomes.set(m.lineNo, { type: 'proposed' });
      for (const a of result.ambiguous) {
        outcomes.set(a.lineNo, {
          type: 'ambiguous', reason: a.reason, basis: a.basis, candidateCount: a.candidateCount,
          candidates: a.candidates.map((c) => ({ memoId: c.memoId, memoNumber: c.memoNumber ?? memoNumber.get(c.memoId) ?? '', daysApart: c.daysApart })),
        });
      }
      for (const u of result.unmatchedLines) outcomes.set(u.lineNo, { type: 'unmatched', reason: u.reason });
      const rows: NewStatementLine[] = lines.map((l) => ({
        lineNo: l.lineNo, reference: l.reference ?? null, amountMinor: l.amountMinor, date: l.date, currency: l.currency,
        dealerId: l.dealerId ?? null, outcome: outcomes.get(l.lineNo) ?? { type: 'unmatched', reason: 'no_candidate' },
      }));
      const ids = await insertStatementLines(trx, importId, rows);
      const proposals: NewMatch[] = result.matches.map((m) => ({
        brandId: user.organisationId, lineId: ids.get(m.lineNo)!, memoId: m.memoId, basis: m.basis, referenceField: m.referenceField ?? null,
        amountDifferenceMinor: m.amountDifferenceMinor, daysApart: m.daysApart, by: user.id,
        note: m.basis === 'reference' ? 'found by reference' : 'same amount within the date window',
      }));
      await insertMatches(trx, proposals);
      return {
        importId, lines: lines.length, proposed: proposals.length, ambiguous: result.ambiguous.length, unmatched: result.unmatchedLines.length,
      };
    });
  } catch (e) {
    if (pgCode(e) === '23505') {
      const d = await findImportBySha(user.organisationId, sha256);
      if (d) throw duplicateError(d);
    }
    throw e;
  }
}

function duplicateError(d: { id: string; fileName: string; importedAt: string; sourceName: string }) {
  return new ConflictError(
    `This file was imported already (${d.fileName}, from “${d.sourceName}”, on ${d.importedAt.slice(0, 10)}). Nothing was added.`,
    { importId: d.id },
  );
}

/** An account-number column names the dealer of each line; all or nothing like the rest of the file. */
async function resolveDealers(brandId: string, lines: StatementLine[], req: ImportRequest, byAccount: boolean): Promise<StatementLine[]> {
  if (!byAccount) return lines.map((l) => ({ ...l, ...(req.dealerId ? { dealerId: req.dealerId } : {}) }));
  const accounts = await accountsByNumber(brandId);
  const errors: StatementRowError[] = [];
  const out = lines.map((l) => {
    const raw = l.dealerId?.trim() ?? '';
    if (!raw) return { ...l, ...(req.dealerId ? { dealerId: req.dealerId } : {}) };
    const hit = accounts.get(raw.toUpperCase());
    if (!hit) {
      errors.push({ row: l.lineNo, column: req.mapping.account, field: 'dealerId', message: `"${raw}" is not a dealer account of your brand` });
      return l;
    }
    if (req.dealerId && hit.dealerId !== req.dealerId) {
      errors.push({ row: l.lineNo, column: req.mapping.account, field: 'dealerId', message: `account ${raw} is ${hit.dealerName}'s, not the statement's dealer` });
    }
    return { ...l, dealerId: hit.dealerId };
  });
  if (errors.length) throw new StatementRejected(errors);
  return out;
}

async function lineRef(match: Pick<MatchRecord, 'fileName' | 'lineNo'>): Promise<string> {
  return `${match.fileName}, row ${match.lineNo}`;
}

function refuseDecided(m: MatchRecord): never {
  const when = m.decidedAt ? ` on ${new Date(m.decidedAt).toISOString().slice(0, 10)}` : '';
  const who = m.decidedByName ? ` by ${m.decidedByName}` : '';
  throw new ConflictError(`This match of ${m.memoNumber} was ${m.status} already${who}${when}; nothing changed.`, { status: m.status });
}

function refuseCrossing(m: Pick<MatchRecord, 'lineCurrency' | 'memoCurrency' | 'lineDealerId' | 'memoDealerId' | 'memoNumber'>): void {
  if (m.lineCurrency !== m.memoCurrency) {
    throw new ValidationError(`The statement line is in ${m.lineCurrency} and ${m.memoNumber} in ${m.memoCurrency}; a match never crosses currencies.`);
  }
  if (m.lineDealerId && m.lineDealerId !== m.memoDealerId) {
    throw new ValidationError(`${m.memoNumber} is another dealer's memo than this statement line's; a match never crosses dealers.`);
  }
}

/**
 * Confirms a proposed match. The claim credit memo of a credited claim moves the claim to
 * reconciled in the same transaction (RECONCILE); a chargeback or reversal memo is marked
 * matched and logged on the claim. Confirming twice is refused.
 */
export async function confirmMatch(user: AppUser, matchId: string): Promise<{ reconciledClaim: boolean }> {
  requireAccountant(user);
  const seen = await findMatch(user.organisationId, matchId);
  if (!seen) throw new NotFoundError('No such match.');
  if (seen.status !== 'proposed') refuseDecided(seen);
  refuseCrossing(seen);
  const claim = await findClaimForUser(user, seen.claimId);
  if (!claim) throw new NotFoundError('No such claim.');
  const statementLineRef = await lineRef(seen);

  const decide = async (trx: Knex) => {
    const locked = await findMatch(user.organisationId, matchId, trx, true);
    if (!locked) throw new NotFoundError('No such match.');
    if (locked.status !== 'proposed') refuseDecided(locked);
    return locked;
  };
  const write = async (trx: Knex) => {
    if (!(await decideMatch(trx, { brandId: user.organisationId, id: matchId, status: 'confirmed', by: user.id }))) {
      const again = await findMatch(user.organisationId, matchId, trx);
      if (again) refuseDecided(again);
      throw new ConflictError('The match changed at the same moment; nothing changed.');
    }
  };

  const reconciles = seen.memoKind === 'claim' && !seen.memoReversed && claim.stage === 'credited';
  if (reconciles) {
    await applyStep(user, claim.id, 'RECONCILE', { statementLineRef }, {
      prepare: async ({ trx }) => {
        // Under the claim's lock (which a reversal takes too): the memo may have been reversed since it was read.
        const locked = await decide(trx);
        if (locked.memoReversed) {
          throw new ConflictError(`${locked.memoNumber} was reversed a moment ago; a reversed memo does not reconcile the claim. Nothing changed.`);
        }
        return {};
      },
      after: async ({ trx }) => write(trx),
    });
    return { reconciledClaim: true };
  }
  await db().transaction(async (trx) => {
    const locked = await findClaimForUser(user, claim.id, trx, true);
    if (!locked) throw new NotFoundError('No such claim.');
    const m = await decide(trx);
    await write(trx);
    await logClaimNote(trx, user, locked, 'STATEMENT_MATCHED', { memo: m.memoNumber, statementLineRef, note: `${m.memoNumber} matched to ${statementLineRef}` });
  });
  return { reconciledClaim: false };
}

/** Rejects a proposal: the line and the memo are free again, and the rejection is logged. */
export async function rejectMatch(user: AppUser, matchId: string, note?: string): Promise<void> {
  requireAccountant(user);
  await db().transaction(async (trx) => {
    const m = await findMatch(user.organisationId, matchId, trx, true);
    if (!m) throw new NotFoundError('No such match.');
    if (m.status !== 'proposed') refuseDecided(m);
    await decideMatch(trx, { brandId: user.organisationId, id: matchId, status: 'rejected', by: user.id, note: note?.trim() || 'rejected' });
  });
}

/** The accountant names the memo a statement line pays: a proposal to confirm, never across dealers or currencies. */
export async function chooseMemoForLine(user: AppUser, lineId: string, memoNumberText: string): Promise<{ matchId: string }> {
  requireAccountant(user);
  const parsed = parseDocumentNumber(memoNumberText);
  if (!parsed.ok) throw new ValidationError(parsed.message, { memoNumber: [parsed.message] });
  if (parsed.kind !== 'credit_memo') throw new ValidationError('That is not a credit memo number.', { memoNumber: ['A credit memo number starts with CM-.'] });
  try {
    return await db().transaction(async (trx) => {
      await lockBrandStatements(trx, user.organisationId);
      const line = await findStatementLine(user.organisationId, lineId, trx, true);
      if (!line) throw new NotFoundError('No such statement line.');
      const memo = await findMemoByNumber(user.organisationId, parsed.canonical, trx);
      if (!memo) throw new ValidationError(`No memo ${parsed.canonical} of your brand.`, { memoNumber: ['No such memo.'] });
      refuseCrossing({ lineCurrency: line.currency, memoCurrency: memo.currency, lineDealerId: line.dealerId, memoDealerId: memo.dealerId, memoNumber: memo.number });
      const lineMatch = await liveMatchOfLine(line.id, trx);
      if (lineMatch) throw new ConflictError(`This line is ${lineMatch.status === 'confirmed' ? 'matched' : 'proposed'} to ${lineMatch.memoNumber} already; reject that first.`);
      const memoMatch = await liveMatchOfMemo(memo.id, trx);
      if (memoMatch) throw new ConflictError(`${memo.number} is ${memoMatch.status === 'confirmed' ? 'matched' : 'proposed'} to ${memoMatch.fileName}, row ${memoMatch.lineNo} already.`);
      const [matchId] = await insertMatches(trx, [{
        brandId: user.organisationId, lineId: line.id, memoId: memo.id, basis: 'chosen', referenceField: null,
        amountDifferenceMinor: line.amountMinor - memo.totalMinor, daysApart: daysBetween(memo.issuedOn, line.date), by: user.id, note: 'chosen by hand',
      }]);
      return { matchId: matchId! };
    });
  } catch (e) {
    if (pgCode(e) === '23505') throw new ConflictError('The line or the memo was matched at the same moment; nothing changed.');
    if (pgCode(e) === '23514') throw new ValidationError((e as Error).message.split(' - ').pop() ?? 'That match is refused.');
    throw e;
  }
}

export async function statementView(user: AppUser, importId: string, filter: LineFilter, page: number) {
  requireAccountant(user);
  const imp = await findImport(user.organisationId, importId);
  if (!imp) throw new NotFoundError('No such statement.');
  const pageSize = 100;
  const [lines, memos] = await Promise.all([statementLines(imp.id, filter, page, pageSize), unmatchedMemos(user.organisationId, imp.dealerId, 25)]);
  return { import: imp, lines, memos, page, pageSize, filter };
}
