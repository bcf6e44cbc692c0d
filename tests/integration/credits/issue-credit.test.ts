import { describe, expect, it } from 'vitest';
import { POST as stepRoute } from '@/app/api/claims/[id]/steps/route';
import { GET as queueRoute } from '@/app/api/accounts/queue/route';
import { db } from '@/db/connection';
import { editCreditLine, issueChargebackMemo, issueCredit, loadCreditView, reverseMemo } from '@/lib/services/credits';
import { findMemoForUser } from '@/lib/db/credit-memos';
import { ConflictError, ForbiddenError, NotFoundError, ValidationError } from '@/lib/errors';
import { claimFor, memoCount, PEOPLE, signedIn, stageOf } from '../../support/credit-claims';

// Hand-worked figures use the demo catalog (db/seeds/demo-catalog.ts) and dealer rates
// (db/seeds/demo-people.ts): Torvane's maximum labor rate is 95.00 EUR/h; Kettenblatt's agreed
// rate is 79.00, Tidewheel's 104.00. DU-RR is 1.20 h, LT-BA 0.80 h, BAT-RR 0.30 h, DP-RR 0.50 h;
// dealer net prices: TV-BP625 519.00, TV-DPC2 159.00, TV-DU85 549.00.

const accountant = () => signedIn(PEOPLE.torvane.accountant);

async function draftOf(claimId: string) {
  const view = await loadCreditView(await accountant(), claimId);
  if (!view.computed) throw new Error(`no draft: ${JSON.stringify(view.problems)}`);
  return { view, ...view.computed };
}

