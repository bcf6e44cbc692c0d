import { randomBytes } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { POST as importRoute } from '@/app/api/accounts/statements/route';
import { db } from '@/db/connection';
import { localDateOfEpoch } from '@/lib/calendar/time-zone';
import { issueCredit, loadCreditView, reverseMemo } from '@/lib/services/credits';
import { chooseMemoForLine, confirmMatch, importStatement, rejectMatch, StatementRejected, type ImportRequest } from '@/lib/services/reconciliation';
import { listSources } from '@/lib/db/statements';
import { toDecimalString } from '@/lib/money';
import { claimFor, oddFreight, PEOPLE, signedIn, stageOf } from '../../support/credit-claims';

const accountant = () => signedIn(PEOPLE.torvane.accountant);
const orgId = async (slug: string) => (await db()('organisations').where({ slug }).first('id')).id as string;
// Memos are dated in the brand's calendar (Torvane: Europe/Amsterdam), not the server's.
const today = () => localDateOfEpoch(Date.now(), 'Europe/Amsterdam');

async function issuedMemo(spec: Parameters<typeof claimFor>[0] = {}) {
  const claim = await claimFor(spec);
  const user = await accountant();
  const view = await loadCreditView(user, claim.id);
  const memo = await issueCredit(user, claim.id, view.computed!.hash);
  return { claim, memo };
}

const options = { dateFormat: 'YYYY-MM-DD', decimalSeparator: '.', negate: false, dateWindowDays: 14 } as const;

function request(csv: string, over: Partial<ImportRequest> = {}): ImportRequest {
  return {
    sourceName: `Test source ${randomBytes(3).toString('hex')}`, dealerId: null, fileName: 'statement.csv', csv,
    mapping: { date: 'Date', reference: 'Reference', amount: 'Amount' }, options: { ...options }, ...over,
  };
}

async function counts() {
  const n = async (t: string) => Number((await db()(t).count('* as n').first())!.n);
  return { imports: await n('statement_imports'), lines: await n('statement_lines'), matches: await n('reconciliation_matches'), sources: await n('statement_sources') };
}

async function matchOfLine(importId: string, lineNo: number) {
  return db()('reconciliation_matches as x')
    .join('statement_lines as l', 'l.id', 'x.statement_line_id')
    .where({ 'l.import_id': importId, 'l.line_no': lineNo })
    .orderBy('x.created_at', 'desc')
    .first('x.id', 'x.status', 'x.basis', 'x.memo_id as memoId', 'x.amount_difference_minor as diff', 'l.id as lineId', 'l.outcome');
}

