import { driveStep } from './drive-claim';
import { openDemoEvidence, type DemoFile } from './demo-evidence';
import { DEMO_CARRIER, demoTrackingNumber, insertDemoParcel } from './demo-shipments';
import { nextBrandSequence, nextClaimSequence } from '../sequences';
import type { Knex } from 'knex';
import { formatClaimNumber, formatRmaNumber } from '@/lib/credits';
import { BAR_PA } from '@/lib/units';
import { initialClaimSnapshot, type Actor } from '@/machines/claim';
import { assisted, dischargeFile, dynoFile } from './demo-load-test-files';

// Claims whose load tests show the analysis at work: a weak drive unit waiting for a rep, a run
// past the legal speed limit, a tired battery, one waiting for its after-test and one verified by
// it. Invented scenario. The files go to storage like a dealer's upload and are analysed by the
// same pure code as the server; the lifecycle steps go through the claim machine (stepClaim), as
// applyStep does. Idempotent on the part serial.

type Spec = {
  brand: 'torvane' | 'wrenfield';
  dealer: 'kettenblatt' | 'lanternhill' | 'tidewheel';
  filedBy: string;
  rep: string;
  warehouse: string;
  frameSerial: string;
  partNumber: string;
  partSerial: string;
  labor: string[];
  symptom: string;
  description: string;
  customerName: string;
  batteryCycles?: number;
  daysAgo: number;
  before: DemoFile;
  after?: DemoFile;
  until: 'submitted' | 'shipped' | 'verified';
};

const bar = (x: number) => x * BAR_PA;
const psi = (x: number) => x * 6894.757293168;

const midDrive = (flatNm: number) => assisted({ flatNm, untilKmh: 12, slopeNmPerKmh: 1.1, fadeFrom: 23.5, cutKmh: 25 });

