import type { Knex } from 'knex';
import { insertApprovedClaim, type ApprovedClaimSpec } from './approved-claims';
import { openDemoEvidence } from './demo-evidence';
import type { Actor } from '@/machines/claim';

// The warehouses' opening stock and a few approved claims waiting to ship, so the Shipping & cores
// screens have work on them. Invented figures; idempotent on part (stock) and part serial (claims).

const OPENING_STOCK: Record<string, Record<string, { onHand: number; restockInDays?: number }>> = {
  torvane: {
    'TV-DU85': { onHand: 0, restockInDays: 12 },
    'TV-DU60': { onHand: 2 },
    'TV-BP625': { onHand: 3 },
    'TV-BP500': { onHand: 4 },
    'TV-CT20': { onHand: 6 },
    'TV-DPC2': { onHand: 5 },
    'TV-CH4': { onHand: 10 },
  },
  wrenfield: {
    'WF-HM750': { onHand: 4 },
    'WF-HM500': { onHand: 3 },
    'WF-B4814': { onHand: 2 },
    'WF-B3610': { onHand: 2 },
    'WF-RX26': { onHand: 5 },
    'WF-CTL48': { onHand: 6 },
    'WF-LCD3': { onHand: 8 },
    'WF-FRM-LRK': { onHand: 0, restockInDays: 30 },
  },
};

const hoursAgo = (h: number) => new Date(Date.now() - h * 3_600_000);

// `beforeFraction`: how the failed part's before run compares with a good one (the description's figures);
// `noLoadTest`: a swollen pack is never charged or discharged again, so its claim rests on photos.
type DemoApproved = ApprovedClaimSpec & { beforeFraction?: number; noLoadTest?: boolean };

const DEMO_CLAIMS: DemoApproved[] = [
  {
    brand: 'torvane', dealer: 'kettenblatt', filedBy: 'lena.hartmann@kettenblatt.test', approvedBy: 'priya.nair@torvane.test',
    frameSerial: 'KT25-005016', failedPart: 'TV-BP625', partSerial: 'BP625-2506-08417', customerName: 'Jana Roth',
    symptom: 'Range down to a third of what it was', description: 'Capacity discharge at 0.5 C delivered 10.1 Ah of 17.4 Ah rated (58 %). Pack housing intact, no swelling.',
    lines: [{ part: 'TV-BP625' }], labor: ['BAT-RR', 'LT-BA'], approvedAt: hoursAgo(20), beforeFraction: 0.58, batteryCycles: 210,
  },
  {
    brand: 'torvane', dealer: 'lanternhill', filedBy: 'sam.okafor@lanternhill.test', approvedBy: 'owen.brandt@torvane.test',
    frameSerial: 'KU25-008133', failedPart: 'TV-DU60', partSerial: 'DU60-2509-02690', customerName: 'Dale Whitcombe',
    symptom: 'Grinding noise and assist cuts out on hills', description: 'Dyno run: wheel power collapses above 14 mph; bearing play at the crank spindle.',
    lines: [{ part: 'TV-DU60' }], labor: ['DU-RR', 'LT-BA'], approvedAt: hoursAgo(44),
  },
  {
    brand: 'torvane', dealer: 'tidewheel', filedBy: 'theo.marsh@tidewheel.test', approvedBy: 'priya.nair@torvane.test',
    frameSerial: 'SW26-010702', failedPart: 'TV-BP625', partSerial: 'BP625-2601-10230', customerName: 'Ruth Abernethy',
    symptom: 'Battery housing bulged after charging', description: 'Housing swollen along the seam, warm to the touch after a charge. Pack isolated outdoors in a steel bin on sand; not charged since.',
    lines: [{ part: 'TV-BP625' }], labor: ['BAT-RR'], approvedAt: hoursAgo(6), noLoadTest: true, batteryCycles: 95,
  },
  {
    brand: 'torvane', dealer: 'kettenblatt', filedBy: 'jonas.weber@kettenblatt.test', approvedBy: 'owen.brandt@torvane.test',
    frameSerial: 'HC24-000347', failedPart: 'TV-DU85', partSerial: 'DU85-2411-10018', customerName: 'Familie Brandl',
    symptom: 'Motor stops with error E-017 under load', description: 'Error E-017 at every start with the cargo box loaded; dyno shows torque dropping to zero after 3 s.',
    lines: [{ part: 'TV-DU85' }], labor: ['DU-RR'], approvedAt: hoursAgo(70),
  },
  {
    // Fitted from the shop's own shelf the same day: nothing ships; the after-test is the shop's next step.
    brand: 'torvane', dealer: 'lanternhill', filedBy: 'sam.okafor@lanternhill.test', approvedBy: 'priya.nair@torvane.test',
    frameSerial: 'KU25-008410', failedPart: 'TV-CT20', partSerial: 'CT20-2510-35102', customerName: 'Nell Okonkwo',
    symptom: 'Motor cuts out over bumps, comes back after a restart', description: 'Controller drops out when the harness is tapped; connectors clean and tight. Fitted a CT20 from our shelf so the rider could keep commuting.',
    lines: [{ part: 'TV-CT20', fromDealerStock: true }], labor: ['CT-RR', 'LT-BA'], approvedAt: hoursAgo(28), beforeFraction: 0.5,
  },
  {
    brand: 'wrenfield', dealer: 'lanternhill', filedBy: 'rita.vance@lanternhill.test', approvedBy: 'ines.costa@wrenfield.test',
    frameSerial: 'WLT25M-09288', failedPart: 'WF-HM750', partSerial: 'HM750-25-1472', customerName: 'Priscilla Ngata',
    symptom: 'Hub motor clicks and loses power', description: 'Axle play and intermittent hall sensor fault; dyno wheel power 310 W against 550 W minimum.',
    lines: [{ part: 'WF-HM750' }], labor: ['HM-WHL', 'LT-BA'], approvedAt: hoursAgo(30), beforeFraction: 0.4,
  },
  {
    brand: 'wrenfield', dealer: 'lanternhill', filedBy: 'sam.okafor@lanternhill.test', approvedBy: 'ines.costa@wrenfield.test',
    frameSerial: 'WQC25-22071', failedPart: 'WF-B3610', partSerial: 'B3610-25-3301', customerName: 'Mo Delacroix',
    symptom: 'Rack battery shuts off at half charge', description: 'Discharge test: voltage sags below cut-off at 4.9 Ah of 10 Ah rated; one cell group reads 0.4 V low.',
    lines: [{ part: 'WF-B3610' }], labor: ['BAT-SW', 'LT-BA'], approvedAt: hoursAgo(10), beforeFraction: 0.49, batteryCycles: 160,
  },
];