describe('statement import and matching', () => {
  it('matches by reference, the accountant confirms, and the claim moves to reconciled; every step is logged', async () => {
    const kettenblatt = await orgId('kettenblatt');
    const { claim, memo } = await issuedMemo();
    const csv = `Date,Reference,Amount\n${today()},Gutschrift ${memo.memoNumber.toLowerCase()},${toDecimalString(memo.totalMinor, 'EUR')}\n`;
    const out = await importStatement(await accountant(), request(csv, { dealerId: kettenblatt }));
    expect(out).toMatchObject({ lines: 1, proposed: 1 });
    const m = await matchOfLine(out.importId, 2);
    expect(m).toMatchObject({ status: 'proposed', basis: 'reference', memoId: memo.memoId, diff: 0 });

    expect(await confirmMatch(await accountant(), m.id)).toEqual({ reconciledClaim: true });
    const row = await db()('claims').where({ id: claim.id }).first('stage', 'context');
    expect(row.stage).toBe('reconciled');
    expect(row.context.statementLineRef).toBe('statement.csv, row 2');
    const events = await db()('reconciliation_events').where({ match_id: m.id }).orderBy('id').pluck('event');
    expect(events).toEqual(['proposed', 'confirmed']);
    expect(await db()('claim_events').where({ claim_id: claim.id, event: 'RECONCILE' }).first('actor_role')).toMatchObject({ actor_role: 'accountant' });

    // Confirming twice is refused, and nothing changes.
    await expect(confirmMatch(await accountant(), m.id)).rejects.toMatchObject({ status: 409, message: expect.stringMatching(/confirmed already/) });
    await expect(rejectMatch(await accountant(), m.id)).rejects.toMatchObject({ status: 409 });
    expect(await db()('reconciliation_events').where({ match_id: m.id }).count('id as n').first()).toMatchObject({ n: 2 });
  });

  it('two confirmations at the same moment: one goes through, the other is refused', async () => {
    const { claim, memo } = await issuedMemo();
    const csv = `Date,Reference,Amount\n${today()},${memo.memoNumber},${toDecimalString(memo.totalMinor, 'EUR')}\n`;
    const out = await importStatement(await accountant(), request(csv, { dealerId: await orgId('kettenblatt') }));
    const m = await matchOfLine(out.importId, 2);
    const user = await accountant();
    const results = await Promise.allSettled([confirmMatch(user, m.id), confirmMatch(user, m.id)]);
    expect(results.map((r) => r.status).sort()).toEqual(['fulfilled', 'rejected']);
    expect((results.find((r) => r.status === 'rejected') as PromiseRejectedResult).reason).toMatchObject({ status: 409 });
    expect(await stageOf(claim.id)).toBe('reconciled');
    expect(await db()('claim_events').where({ claim_id: claim.id, event: 'RECONCILE' }).count('id as n').first()).toMatchObject({ n: 1 });
  });

  it('matches by exact amount within the date window when the line has no reference; rejecting frees both sides', async () => {
    const freight = oddFreight();
    const { claim, memo } = await issuedMemo({ dealer: 'tidewheel', freightMinor: freight });
    const amount = toDecimalString(memo.totalMinor, 'EUR');
    const csv = `Booking date;Text;Credit;Debit\n${today().split('-').reverse().join('.')};Warranty;${amount.replace('.', ',')};\n`;
    const out = await importStatement(
      await accountant(),
      request(csv, {
        dealerId: await orgId('tidewheel'), mapping: { date: 'Booking date', credit: 'Credit', debit: 'Debit' },
        options: { ...options, dateFormat: 'DD.MM.YYYY', decimalSeparator: ',' },
      }),
    );
    const m = await matchOfLine(out.importId, 2);
    expect(m).toMatchObject({ status: 'proposed', basis: 'amount_date', memoId: memo.memoId });

    await rejectMatch(await accountant(), m.id, 'That payment was for another claim');
    expect(await db()('reconciliation_events').where({ match_id: m.id }).orderBy('id').pluck('event')).toEqual(['proposed', 'rejected']);
    expect(await stageOf(claim.id)).toBe('credited');
    // The line is open again and the accountant may name the memo by hand; it then waits for confirmation.
    const chosen = await chooseMemoForLine(await accountant(), m.lineId, memo.memoNumber);
    expect((await db()('reconciliation_matches').where({ id: chosen.matchId }).first()).basis).toBe('chosen');
    await expect(chooseMemoForLine(await accountant(), m.lineId, memo.memoNumber)).rejects.toMatchObject({ status: 409 });
  });

  it('lists ambiguous and unmatched lines with the reason, and none of them is proposed', async () => {
    const freight = oddFreight();
    const a = await issuedMemo({ freightMinor: freight });
    const b = await issuedMemo({ freightMinor: freight });
    const amount = toDecimalString(a.memo.totalMinor, 'EUR');
    const csv = ['Date,Reference,Amount', `${today()},,${amount}`, `${today()},no such memo,1.23`].join('\n');
    const out = await importStatement(await accountant(), request(csv, { dealerId: await orgId('kettenblatt') }));
    expect(out).toMatchObject({ lines: 2, proposed: 0, ambiguous: 1, unmatched: 1 });
    const lines = await db()('statement_lines').where({ import_id: out.importId }).orderBy('line_no');
    expect(lines[0].outcome).toMatchObject({ type: 'ambiguous', reason: 'several_memos', basis: 'amount_date' });
    expect(lines[0].outcome.candidates.map((c: { memoId: string }) => c.memoId).sort()).toEqual([a.memo.memoId, b.memo.memoId].sort());
    expect(lines[1].outcome).toEqual({ type: 'unmatched', reason: 'no_candidate' });
  });

  it('remembers the column mapping per source', async () => {
    const { memo } = await issuedMemo();
    const name = `Accounting export ${randomBytes(3).toString('hex')}`;
    const csv = `Posting date,Doc no,Net,Account\n${today()},${memo.memoNumber},${toDecimalString(memo.totalMinor, 'EUR')},TV-DE-0791\n`;
    const mapping = { date: 'Posting date', reference: 'Doc no', amount: 'Net', account: 'Account' };
    const out = await importStatement(await accountant(), request(csv, { sourceName: name, mapping }));
    expect(out.proposed).toBe(1);
    const line = await db()('statement_lines').where({ import_id: out.importId }).first('dealer_id');
    expect(line.dealer_id).toBe(await orgId('kettenblatt'));
    const source = (await listSources(await orgId('torvane'))).find((s) => s.name === name);
    expect(source?.mapping).toEqual(mapping);
  });
});