const SPECS: Spec[] = [
  {
    brand: 'torvane', dealer: 'kettenblatt', filedBy: 'lena.hartmann@kettenblatt.test', rep: 'priya.nair@torvane.test', warehouse: 'felix.moreau@torvane.test',
    frameSerial: 'KT24-001903', partNumber: 'TV-DU85', partSerial: 'DU85-2402-04410', labor: ['DU-RR', 'LT-BA'], daysAgo: 3,
    symptom: 'Weak assistance on climbs, gets worse when warm', description: 'Dyno run at full charge: wheel torque about 60 % of a good DU85; no error codes, firmware current.',
    customerName: 'Katrin Vollmer', until: 'submitted',
    before: {
      name: 'bench1-du85-before.csv',
      text: dynoFile({ torqueAt: midDrive(22), topKmh: 26, rampS: 20, rateHz: 50, tyre: { widthMm: 50, bsdMm: 622 }, seed: 11, units: 'metric', comment: 'Bench 1, tyre 50-622 at 3.5 bar' }),
      conditions: { batterySocStartPct: 100, tyreSize: '50-622', tyrePressurePa: bar(3.5), tyreMaxPressurePa: bar(3.5), dynoId: 'Bench 1', rollerId: 'R-200', loadKg: 80, ambientTempC: 19 },
    },
  },
  {
    brand: 'wrenfield', dealer: 'kettenblatt', filedBy: 'jonas.weber@kettenblatt.test', rep: 'ines.costa@wrenfield.test', warehouse: 'tom.reyes@wrenfield.test',
    frameSerial: 'WQE25-11504', partNumber: 'WF-HM500', partSerial: 'HM500-25-4822', labor: ['HM-WHL', 'LT-BA'], daysAgo: 2,
    symptom: 'Motor cuts out intermittently at speed', description: 'Hub motor drops out above 28 km/h; hall sensor plug re-seated, fault returns.',
    customerName: 'Tobias Reiner', until: 'submitted',
    before: {
      name: 'hm500-before.csv',
      // Assistance carries on to 32 km/h on a bike sold as an EU pedelec (25 km/h).
      text: dynoFile({ torqueAt: assisted({ flatNm: 30, untilKmh: 14, slopeNmPerKmh: 0.5, fadeFrom: 31, cutKmh: 32.5 }), topKmh: 34, rampS: 24, rateHz: 50, tyre: { widthMm: 50, bsdMm: 584 }, seed: 12, units: 'metric', comment: 'Bench 1, tyre 50-584' }),
      conditions: { batterySocStartPct: 98, tyreSize: '50-584', tyrePressurePa: bar(3.2), tyreMaxPressurePa: bar(3.5), dynoId: 'Bench 1', rollerId: 'R-200', loadKg: 85, ambientTempC: 20 },
    },
  },
  {
    brand: 'wrenfield', dealer: 'tidewheel', filedBy: 'theo.marsh@tidewheel.test', rep: 'ines.costa@wrenfield.test', warehouse: 'tom.reyes@wrenfield.test',
    frameSerial: 'WLM24-03318', partNumber: 'WF-B4814', partSerial: 'B4814-24-2291', labor: ['BAT-SW', 'LT-BA'], batteryCycles: 290, daysAgo: 4,
    symptom: 'Range down to about 25 km on a full charge', description: 'Capacity discharge at 7 A after a full charge; pack housing intact, no swelling, no heat.',
    customerName: 'Anouk Leblanc', until: 'submitted',
    before: {
      name: 'b4814-discharge.csv',
      text: dischargeFile({ cells: 13, capacityAh: 8.7, lowA: 2, testA: 7, ohms: 0.18, stepS: 10, seed: 13, comment: 'Tester 2, 13S pack, 2 A for 3 min then 7 A to 39 V' }),
      conditions: { batterySocStartPct: 100, ambientTempC: 21, notes: 'Charged overnight, rested 1 h before the test.' },
    },
  },
  {
    brand: 'wrenfield', dealer: 'lanternhill', filedBy: 'sam.okafor@lanternhill.test', rep: 'ines.costa@wrenfield.test', warehouse: 'tom.reyes@wrenfield.test',
    frameSerial: 'WLT25M-08812', partNumber: 'WF-HM750', partSerial: 'HM750-25-1103', labor: ['HM-WHL', 'LT-BA'], daysAgo: 9,
    symptom: 'Loud knocking from the rear hub under load', description: 'Bearing noise and torque ripple; dyno peak wheel power well under spec.',
    customerName: 'Marcus Ellery', until: 'shipped',
    before: {
      name: 'hm750-before.csv',
      text: dynoFile({ torqueAt: assisted({ flatNm: 26, untilKmh: 16, slopeNmPerKmh: 0.5, fadeFrom: 30, cutKmh: 32 }), topKmh: 34, rampS: 20, rateHz: 20, tyre: { widthMm: 60, bsdMm: 584 }, seed: 14, units: 'imperial', comment: 'Shop dyno, tyre 60-584 at 30 psi' }),
      conditions: { batterySocStartPct: 100, tyreSize: '60-584', tyrePressurePa: psi(30), tyreMaxPressurePa: psi(30), dynoId: 'Shop dyno', rollerId: 'Main roller', loadKg: 79.4, ambientTempC: 21 },
    },
  },
  {
    brand: 'wrenfield', dealer: 'tidewheel', filedBy: 'maya.lindqvist@tidewheel.test', rep: 'ines.costa@wrenfield.test', warehouse: 'tom.reyes@wrenfield.test',
    frameSerial: 'WLM25-04102', partNumber: 'WF-HM750', partSerial: 'HM750-25-2215', labor: ['HM-WHL', 'LT-BA'], daysAgo: 14,
    symptom: 'No assistance above walking pace', description: 'Dyno run: torque collapses above 8 km/h; controller swapped for a known good one, fault stays with the motor.',
    customerName: 'Gwen Ashdown', until: 'verified',
    before: {
      name: 'hm750-before.csv',
      text: dynoFile({ torqueAt: (kmh) => (kmh < 8 ? 30 : Math.max(0, 30 - 4 * (kmh - 8))), topKmh: 22, rampS: 18, rateHz: 50, tyre: { widthMm: 55, bsdMm: 622 }, seed: 15, units: 'metric', comment: 'Bench A, tyre 55-622' }),
      conditions: { batterySocStartPct: 100, tyreSize: '55-622', tyrePressurePa: bar(4), tyreMaxPressurePa: bar(4), dynoId: 'Bench A', rollerId: 'RA-1', loadKg: 75, ambientTempC: 18 },
    },
    after: {
      name: 'hm750-after.csv',
      text: dynoFile({ torqueAt: assisted({ flatNm: 44, untilKmh: 18, slopeNmPerKmh: 0.6, fadeFrom: 43, cutKmh: 45 }), topKmh: 44, rampS: 24, rateHz: 200, tyre: { widthMm: 55, bsdMm: 622 }, seed: 16, units: 'metric', comment: 'Bench A, tyre 55-622, new motor' }),
      conditions: { batterySocStartPct: 100, tyreSize: '55-622', tyrePressurePa: bar(4), tyreMaxPressurePa: bar(4), dynoId: 'Bench A', rollerId: 'RA-1', loadKg: 75, ambientTempC: 20 },
    },
  },
];