describe('issuing the credit memo of a verified claim', () => {
  it('credits labor at the dealer rate under the cap, freight as approved, and moves the claim to credited in the same transaction', async () => {
    const claim = await claimFor({ dealer: 'kettenblatt' });
    const { draft, hash, view } = await draftOf(claim.id);
    // (1.20 + 0.80) h × 79.00 = 158.00 labor; freight 18.50; the drive unit was shipped by the brand (no part credit).
    expect(draft.lines.map((l) => [l.kind, l.status, l.amountMinor])).toEqual([
      ['part', 'not_credited', 0],
      ['labor', 'credited', 9480],
      ['labor', 'credited', 6320],
      ['freight', 'credited', 1850],
    ]);
    expect(draft.totalMinor).toBe(17650);
    const labor = draft.lines[1]!.basis;
    expect(labor).toMatchObject({ kind: 'labor', capApplied: false, rateAppliedMinor: 7900, dealerRateMinor: 7900, brandMaxRateMinor: 9500 });
    expect(view.claim.stage).toBe('credit_pending');
    // The queue lists it with the same computed total, found by its number.
    await signedIn(PEOPLE.torvane.accountant);
    const page = await (await queueRoute(new Request(`http://x/api/accounts/queue?q=${claim.number}`), { params: Promise.resolve({}) })).json();
    expect(page).toMatchObject({ total: 1, rows: [{ id: claim.id, totalMinor: 17650, afterTest: 'passed', core: 'inspected', chargeback: false }] });

    const outboxBefore = Number((await db()('outbox').count('id as n').first())!.n);
    const out = await issueCredit(await accountant(), claim.id, hash, view.claim.version);
    expect(out).toMatchObject({ replayed: false, stage: 'credited', totalMinor: 17650 });
    expect(out.memoNumber).toMatch(/^CM-\d{4}-\d{6}-\d$/);

    const row = await db()('claims').where({ id: claim.id }).first('stage', 'context');
    expect(row.stage).toBe('credited');
    expect(row.context.creditMemoId).toBe(out.memoId);
    const event = await db()('claim_events').where({ claim_id: claim.id, event: 'ISSUE_CREDIT' }).first('payload', 'actor_role');
    expect(event).toMatchObject({ actor_role: 'accountant', payload: { memoId: out.memoId } });

    const memo = await findMemoForUser(await accountant(), out.memoId);
    expect(memo).toMatchObject({ kind: 'claim', totalMinor: 17650, claimNumber: claim.number, rmaNumber: claim.rmaNumber, dealerAccountNumber: 'TV-DE-0791', currency: 'EUR' });
    expect(memo!.lines).toEqual(draft.lines);
    // The shop is told: the claim's filer and the shop admin.
    expect(Number((await db()('outbox').count('id as n').first())!.n)).toBe(outboxBefore + 2);
  });

  it('applies the brand cap when the dealer rate is above it, credits a part from dealer stock, and releases labor accepted by hand', async () => {
    const claim = await claimFor({
      dealer: 'tidewheel', partNumber: 'TV-BP625', parts: [{ partNumber: 'TV-BP625', quantity: 1, fromDealerStock: true }],
      labor: ['BAT-RR', 'LT-BA'], freightMinor: 0, afterTest: 'accepted_by_hand', core: 'waived',
    });
    const { draft } = await draftOf(claim.id);
    // 519.00 dealer net; (0.30 + 0.80) h × min(104.00, 95.00) = 28.50 + 76.00; freight 0.
    expect(draft.lines.map((l) => l.amountMinor)).toEqual([51900, 2850, 7600, 0]);
    expect(draft.totalMinor).toBe(62350);
    expect(draft.lines[1]!.basis).toMatchObject({ capApplied: true, rateAppliedMinor: 9500, dealerRateMinor: 10400, release: { state: 'accepted_by_rep' } });
    expect(draft.lines[0]!.basis).toMatchObject({ kind: 'part_at_dealer_net', unitPriceMinor: 51900, priceListEffectiveFrom: '2026-01-01' });
  });

  it('a partial approval pays only the approved operation; no fault found charges the part back and takes the labor back', async () => {
    const partial = await claimFor({
      partNumber: 'TV-DPC2', parts: [{ partNumber: 'TV-DPC2', quantity: 1, fromDealerStock: true }], labor: ['DP-RR', 'LT-BA'], freightMinor: 0,
      approved: (r) => ({ ...r, labor: r.labor.filter((l) => l.code !== 'LT-BA') }),
    });
    // 159.00 + 0.50 h × 79.00 = 39.50; LT-BA not approved.
    expect((await draftOf(partial.id)).draft.lines.map((l) => [l.status, l.amountMinor])).toEqual([
      ['credited', 15900], ['credited', 3950], ['not_credited', 0], ['not_credited', 0],
    ]);

    const nff = await claimFor({ dealer: 'lanternhill', partNumber: 'TV-DPC2', parts: [{ partNumber: 'TV-DPC2', quantity: 1, fromDealerStock: false }], labor: ['DP-RR'], freightMinor: 1200, core: 'no_fault_found' });
    const { draft } = await draftOf(nff.id);
    // Lanternhill 88.00/h: 0.50 h = 44.00; freight 12.00 kept; chargeback −159.00 (the display at dealer net) and −44.00 labor.
    expect(draft.lines.map((l) => [l.kind, l.amountMinor])).toEqual([['part', 0], ['labor', 4400], ['freight', 1200], ['chargeback', -15900], ['chargeback', -4400]]);
    expect(draft.totalMinor).toBe(-14700);
  });

  it('is idempotent: two concurrent issues of the same draft create one memo, and a retry returns it', async () => {
    const claim = await claimFor();
    const { hash, view } = await draftOf(claim.id);
    const user = await accountant();
    const seqBefore = await db()('document_sequences').where({ kind: 'credit_memo' }).sum('last_value as s').first();
    const [a, b] = await Promise.all([issueCredit(user, claim.id, hash, view.claim.version), issueCredit(user, claim.id, hash, view.claim.version)]);
    expect(a.memoId).toBe(b.memoId);
    expect([a.replayed, b.replayed].sort()).toEqual([false, true]);
    expect(await memoCount(claim.id)).toBe(1);
    const seqAfter = await db()('document_sequences').where({ kind: 'credit_memo' }).sum('last_value as s').first();
    expect(Number(seqAfter!.s) - Number(seqBefore!.s)).toBe(1);
    expect(await db()('claim_events').where({ claim_id: claim.id, event: 'ISSUE_CREDIT' }).count('id as n').first()).toMatchObject({ n: 1 });

    const retry = await issueCredit(user, claim.id, hash, view.claim.version);
    expect(retry).toMatchObject({ memoId: a.memoId, replayed: true, stage: 'credited' });
    expect(await memoCount(claim.id)).toBe(1);
  });

  it('the database keeps the idempotency key unique', async () => {
    const claim = await claimFor();
    const { hash, view } = await draftOf(claim.id);
    const out = await issueCredit(await accountant(), claim.id, hash, view.claim.version);
    const memo = await db()('credit_memos').where({ id: out.memoId }).first();
    const copy = { ...memo, id: undefined, number: 'CM-2099-999999-4' };
    delete copy.id;
    await expect(db()('credit_memos').insert(copy)).rejects.toThrow(/idempotency_key/);
  });
});

