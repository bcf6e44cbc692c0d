import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/connection';
import { localDate, localDateOfEpoch } from '@/lib/calendar/time-zone';
import {
  adjustLine,
  computeChargebackMemo,
  computeCredit,
  CreditInputError,
  formatCreditMemoNumber,
  reverseMemo as reverseDraft,
  type ChargebackReason,
  type CreditInput,
  type CreditMemoDraft,
} from '@/lib/credits';
import { draftHash } from '@/lib/credits/draft-hash';
import { creditInputFromClaim, netLaborCredited } from '@/lib/credits/from-claim';
import { findClaimForUser, nextBrandSequence, type ClaimRecord } from '@/lib/db/claims';
import { creditCatalog, creditTerms, listCreditQueue, type QueueQuery } from '@/lib/db/credit-inputs';
import {
  draftEditsOf,
  findMemoByKey,
  findMemoForUser,
  insertDraftEdit,
  insertMemo,
  memosOfClaim,
  type DraftEdit,
  type MemoRow,
  type StoredMemo,
} from '@/lib/db/credit-memos';
import { rejectProposalsOfMemo } from '@/lib/db/statements';
import type { AppUser } from '@/lib/db/users';
import { AppError, ConflictError, ForbiddenError, NotFoundError, ValidationError } from '@/lib/errors';
import { formatMoney, parseAmount, type CurrencyCode } from '@/lib/money';
import { applyStep, logClaimNote, type StepOutcome } from '@/lib/services/claim-steps';
import { notifyDealer } from '@/lib/services/claim-notify';
import { describeState, EVENT_RULES } from '@/machines/claim';

/** The fields of a claim its credit is computed from. */
export type CreditClaim = Pick<
  ClaimRecord,
  'id' | 'brandId' | 'dealerAccountId' | 'currency' | 'requestedLines' | 'approvedLines' | 'context' | 'failureDate'
>;

function requireAccountant(user: AppUser, does = EVENT_RULES.ISSUE_CREDIT.does): void {
  if (user.role !== 'accountant') throw new ForbiddenError(`Only the brand accountant can ${does}.`);
}

function issuesToFieldErrors(e: CreditInputError): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const i of e.issues) (out[i.path || '_form'] ??= []).push(i.message);
  return out;
}

/** The credit input of a claim, read from its approved lines, lifecycle record and the brand's catalog. */
export async function creditInputFor(claim: CreditClaim, q: Knex = db()): Promise<CreditInput> {
  const terms = await creditTerms(claim, q);
  const catalog = await creditCatalog(claim.brandId, [claim.requestedLines, ...(claim.approvedLines ? [claim.approvedLines] : [])], q);
  const fittedAt = claim.context.replacement.fittedAt;
  // The price list is read on the repair date: the day the replacement was fitted, in the brand's calendar.
  const priceDate = fittedAt
    ? localDate(fittedAt, terms.brandTimeZone)
    : (claim.failureDate ?? localDateOfEpoch(Date.now(), terms.brandTimeZone));
  return creditInputFromClaim(
    {
      currency: claim.currency as CurrencyCode,
      requested: claim.requestedLines,
      approved: claim.approvedLines,
      approvalFlags: claim.context.approvedLines,
      afterTest: claim.context.afterTest,
      chargebackReasons: claim.context.chargebackReasons,
      inspectionNotes: claim.context.core.inspection?.notes ?? null,
      priceDate,
      laborRates: { dealerRateMinor: terms.dealerRateMinor, brandMaxRateMinor: terms.brandMaxRateMinor },
    },
    catalog,
  );
}

export type ComputedDraft = { input: CreditInput; draft: CreditMemoDraft; hash: string };

/** The computed memo with the accountant's edits replayed in order. Throws CreditInputError. */
export async function computeDraft(claim: CreditClaim, edits: readonly DraftEdit[], q: Knex = db()): Promise<ComputedDraft> {
  const input = await creditInputFor(claim, q);
  let draft = computeCredit(input);
  for (const e of edits) draft = adjustLine(draft, { lineNo: e.lineNo, amountMinor: e.amountMinor, reason: e.reason, by: e.byName, at: e.at });
  return { input, draft, hash: draftHash(draft) };
}