export async function seed(knex: Knex): Promise<number> {
  const evidence = await openDemoEvidence(knex);
  if (!evidence) {
    console.warn('[demo] storage is not reachable; the load-test demo claims are added on the next start');
    return 0;
  }
  const orgId = async (slug: string) => (await knex('organisations').where({ slug }).first('id')).id as string;
  const person = async (email: string) => (await knex('users').where({ email }).first('id', 'role')) as Actor;
  let added = 0;

  for (const s of SPECS) {
    const brandId = await orgId(s.brand);
    if (await knex('claims').where({ brand_id: brandId, part_serial: s.partSerial }).first('id')) continue;
    const dealerId = await orgId(s.dealer);
    const filer = await person(s.filedBy);
    const t0 = Date.now() - s.daysAgo * 86_400_000;
    const at = (hours: number) => new Date(t0 + hours * 3_600_000).toISOString();

    const account = await knex('dealer_accounts').where({ dealer_id: dealerId, brand_id: brandId }).first('id');
    const part = await knex('parts').where({ brand_id: brandId, part_number: s.partNumber }).first('id', 'name', 'category', 'min_wheel_power_w', 'min_wheel_torque_nm', 'rated_capacity_ah', 'nominal_voltage_v');
    const unit = await knex('registered_units as u').join('bike_models as m', 'm.id', 'u.model_id').where({ 'u.brand_id': brandId, 'u.frame_serial': s.frameSerial })
      .first('u.id', 'u.model_id', 'u.retail_sale_date', 'm.legal_class');
    const labor = [];
    for (const [i, code] of s.labor.entries()) {
      const op = await knex('labor_operations').where({ brand_id: brandId, code }).first('id', 'description', 'standard_hours');
      labor.push({ lineId: `l${i + 1}`, operationId: op.id, code, description: op.description, hours: String(op.standard_hours) });
    }
    const year = new Date(t0).getUTCFullYear();
    const number = formatClaimNumber({ year, sequence: await nextClaimSequence(knex, year) });
    const initial = initialClaimSnapshot({ openedBy: { id: filer.id, role: filer.role as 'dealer' }, openedAt: at(0) });
    const [claim] = await knex('claims')
      .insert({
        number, dealer_id: dealerId, brand_id: brandId, dealer_account_id: account.id, model_id: unit.model_id, registered_unit_id: unit.id,
        frame_serial: s.frameSerial, part_id: part.id, part_category: part.category, part_serial: s.partSerial, sale_date: unit.retail_sale_date,
        failure_date: new Date(t0 - 86_400_000).toISOString().slice(0, 10), battery_cycles: s.batteryCycles ?? null, symptom: s.symptom,
        description: s.description, customer_name: s.customerName,
        requested_lines: JSON.stringify({ parts: [{ lineId: 'p1', partId: part.id, partNumber: s.partNumber, name: part.name, quantity: 1, fromDealerStock: false }], labor, freightMinor: 0 }),
        state_value: JSON.stringify(initial.value), context: JSON.stringify(initial.context), created_by: filer.id, created_at: at(0), updated_at: at(0),
      })
      .returning('id');
    const claimId = claim.id as string;
    await knex('claim_events').insert({ claim_id: claimId, actor_id: filer.id, actor_role: filer.role, event: 'OPENED', from_state: null, to_state: JSON.stringify(initial.value), payload: JSON.stringify({ number }), created_at: at(0) });

    const dealer: Actor = { id: filer.id, role: filer.role };
    await evidence.photos(claimId, dealer, { partNumber: s.partNumber, partSerial: s.partSerial }, at(0.2));
    await evidence.loadTest(claimId, dealer, 'before', s.before, at(0.4));

    await driveStep(knex, claimId, { type: 'SUBMIT', actor: dealer, at: at(0.5), evidence: { photos: 2, serialLabelPhotos: 1, beforeTests: 1, proofOfPurchase: false, registered: true } }, { submitted_at: at(0.5) });
    added += 1;
    if (s.until === 'submitted') continue;

    const rep = await person(s.rep);
    const warehouse = await person(s.warehouse);
    await driveStep(knex, claimId, { type: 'TAKE', actor: rep, at: at(20) });
    const rma = formatRmaNumber({ year, sequence: await nextBrandSequence(knex, brandId, 'rma', year) });
    const lines = [{ lineId: 'p1', approved: true }, ...labor.map((l) => ({ lineId: l.lineId, approved: true }))];
    await driveStep(knex, claimId, { type: 'APPROVE', actor: rep, at: at(22), extent: 'full', lines, rmaNumber: rma }, { rma_number: rma, approved_lines: knex.raw('requested_lines') });
    await driveStep(knex, claimId, { type: 'SHIP', actor: warehouse, at: at(40), carrier: DEMO_CARRIER, trackingNumber: demoTrackingNumber(claimId, 'outbound'), service: 'road' });
    await insertDemoParcel(knex, claimId, { direction: 'outbound', handedOverAt: at(40), deliveredAt: at(84), createdBy: warehouse.id });
    if (s.until === 'shipped' || !s.after) continue;

    const after = await evidence.loadTest(claimId, dealer, 'after', s.after, at(90));
    await driveStep(knex, claimId, { type: 'MARK_FITTED', actor: dealer, at: at(90.2), afterTestId: after.runId, afterTestPasses: after.meets });
  }
  return added;
}