export async function seed(knex: Knex): Promise<number> {
  let added = 0;
  for (const [brandSlug, parts] of Object.entries(OPENING_STOCK)) {
    const brand = await knex('organisations').where({ slug: brandSlug }).first('id');
    const admin = await knex('users').where({ organisation_id: brand.id, role: 'warehouse' }).first('id');
    for (const [partNumber, s] of Object.entries(parts)) {
      const part = await knex('parts').where({ brand_id: brand.id, part_number: partNumber }).first('id');
      if (!part) continue;
      const restock = s.restockInDays ? new Date(Date.now() + s.restockInDays * 86_400_000).toISOString().slice(0, 10) : null;
      const inserted = await knex('stock_levels')
        .insert({ part_id: part.id, brand_id: brand.id, on_hand: s.onHand, restock_expected_on: restock })
        .onConflict('part_id')
        .ignore()
        .returning('part_id');
      if (!inserted.length) continue;
      added += 1;
      if (s.onHand > 0) {
        await knex('stock_movements').insert({
          brand_id: brand.id, part_id: part.id, kind: 'adjustment', delta: s.onHand, on_hand_after: s.onHand,
          reason: 'delivery_received', note: 'Opening stock', user_id: admin?.id ?? null,
        });
      }
      if (restock) {
        await knex('stock_movements').insert({
          brand_id: brand.id, part_id: part.id, kind: 'expected_date', delta: 0, on_hand_after: s.onHand,
          reason: 'restock_expected', note: 'Factory batch confirmed', expected_on: restock, user_id: admin?.id ?? null,
        });
      }
    }
  }
  const evidence = await openDemoEvidence(knex);
  if (!evidence) {
    console.warn('[demo] storage is not reachable; the claims waiting to ship are added on the next start');
    return added;
  }
  for (const [i, spec] of DEMO_CLAIMS.entries()) {
    const brand = await knex('organisations').where({ slug: spec.brand }).first('id');
    const exists = await knex('claims').where({ brand_id: brand.id, part_serial: spec.partSerial }).first('id');
    if (exists) continue;
    const { beforeFraction, noLoadTest, ...claimSpec } = spec;
    await insertApprovedClaim(knex, claimSpec, async (claimId, filedAt) => {
      const filer = (await knex('users').whereRaw('lower(email) = lower(?)', [spec.filedBy]).first('id', 'role')) as Actor;
      await evidence.photos(claimId, filer, { partNumber: spec.failedPart, partSerial: spec.partSerial }, filedAt);
      if (noLoadTest) return;
      const runs = await evidence.repairFiles(claimId, { seed: 70 + i, after: 'meets', ...(beforeFraction ? { beforeFraction } : {}) });
      await evidence.loadTest(claimId, filer, 'before', runs.before, filedAt);
    });
    added += 1;
  }
  return added;
}