describe('refusals leave everything as it was', () => {
  it('wrong role: a dealer and a rep are refused (403); a foreign brand’s accountant gets 404', async () => {
    const claim = await claimFor();
    const { hash } = await draftOf(claim.id);
    await expect(issueCredit(await signedIn(PEOPLE.dealers.kettenblatt.admin), claim.id, hash)).rejects.toBeInstanceOf(ForbiddenError);
    await expect(issueCredit(await signedIn(PEOPLE.wrenfield.accountant), claim.id, hash)).rejects.toBeInstanceOf(NotFoundError);

    await signedIn(PEOPLE.torvane.rep);
    const res = await stepRoute(new Request('http://x/', { method: 'POST', body: JSON.stringify({ type: 'ISSUE_CREDIT', draftHash: hash }) }), { params: Promise.resolve({ id: claim.id }) });
    expect(res.status).toBe(403);
    await signedIn(PEOPLE.dealers.kettenblatt.dealer);
    expect((await queueRoute(new Request('http://x/api/accounts/queue'), { params: Promise.resolve({}) })).status).toBe(403);
    expect(await memoCount(claim.id)).toBe(0);
    expect(await stageOf(claim.id)).toBe('credit_pending');
  });

  it('a claim whose tracks are not done: 409 with the current state, no memo', async () => {
    const claim = await claimFor({ stopAfter: 'fitted' });
    const user = await accountant();
    const view = await loadCreditView(user, claim.id);
    expect(view.open).toBe(false);
    const error = await issueCredit(user, claim.id, 'a'.repeat(64)).catch((e) => e);
    expect(error).toBeInstanceOf(ConflictError);
    expect(error.status).toBe(409);
    expect(error.message).toMatch(/core|replacement|credit/i);
    expect(error.details).toMatchObject({ stage: 'approved' });
    expect(await memoCount(claim.id)).toBe(0);
  });

  it('a draft that changed since it was shown (an edit) is not issued: 409', async () => {
    const claim = await claimFor();
    const user = await accountant();
    const { hash } = await draftOf(claim.id);
    await editCreditLine(user, claim.id, { lineNo: 4, amount: '12.00', reason: 'Freight invoice shows 12.00, not 18.50' });
    await expect(issueCredit(user, claim.id, hash)).rejects.toMatchObject({ status: 409, message: expect.stringMatching(/changed since you opened it/) });
    expect(await memoCount(claim.id)).toBe(0);
    const again = await draftOf(claim.id);
    expect(again.draft.totalMinor).toBe(17650 - 650);
    expect(again.draft.lines[3]).toMatchObject({ computedMinor: 1850, amountMinor: 1200, adjustments: [{ deltaMinor: -650, reason: 'Freight invoice shows 12.00, not 18.50' }] });
    const out = await issueCredit(user, claim.id, again.hash);
    expect(out.totalMinor).toBe(17000);
  });

  it('edits need a reason and keep signs: no reason, a bad amount, a chargeback made positive are refused (422)', async () => {
    const claim = await claimFor({ core: 'no_fault_found' });
    const user = await accountant();
    const before = await draftOf(claim.id);
    await expect(editCreditLine(user, claim.id, { lineNo: 2, amount: '50.00', reason: ' ' })).rejects.toBeInstanceOf(ValidationError);
    await expect(editCreditLine(user, claim.id, { lineNo: 2, amount: '50,0.0', reason: 'typo' })).rejects.toMatchObject({ status: 422, fieldErrors: { amount: [expect.any(String)] } });
    const chargeback = before.draft.lines.find((l) => l.kind === 'chargeback')!;
    await expect(editCreditLine(user, claim.id, { lineNo: chargeback.lineNo, amount: '10.00', reason: 'goodwill' })).rejects.toMatchObject({
      status: 422, message: expect.stringMatching(/cannot become a credit/),
    });
    await expect(editCreditLine(user, claim.id, { lineNo: 2, amount: '-5.00', reason: 'no' })).rejects.toMatchObject({ status: 422 });
    // Line 1 is the drive unit the brand shipped: not credited, and not made into a credit by an edit.
    await expect(editCreditLine(user, claim.id, { lineNo: 1, amount: '549.00', reason: 'goodwill' })).rejects.toMatchObject({
      status: 422, message: expect.stringMatching(/needs the rep’s approval/),
    });
    expect((await draftOf(claim.id)).hash).toBe(before.hash);
    expect(await db()('credit_draft_edits').where({ claim_id: claim.id }).count('id as n').first()).toMatchObject({ n: 0 });
  });
});