/** A draft can be worked on before the first memo, and again after every claim memo was reversed. */
function draftOpen(claim: Pick<ClaimRecord, 'stage'>, memos: readonly MemoRow[]): boolean {
  if (claim.stage === 'credit_pending') return true;
  if (claim.stage !== 'credited' && claim.stage !== 'reconciled') return false;
  const claimMemos = memos.filter((m) => m.kind === 'claim');
  return claimMemos.length > 0 && claimMemos.every((m) => m.reversedByMemoId !== null);
}

export type CreditView = {
  claim: ClaimRecord;
  state: ReturnType<typeof describeState>;
  open: boolean;
  computed: ComputedDraft | null;
  problems: { path: string; message: string }[];
  edits: DraftEdit[];
  memos: StoredMemo[];
  /** Whether a chargeback memo may be issued now (credited, none outstanding). */
  chargebackAllowed: boolean;
};

/** Everything the accountant's credit page for one claim shows. */
export async function loadCreditView(user: AppUser, claimId: string): Promise<CreditView> {
  requireAccountant(user, 'work on credits');
  const claim = await findClaimForUser(user, claimId);
  if (!claim) throw new NotFoundError('No such claim.');
  const [edits, memos] = await Promise.all([draftEditsOf(claim.id), memosOfClaim(claim.id)]);
  const open = draftOpen(claim, memos);
  let computed: ComputedDraft | null = null;
  let problems: CreditView['problems'] = [];
  if (open || claim.stage === 'approved') {
    try {
      computed = await computeDraft(claim, edits);
    } catch (e) {
      if (!(e instanceof CreditInputError)) throw e;
      problems = e.issues;
    }
  }
  return {
    claim, state: describeState(claim.stateValue), open, computed, problems, edits, memos,
    chargebackAllowed: (claim.stage === 'credited' || claim.stage === 'reconciled') && !outstandingChargeback(memos),
  };
}

function outstandingChargeback(memos: readonly StoredMemo[]): StoredMemo | undefined {
  return memos.find((m) => m.kind !== 'reversal' && m.reversedByMemoId === null && m.lines.some((l) => l.kind === 'chargeback'));
}

/** The credits queue: one page of claims waiting for a memo, each with its computed total. */
export async function creditQueue(user: AppUser, query: QueueQuery) {
  requireAccountant(user, 'see the credits queue');
  const page = await listCreditQueue(user, query);
  const rows = await Promise.all(
    page.rows.map(async (r) => {
      const claim: CreditClaim = { ...r, currency: r.currency };
      let totalMinor: number | null = null;
      let problem: string | null = null;
      let chargeback = false;
      let laborWithheld = false;
      try {
        const { draft } = await computeDraft(claim, await draftEditsOf(r.id));
        totalMinor = draft.totalMinor;
        chargeback = draft.lines.some((l) => l.kind === 'chargeback');
        laborWithheld = draft.lines.some((l) => l.status === 'withheld');
      } catch (e) {
        if (!(e instanceof CreditInputError)) throw e;
        problem = e.issues[0]?.message ?? 'cannot be computed';
      }
      const { context, requestedLines: _r, approvedLines: _a, failureDate: _f, ...rest } = r;
      return {
        ...rest,
        afterTest: context.afterTest.outcome,
        core: context.core.outcome,
        inspection: context.core.inspection?.result ?? null,
        totalMinor,
        chargeback,
        laborWithheld,
        problem,
      };
    }),
  );
  return { rows, total: page.total };
}
export type QueueItem = Awaited<ReturnType<typeof creditQueue>>['rows'][number];