describe('bad statements are refused whole: row errors shown, nothing half-imported', () => {
  it('bad amounts and dates: every row named, nothing stored (route answers 422 with the rows)', async () => {
    const before = await counts();
    const csv = ['Date,Reference,Amount', '2026-11-03,CM-2026-000001-1,12.50', '2026-13-01,x,5.00', '2026-11-04,y,12.345', '2026-11-05,z,twelve'].join('\n');
    const error = await importStatement(await accountant(), request(csv)).catch((e) => e);
    expect(error).toBeInstanceOf(StatementRejected);
    expect(error.rowErrors.map((r: { row: number; field: string }) => [r.row, r.field])).toEqual([[3, 'date'], [4, 'amount'], [5, 'amount']]);
    expect(await counts()).toEqual(before);

    await signedIn(PEOPLE.torvane.accountant);
    const res = await importRoute(new Request('http://x/', { method: 'POST', body: JSON.stringify(request(csv)) }), { params: Promise.resolve({}) });
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(body).toMatchObject({ errorCount: 3, rowErrors: [{ row: 3, column: 'Date' }, { row: 4 }, { row: 5 }] });
    expect(body.error).toMatch(/Nothing was added/);
    expect(await counts()).toEqual(before);
  });

  it('an unknown dealer account, a missing mapped column and an empty file are refused', async () => {
    const before = await counts();
    const withAccount = `Date,Ref,Amount,Account\n${today()},x,1.00,NOPE-1\n`;
    await expect(importStatement(await accountant(), request(withAccount, { mapping: { date: 'Date', reference: 'Ref', amount: 'Amount', account: 'Account' } }))).rejects.toMatchObject({
      status: 422, rowErrors: [{ row: 2, message: expect.stringMatching(/not a dealer account/) }],
    });
    await expect(importStatement(await accountant(), request(`Datum,Betrag\n${today()},1.00\n`))).rejects.toMatchObject({
      status: 422, rowErrors: expect.arrayContaining([expect.objectContaining({ row: 1, message: expect.stringMatching(/no column "Date" in the header \(columns: Datum, Betrag\)/) })]),
    });
    await expect(importStatement(await accountant(), request('Date,Reference,Amount\n'))).rejects.toMatchObject({ status: 422 });
    expect(await counts()).toEqual(before);
  });

  it('the same file twice is a duplicate: 409, nothing added', async () => {
    const csv = `Date,Reference,Amount\n${today()},ref ${randomBytes(4).toString('hex')},3.21\n`;
    await importStatement(await accountant(), request(csv));
    const before = await counts();
    await expect(importStatement(await accountant(), request(csv))).rejects.toMatchObject({ status: 409, message: expect.stringMatching(/imported already/) });
    expect(await counts()).toEqual(before);
  });

  it('a match across two dealers or two currencies is refused, by the service and by the database', async () => {
    const { memo } = await issuedMemo({ dealer: 'kettenblatt' });
    const csv = [`Date,Reference,Amount,Currency`, `${today()},pay ${randomBytes(3).toString('hex')},1.00,EUR`, `${today()},usd ${randomBytes(3).toString('hex')},1.00,USD`].join('\n');
    const out = await importStatement(await accountant(), request(csv, { dealerId: await orgId('lanternhill'), mapping: { date: 'Date', reference: 'Reference', amount: 'Amount', currency: 'Currency' } }));
    const [eur, usd] = await db()('statement_lines').where({ import_id: out.importId }).orderBy('line_no');
    await expect(chooseMemoForLine(await accountant(), eur.id, memo.memoNumber)).rejects.toMatchObject({ status: 422, message: expect.stringMatching(/another dealer/) });
    await expect(chooseMemoForLine(await accountant(), usd.id, memo.memoNumber)).rejects.toMatchObject({ status: 422, message: expect.stringMatching(/never crosses currencies/) });
    await expect(chooseMemoForLine(await accountant(), eur.id, 'CM-2026-000001-2')).rejects.toMatchObject({ status: 422, message: expect.stringMatching(/check digit/) });
    expect(await db()('reconciliation_matches').whereIn('statement_line_id', [eur.id, usd.id]).count('id as n').first()).toMatchObject({ n: 0 });
    await expect(
      db()('reconciliation_matches').insert({ brand_id: await orgId('torvane'), statement_line_id: eur.id, memo_id: memo.memoId, basis: 'chosen', amount_difference_minor: 0, days_apart: 0 }),
    ).rejects.toThrow(/another dealer/);
  });

  it('another brand’s accountant cannot see or decide this brand’s matches (404), a dealer is refused (403)', async () => {
    const { memo } = await issuedMemo();
    const csv = `Date,Reference,Amount\n${today()},${memo.memoNumber},${toDecimalString(memo.totalMinor, 'EUR')}\n`;
    const out = await importStatement(await accountant(), request(csv));
    const m = await matchOfLine(out.importId, 2);
    await expect(confirmMatch(await signedIn(PEOPLE.wrenfield.accountant), m.id)).rejects.toMatchObject({ status: 404 });
    await expect(confirmMatch(await signedIn(PEOPLE.dealers.kettenblatt.admin), m.id)).rejects.toMatchObject({ status: 403 });
    expect((await db()('reconciliation_matches').where({ id: m.id }).first()).status).toBe('proposed');
  });

  it('reversing a memo rejects its open proposals, logged with the reason; the statement line is open again', async () => {
    const kettenblatt = await orgId('kettenblatt');
    const { memo } = await issuedMemo();
    const csv = `Date,Reference,Amount\n${today()},${memo.memoNumber},${toDecimalString(memo.totalMinor, 'EUR')}\n`;
    const out = await importStatement(await accountant(), request(csv, { dealerId: kettenblatt }));
    const proposed = await matchOfLine(out.importId, 2);
    expect(proposed).toMatchObject({ status: 'proposed', memoId: memo.memoId });

    const rev = await reverseMemo(await accountant(), memo.memoId, 'Issued to the wrong account');
    const after = await matchOfLine(out.importId, 2);
    expect(after).toMatchObject({ id: proposed.id, status: 'rejected' });
    const logged = await db()('reconciliation_events').where({ match_id: proposed.id }).orderBy('id');
    expect(logged.map((e) => e.event)).toEqual(['proposed', 'rejected']);
    expect(logged[1].note).toBe(`${memo.memoNumber} was reversed by ${rev.number}`);
    await expect(confirmMatch(await accountant(), proposed.id)).rejects.toMatchObject({ status: 409 });
  });
});