describe('an issued memo is never edited: corrections are new memos', () => {
  it('refuses edits after issue, and the database refuses changing or deleting memo rows', async () => {
    const claim = await claimFor();
    const user = await accountant();
    const { hash } = await draftOf(claim.id);
    const out = await issueCredit(user, claim.id, hash);
    await expect(editCreditLine(user, claim.id, { lineNo: 2, amount: '1.00', reason: 'too late' })).rejects.toMatchObject({
      status: 409, message: expect.stringMatching(/never edited.*reverse it/),
    });
    await expect(db()('credit_memo_lines').where({ memo_id: out.memoId, line_no: 2 }).update({ amount_minor: 100 })).rejects.toThrow(/append-only/);
    await expect(db()('credit_memos').where({ id: out.memoId }).update({ total_minor: 1 })).rejects.toThrow(/append-only/);
    await expect(db()('credit_memos').where({ id: out.memoId }).delete()).rejects.toThrow(/append-only/);
  });

  it('a memo whose total is not the sum of its lines cannot be committed', async () => {
    const claim = await claimFor();
    const { hash } = await draftOf(claim.id);
    const out = await issueCredit(await accountant(), claim.id, hash);
    const memo = await db()('credit_memos').where({ id: out.memoId }).first();
    await expect(
      db().transaction(async (trx) => {
        const [row] = await trx('credit_memos')
          .insert({ ...memo, id: undefined, number: 'CM-2099-000001-1', idempotency_key: `test:${Date.now()}`, total_minor: 100 })
          .returning('id');
        await trx('credit_memo_lines').insert({ memo_id: row.id, line_no: 1, kind: 'freight', status: 'credited', description: 'x', computed_minor: 99, amount_minor: 99, basis: '{}' });
      }),
    ).rejects.toThrow(/not the sum of its lines/);
  });

  it('a reversing memo negates every posted line; reversing twice returns the same reversal; a reversal is not reversed', async () => {
    const claim = await claimFor();
    const user = await accountant();
    const { hash } = await draftOf(claim.id);
    const issued = await issueCredit(user, claim.id, hash);
    const rev = await reverseMemo(user, issued.memoId, 'Wrong dealer account on the claim');
    const reversal = await findMemoForUser(user, rev.memoId);
    expect(reversal).toMatchObject({ kind: 'reversal', totalMinor: -17650, reversesMemoId: issued.memoId, reason: 'Wrong dealer account on the claim' });
    expect(reversal!.lines.map((l) => [l.reversesLineNo, l.amountMinor])).toEqual([[2, -9480], [3, -6320], [4, -1850]]);
    expect(await reverseMemo(user, issued.memoId, 'again')).toMatchObject({ memoId: rev.memoId, replayed: true });
    await expect(reverseMemo(user, rev.memoId, 'undo')).rejects.toMatchObject({ status: 409, message: expect.stringMatching(/itself a reversal/) });
    await expect(reverseMemo(user, issued.memoId, '  ')).rejects.toBeInstanceOf(ValidationError);
    expect(await memoCount(claim.id)).toBe(2);

    // With the memo reversed the draft is open again: a corrected memo is issued, the claim stays credited.
    const view = await loadCreditView(user, claim.id);
    expect(view.open).toBe(true);
    await editCreditLine(user, claim.id, { lineNo: 4, amount: '0.00', reason: 'Freight was paid by the brand’s carrier' });
    const correctedHash = (await draftOf(claim.id)).hash;
    const corrected = await issueCredit(user, claim.id, correctedHash);
    expect(corrected).toMatchObject({ totalMinor: 15800, stage: 'credited', replayed: false });
    expect(await db()('claim_events').where({ claim_id: claim.id }).whereIn('event', ['MEMO_REVERSED', 'CREDIT_MEMO_REISSUED']).count('id as n').first()).toMatchObject({ n: 2 });
    // The draft is closed again; the same issue once more returns the corrected memo.
    expect((await loadCreditView(user, claim.id)).open).toBe(false);
    await expect(issueCredit(user, claim.id, correctedHash)).resolves.toMatchObject({ memoId: corrected.memoId, replayed: true });
    expect(await memoCount(claim.id)).toBe(3);
  });

  it('after a reversal the unchanged draft issues a new memo instead of replaying the reversed one', async () => {
    const claim = await claimFor();
    const user = await accountant();
    const { hash } = await draftOf(claim.id);
    const first = await issueCredit(user, claim.id, hash);
    await reverseMemo(user, first.memoId, 'Issued to the wrong account by mistake');
    expect((await draftOf(claim.id)).hash).toBe(hash); // nothing changed in the draft itself
    const again = await issueCredit(user, claim.id, hash);
    expect(again).toMatchObject({ replayed: false, totalMinor: first.totalMinor, stage: 'credited' });
    expect(again.memoId).not.toBe(first.memoId);
    expect(await memoCount(claim.id)).toBe(3);
    // And that one replays as usual.
    await expect(issueCredit(user, claim.id, hash)).resolves.toMatchObject({ memoId: again.memoId, replayed: true });
  });

  it('a chargeback memo after the credit: the part at dealer net and the labor credited; not twice', async () => {
    const claim = await claimFor();
    const user = await accountant();
    const { hash } = await draftOf(claim.id);
    const issued = await issueCredit(user, claim.id, hash);
    const cb = await issueChargebackMemo(user, claim.id, { reason: 'not_covered_at_inspection', note: 'Impact marks on the housing found on a second look' });
    const memo = await findMemoForUser(user, cb.memoId);
    // −549.00 for the drive unit the dealer received, −158.00 labor credited on the first memo.
    expect(memo).toMatchObject({ kind: 'chargeback', totalMinor: -70700 });
    expect(memo!.lines.map((l) => [l.basis.kind, l.amountMinor])).toEqual([['chargeback_part', -54900], ['chargeback_labor', -15800]]);
    expect(memo!.lines[1]!.basis).toMatchObject({ creditedOnMemos: [issued.memoNumber] });
    await expect(issueChargebackMemo(user, claim.id, { reason: 'no_fault_found', note: 'again' })).rejects.toMatchObject({ status: 409, message: expect.stringMatching(/carries a chargeback already/) });

    const pending = await claimFor();
    await expect(issueChargebackMemo(user, pending.id, { reason: 'no_fault_found', note: 'too early' })).rejects.toMatchObject({ status: 409 });
  });
});