/** An accountant's edit of one draft line, with its reason; logged on the claim. */
export async function editCreditLine(user: AppUser, claimId: string, edit: { lineNo: number; amount: string; reason: string }): Promise<{ totalMinor: number }> {
  requireAccountant(user, 'edit a credit');
  return db().transaction(async (trx) => {
    const claim = await findClaimForUser(user, claimId, trx, true);
    if (!claim) throw new NotFoundError('No such claim.');
    const memos = await memosOfClaim(claim.id, trx);
    if (!draftOpen(claim, memos)) {
      const issued = memos.find((m) => m.kind === 'claim' && m.reversedByMemoId === null);
      throw new ConflictError(
        issued
          ? `Memo ${issued.number} is issued for this claim and an issued memo is never edited. To correct it, reverse it and issue a corrected memo.`
          : `The credit can be edited once the claim is waiting for it; it is ${describeState(claim.stateValue).label.toLowerCase()}.`,
        { stage: claim.stage, version: claim.version },
      );
    }
    const amount = parseAmount(edit.amount.trim(), { currency: claim.currency as CurrencyCode });
    if (!amount.ok) throw new ValidationError('The amount is not an amount.', { amount: [amount.message] });
    const edits = await draftEditsOf(claim.id, trx);
    let computed: ComputedDraft;
    try {
      computed = await computeDraft(claim, edits, trx);
    } catch (e) {
      if (e instanceof CreditInputError) throw new ValidationError(`The credit cannot be computed: ${e.message}`, issuesToFieldErrors(e));
      throw e;
    }
    const line = computed.draft.lines.find((l) => l.lineNo === edit.lineNo);
    // The accountant adjusts what was approved; a line the rep did not approve (or a part the brand
    // shipped) is not turned into a credit here.
    if (line?.status === 'not_credited') {
      throw new ValidationError(`Line ${line.lineNo} is not credited (${line.description.split(' — ').pop()}); a credit for it needs the rep’s approval, not an adjustment.`, {
        _form: ['Only credited lines and chargebacks are adjusted.'],
      });
    }
    let next: CreditMemoDraft;
    try {
      next = adjustLine(computed.draft, { lineNo: edit.lineNo, amountMinor: amount.value, reason: edit.reason, by: user.name, at: new Date().toISOString() });
    } catch (e) {
      if (!(e instanceof CreditInputError)) throw e;
      const fields: Record<string, string[]> = {};
      for (const i of e.issues) (fields[i.path === 'amountMinor' ? 'amount' : i.path === 'lineNo' ? '_form' : i.path] ??= []).push(i.message);
      throw new ValidationError(e.issues[0]?.message ?? 'The edit is refused.', fields);
    }
    await insertDraftEdit(trx, { claimId: claim.id, lineNo: edit.lineNo, lineKind: line!.kind, amountMinor: amount.value, reason: edit.reason.trim(), by: user.id });
    await logClaimNote(trx, user, claim, 'CREDIT_LINE_EDITED', {
      lineNo: edit.lineNo, fromMinor: line!.amountMinor, toMinor: amount.value, currency: claim.currency, note: edit.reason.trim(),
    });
    return { totalMinor: next.totalMinor };
  });
}

export type IssueOutcome = StepOutcome & { memoId: string; memoNumber: string; totalMinor: number; replayed: boolean };

class Replayed extends AppError {
  constructor(readonly memo: MemoRow) {
    super('replayed', 200);
  }
}

// The key carries how many memos of the claim were reversed so far: after a reversal the same
// draft must issue a new memo, never replay the reversed one.
const issueKey = (claimId: string, hash: string, reversals: number) => `issue:${claimId}:${reversals}:${hash}`;
const reversalsOf = async (claimId: string) => (await memosOfClaim(claimId)).filter((m) => m.reversesMemoId).length;

function issueDate(at: string, timeZone: string): { issuedOn: string; year: number } {
  const issuedOn = localDate(at, timeZone);
  return { issuedOn, year: Number(issuedOn.slice(0, 4)) };
}

