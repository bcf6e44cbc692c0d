import type { Knex } from 'knex';
import { demoCreditClaims, demoLiabilityEntries } from './demo-credits';
import { openDemoEvidence } from './demo-evidence';
import { driveToCreditPending, insertDraftClaim, issueCreditDirect, reconcileDirect } from './drive-claim';

/**
 * Claims at the money end of the lifecycle (waiting for a credit, credited, reconciled), their
 * memos and statement matches, and the liability entries of the roll-forward. Idempotent: a
 * claim is recognised by brand, frame serial and symptom; an entry by brand, date, kind and note.
 */
export async function seed(knex: Knex): Promise<number> {
  const evidence = await openDemoEvidence(knex);
  if (!evidence) {
    console.warn('[demo] storage is not reachable; the credit demo claims are added on the next start');
    return 0;
  }
  let added = 0;
  const orgId = async (slug: string) => (await knex('organisations').where({ slug }).first('id')).id as string;
  const person = async (org: string, role: string) => {
    const u = await knex('users').where({ organisation_id: org, role }).orderBy('email').first('id');
    if (!u) throw new Error(`demo: no ${role} in ${org}`);
    return u.id as string;
  };

  for (const c of demoCreditClaims) {
    const brandId = await orgId(c.brand);
    const dealerId = await orgId(c.dealer);
    const seen = await knex('claims').where({ brand_id: brandId, frame_serial: c.frameSerial, symptom: c.symptom }).first('id');
    if (seen) continue;
    const dealer = await person(dealerId, 'dealer');
    const accountant = await person(brandId, 'accountant');
    const claim = await insertDraftClaim(knex, {
      dealerId, brandId, frameSerial: c.frameSerial, partNumber: c.partNumber, partSerial: c.partSerial,
      failureDate: c.submittedAt.slice(0, 10), symptom: c.symptom, description: c.description, customerName: c.customer,
      ...(c.batteryCycles === undefined ? {} : { batteryCycles: c.batteryCycles }),
      parts: c.parts, labor: c.labor, freightMinor: c.freightMinor, openedBy: dealer,
      openedAt: new Date(Date.parse(c.submittedAt) - 2 * 3_600_000).toISOString(),
    });
    const filer = { id: dealer, role: 'dealer' as const };
    const runs = await evidence.repairFiles(claim.id, { seed: added + 40, after: c.afterTest === 'accepted_by_hand' ? 'cut_short' : 'meets' });
    const beforeAt = new Date(Date.parse(c.submittedAt) - 3_600_000).toISOString();
    await evidence.photos(claim.id, filer, { partNumber: c.partNumber, partSerial: c.partSerial }, beforeAt);
    await evidence.loadTest(claim.id, filer, 'before', runs.before, beforeAt);
    await driveToCreditPending(knex, claim.id, {
      dealer, rep: await person(brandId, 'brand_rep'), warehouse: await person(brandId, 'warehouse'),
      submittedAt: c.submittedAt, afterTest: c.afterTest, core: c.core, ...(c.approved ? { approved: c.approved } : {}),
      ...(c.acceptReason ? { acceptReason: c.acceptReason } : {}),
      evidence: {
        afterTest: (at) => evidence.loadTest(claim.id, filer, 'after', runs.after, at),
        disposalProof: (at) => evidence.photo(claim.id, filer, 'core_disposal_proof', 'recycling-receipt.jpg', `Recycling receipt ${c.partSerial}`, at),
      },
    });
    added++;
    if (!c.credit) continue;
    const memo = await issueCreditDirect(knex, claim.id, accountant, c.credit.issuedAt);
    added++;
    if (c.credit.reconciledAt && c.credit.statement) {
      await reconcileDirect(knex, memo, {
        sourceName: c.credit.statement.source, fileName: c.credit.statement.file, accountantId: accountant,
        lineDate: c.credit.statement.lineDate, at: c.credit.reconciledAt,
      });
      added++;
    }
  }

  for (const e of demoLiabilityEntries) {
    const brandId = await orgId(e.brand);
    const exists = await knex('liability_entries').where({ brand_id: brandId, entry_date: e.date, kind: e.kind, note: e.note }).first('id');
    if (exists) continue;
    const brand = await knex('organisations').where({ id: brandId }).first('currency');
    await knex('liability_entries').insert({
      brand_id: brandId, entry_date: e.date, kind: e.kind, amount_minor: e.amountMinor, currency: brand.currency, note: e.note,
      entered_by: await person(brandId, 'accountant'),
    });
    added++;
  }
  return added;
}