async function writeMemo(
  trx: Knex,
  user: AppUser,
  claim: ClaimRecord,
  draft: CreditMemoDraft,
  at: string,
  extra: { key: string; hash: string; reversesMemoId?: string; reason?: string | null },
): Promise<{ id: string; number: string }> {
  const terms = await creditTerms(claim, trx);
  const { issuedOn, year } = issueDate(at, terms.brandTimeZone);
  const number = formatCreditMemoNumber({ year, sequence: await nextBrandSequence(trx, claim.brandId, 'credit_memo', year) });
  const id = await insertMemo(trx, {
    ...draft, number, brandId: claim.brandId, dealerId: claim.dealerId, dealerAccountId: claim.dealerAccountId, claimId: claim.id,
    dealerAccountNumber: claim.accountNumber, claimNumber: claim.number, rmaNumber: claim.rmaNumber, issuedOn, issuedBy: user.id,
    idempotencyKey: extra.key, draftHash: extra.hash, reversesMemoId: extra.reversesMemoId ?? null, reason: extra.reason ?? null,
  });
  return { id, number };
}

function memoNotice(claim: ClaimRecord, number: string, draft: CreditMemoDraft, what: string) {
  const total = formatMoney(draft.totalMinor, draft.currency, { accounting: true });
  return {
    kind: 'credit_memo',
    title: `${what} ${number} for claim ${claim.number}`,
    body: `${claim.brandName} issued ${what.toLowerCase()} ${number} for ${total}. It is listed under Credits with its lines.`,
  };
}

/**
 * Issues the claim's credit memo exactly as the accountant saw it (`draftHash`) and moves the
 * claim to credited in the same transaction (ISSUE_CREDIT). Idempotent: the same draft issued
 * twice — a retry, a double click, two tabs — returns the one memo (`replayed`).
 */
export async function issueCredit(user: AppUser, claimId: string, draftHashSeen: string, expectedVersion?: number): Promise<IssueOutcome> {
  requireAccountant(user);
  if (!/^[0-9a-f]{64}$/.test(draftHashSeen)) throw new ValidationError('Open the credit again and issue it from there.', { draftHash: ['Missing or malformed.'] });
  const key = issueKey(claimId, draftHashSeen, await reversalsOf(claimId));
  try {
    const { outcome, memo } = await issueOnce(user, claimId, draftHashSeen, key, expectedVersion);
    return { ...outcome, memoId: memo.id, memoNumber: memo.number, totalMinor: memo.totalMinor, replayed: false };
  } catch (e) {
    // A stale or refused step may be the second click of an issue that went through: same key, same memo.
    const memo = e instanceof Replayed ? e.memo : e instanceof ConflictError ? await findMemoByKey(key) : null;
    if (memo && memo.claimId === claimId) {
      const claim = await findClaimForUser(user, claimId);
      if (!claim) throw new NotFoundError('No such claim.');
      const d = describeState(claim.stateValue);
      return {
        claimId, version: claim.version, from: claim.stateValue, to: claim.stateValue, stage: d.stage, label: d.label,
        memoId: memo.id, memoNumber: memo.number, totalMinor: memo.totalMinor, replayed: true,
      };
    }
    throw e;
  }
}

type Written = { id: string; number: string; totalMinor: number };

async function issueOnce(
  user: AppUser,
  claimId: string,
  hashSeen: string,
  key: string,
  expectedVersion: number | undefined,
): Promise<{ outcome: StepOutcome; memo: Written }> {
  let written: Written | null = null;
  const prepareMemo = async ({ trx, claim, at }: { trx: Knex; claim: ClaimRecord; at: string }) => {
    const existing = await findMemoByKey(key, trx);
    if (existing) throw new Replayed(existing);
    const computed = await computeDraft(claim, await draftEditsOf(claim.id, trx), trx).catch((e) => {
      if (e instanceof CreditInputError) throw new ValidationError(`The credit cannot be computed: ${e.message}`, issuesToFieldErrors(e));
      throw e;
    });
    if (computed.hash !== hashSeen) {
      throw new ConflictError('The credit changed since you opened it (an edit, a price or the claim itself). Look at it again; nothing was issued.', {
        stage: claim.stage, version: claim.version,
      });
    }
    const memo = await writeMemo(trx, user, claim, computed.draft, at, { key, hash: computed.hash });
    written = { ...memo, totalMinor: computed.draft.totalMinor };
    return { memo, draft: computed.draft };
  };

  // Before the first memo the claim steps to credited; a corrected memo after a reversal is logged only.
  const current = await findClaimForUser(user, claimId);
  if (!current) throw new NotFoundError('No such claim.');
  const done = (outcome: StepOutcome) => {
    if (!written) throw new Error('the memo was not written');
    return { outcome, memo: written as Written };
  };
  if (current.stage === 'credited' || current.stage === 'reconciled') {
    const outcome = await db().transaction(async (trx): Promise<StepOutcome> => {
      const claim = await findClaimForUser(user, claimId, trx, true);
      if (!claim) throw new NotFoundError('No such claim.');
      if (expectedVersion !== undefined && claim.version !== expectedVersion) {
        throw new ConflictError('This claim changed since you opened it; nothing was issued.', { stage: claim.stage, version: claim.version });
      }
      const existing = await findMemoByKey(key, trx);
      if (existing) throw new Replayed(existing);
      if (!draftOpen(claim, await memosOfClaim(claim.id, trx))) {
        throw new ConflictError('This claim has its credit memo already; reverse it first to issue a corrected one.', { stage: claim.stage, version: claim.version });
      }
      const at = new Date().toISOString();
      const { memo, draft } = await prepareMemo({ trx, claim, at });
      await logClaimNote(trx, user, claim, 'CREDIT_MEMO_REISSUED', { memoId: memo.id, number: memo.number, totalMinor: draft.totalMinor });
      await notifyDealer(trx, claim, memoNotice(claim, memo.number, draft, 'Corrected credit memo'));
      const d = describeState(claim.stateValue);
      return { claimId, version: claim.version, from: claim.stateValue, to: claim.stateValue, stage: d.stage, label: d.label };
    });
    return done(outcome);
  }

  let draft: CreditMemoDraft | null = null;
  let number = '';
  const outcome = await applyStep(user, claimId, 'ISSUE_CREDIT', {}, {
    expectedVersion,
    prepare: async (ctx) => {
      // Anything but a claim waiting for its credit: let the machine refuse in its own words.
      if (ctx.claim.stage !== 'credit_pending') return { memoId: 'none' };
      const out = await prepareMemo({ trx: ctx.trx, claim: ctx.claim, at: ctx.at });
      draft = out.draft;
      number = out.memo.number;
      return { memoId: out.memo.id };
    },
    after: async ({ trx, claim }) => {
      if (draft) await notifyDealer(trx, claim, memoNotice(claim, number, draft, 'Credit memo'));
    },
  });
  return done(outcome);
}

/**
 * A reversing memo: negates every posted line of an issued memo, so the two sum to zero. The
 * only correction of an issued memo; it is never edited.
 */
export async function reverseMemo(user: AppUser, memoId: string, reason: string): Promise<{ memoId: string; number: string; replayed: boolean }> {
  requireAccountant(user, 'reverse a credit memo');
  const memo = await findMemoForUser(user, memoId);
  if (!memo) throw new NotFoundError('No such credit memo.');
  const key = `reverse:${memo.id}`;
  if (!reason.trim()) throw new ValidationError('Say why the memo is reversed.', { reason: ['Say why the memo is reversed; the dealer sees it.'] });
  if (memo.kind === 'reversal') throw new ConflictError(`${memo.number} is itself a reversal and is not reversed again; issue a new memo instead.`);
  try {
    return await db().transaction(async (trx) => {
      const claim = await findClaimForUser(user, memo.claimId, trx, true);
      if (!claim) throw new NotFoundError('No such claim.');
      const existing = await findMemoByKey(key, trx);
      if (existing) throw new Replayed(existing);
      const draft = reverseDraft(memo, reason);
      const out = await writeMemo(trx, user, claim, draft, new Date().toISOString(), {
        key, hash: draftHash(draft), reversesMemoId: memo.id, reason: reason.trim(),
      });
      await rejectProposalsOfMemo(trx, { brandId: claim.brandId, memoId: memo.id, by: user.id, note: `${memo.number} was reversed by ${out.number}` });
      await logClaimNote(trx, user, claim, 'MEMO_REVERSED', { memoId: memo.id, memo: memo.number, reversal: out.number, note: reason.trim() });
      await notifyDealer(trx, claim, memoNotice(claim, out.number, draft, 'Reversing memo'));
      return { memoId: out.id, number: out.number, replayed: false };
    });
  } catch (e) {
    if (e instanceof Replayed) return { memoId: e.memo.id, number: e.memo.number, replayed: true };
    throw e;
  }
}

/**
 * A chargeback memo on a claim already credited, e.g. a part found not covered after the credit:
 * the parts at dealer net and, for the reasons that take it back, the labor still credited.
 */
export async function issueChargebackMemo(
  user: AppUser,
  claimId: string,
  request: { reason: ChargebackReason; note: string },
): Promise<{ memoId: string; number: string; replayed: boolean }> {
  requireAccountant(user, 'charge back a claim');
  try {
    return await db().transaction(async (trx) => {
      const claim = await findClaimForUser(user, claimId, trx, true);
      if (!claim) throw new NotFoundError('No such claim.');
      if (claim.stage !== 'credited' && claim.stage !== 'reconciled') {
        throw new ConflictError(
          claim.stage === 'credit_pending'
            ? 'This claim has no memo yet: its chargeback goes on the credit memo itself.'
            : `A chargeback memo follows an issued credit; this claim is ${describeState(claim.stateValue).label.toLowerCase()}.`,
          { stage: claim.stage, version: claim.version },
        );
      }
      const memos = await memosOfClaim(claim.id, trx);
      const outstanding = outstandingChargeback(memos);
      if (outstanding) {
        throw new ConflictError(`This claim carries a chargeback already (${outstanding.number}); reverse that memo first to charge back differently.`);
      }
      const input = await creditInputFor(claim, trx);
      const lines = memos.flatMap((m) => m.lines);
      const laborMemos = memos.filter((m) => m.reversedByMemoId === null && m.kind !== 'reversal' && m.lines.some((l) => l.kind === 'labor' && l.amountMinor > 0));
      let draft: CreditMemoDraft;
      try {
        draft = computeChargebackMemo({
          currency: input.currency, priceDate: input.priceDate, priceList: input.priceList, parts: input.parts,
          chargeback: { reason: request.reason, ...(request.note.trim() ? { note: request.note.trim() } : {}) },
          laborCreditedMinor: Math.max(0, netLaborCredited(lines)),
          creditedOnMemos: laborMemos.map((m) => m.number),
        });
      } catch (e) {
        if (e instanceof CreditInputError) throw new ValidationError(`The chargeback cannot be computed: ${e.message}`, issuesToFieldErrors(e));
        throw e;
      }
      if (draft.lines.length === 0) throw new ValidationError('Nothing on this claim can be charged back for that reason.', { reason: ['No approved part and no labor to take back.'] });
      const hash = draftHash(draft);
      const key = `chargeback:${claim.id}:${hash}`;
      const existing = await findMemoByKey(key, trx);
      if (existing) throw new Replayed(existing);
      const out = await writeMemo(trx, user, claim, draft, new Date().toISOString(), { key, hash, reason: request.note.trim() || null });
      await logClaimNote(trx, user, claim, 'CHARGEBACK_MEMO_ISSUED', { memoId: out.id, number: out.number, reason: request.reason, note: request.note.trim() || undefined });
      await notifyDealer(trx, claim, memoNotice(claim, out.number, draft, 'Chargeback memo'));
      return { memoId: out.id, number: out.number, replayed: false };
    });
  } catch (e) {
    if (e instanceof Replayed) return { memoId: e.memo.id, number: e.memo.number, replayed: true };
    throw e;
  }
}
