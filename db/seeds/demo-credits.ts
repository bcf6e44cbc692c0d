import type { ClaimLines } from '@/lib/credits/from-claim';
import type { CoreEnd } from './drive-claim';

// The invented credit scenario: claims against Torvane (EUR) and Wrenfield (USD) at every point
// of the money end of the lifecycle. Amounts follow from the demo catalog and dealer rates; a
// claim is recognised on a second load by its brand, frame serial and symptom.

export type DemoCreditClaim = {
  brand: 'torvane' | 'wrenfield';
  dealer: 'lanternhill' | 'kettenblatt' | 'tidewheel';
  frameSerial: string;
  partNumber: string;
  partSerial: string;
  symptom: string;
  description: string;
  customer: string;
  batteryCycles?: number;
  parts: { partNumber: string; quantity: number; fromDealerStock: boolean }[];
  labor: string[];
  freightMinor: number;
  /** When the dealer submitted it. */
  submittedAt: string;
  afterTest: 'passed' | 'accepted_by_hand';
  /** The rep's words when accepting a repair the after-test could not verify. */
  acceptReason?: string;
  core: CoreEnd;
  approved?: (requested: ClaimLines) => ClaimLines;
  /** Left waiting for the accountant, or credited (and then perhaps reconciled) on these dates. */
  credit?: { issuedAt: string; reconciledAt?: string; statement?: { source: string; file: string; lineDate: string } };
};

/** Everything approved except the operations named. */
const refuseLabor = (...codes: string[]) => (r: ClaimLines): ClaimLines => ({ ...r, labor: r.labor.filter((l) => !codes.includes(l.code)) });

export const demoCreditClaims: DemoCreditClaim[] = [
  // Waiting for the accountant.
  {
    brand: 'torvane', dealer: 'kettenblatt', frameSerial: 'KT25-004522', partNumber: 'TV-DU85', partSerial: 'DU85-2505-12904',
    symptom: 'Assist drops to zero above 18 km/h on the dyno', description: 'Wheel power falls from 310 W to 40 W at 18 km/h; firmware and connectors checked.',
    customer: 'Jana Obermeier', parts: [{ partNumber: 'TV-DU85', quantity: 1, fromDealerStock: false }], labor: ['DU-RR', 'LT-BA'], freightMinor: 1850,
    submittedAt: '2026-11-02T08:40:00Z', afterTest: 'passed', core: 'fault_confirmed',
  },
  {
    brand: 'torvane', dealer: 'tidewheel', frameSerial: 'SW25-010613', partNumber: 'TV-BP625', partSerial: 'BP625-2512-10114',
    symptom: 'Battery delivers 61% of rated capacity after 140 cycles', description: 'Capacity discharge at 0.5 C: 10.6 Ah of 17.4 Ah rated. Fitted a battery from shop stock the same day.',
    customer: 'Owen Fairclough', batteryCycles: 140, parts: [{ partNumber: 'TV-BP625', quantity: 1, fromDealerStock: true }], labor: ['BAT-RR', 'LT-BA'], freightMinor: 0,
    submittedAt: '2026-10-28T13:10:00Z', afterTest: 'accepted_by_hand', core: 'waived',
    acceptReason: 'The tester lost its supply part-way through the after-discharge; the curve up to there matches a new pack and the pack is from sealed shop stock.',
  },
  {
    brand: 'torvane', dealer: 'lanternhill', frameSerial: 'KU25-007812', partNumber: 'TV-DPC2', partSerial: 'DPC2-2508-41170',
    symptom: 'Display freezes and shows E-017 after rain rides', description: 'Display resets when the cable is flexed; replaced display and remote.',
    customer: 'Priya Castellanos', parts: [{ partNumber: 'TV-DPC2', quantity: 1, fromDealerStock: false }], labor: ['DP-RR'], freightMinor: 1200,
    submittedAt: '2026-10-20T17:25:00Z', afterTest: 'accepted_by_hand', core: 'no_fault_found',
    acceptReason: 'A display has no wheel spec; the after-run shows steady assist up to the cut-off and no resets.',
  },
  {
    brand: 'wrenfield', dealer: 'lanternhill', frameSerial: 'WLT25M-09104', partNumber: 'WF-HM750', partSerial: 'HM750-25-1390',
    symptom: 'Hub motor grinds and loses torque under load', description: 'Dyno shows wheel torque 18 N·m against 35 N·m spec; bearings rough by hand.',
    customer: 'Marcus Whitfield', parts: [{ partNumber: 'WF-HM750', quantity: 1, fromDealerStock: false }], labor: ['HM-WHL', 'LT-BA'], freightMinor: 2400,
    submittedAt: '2026-11-05T16:00:00Z', afterTest: 'passed', core: 'fault_confirmed',
  },
  // Credited in earlier months: some reconciled against a dealer statement, some still open.
  {
    brand: 'torvane', dealer: 'kettenblatt', frameSerial: 'HC24-000311', partNumber: 'TV-DU85', partSerial: 'DU85-2410-09921',
    symptom: 'Cargo bike drive unit knocks under load and cuts out', description: 'Knocking from the drive unit at every crank revolution; dyno run stops at 120 W.',
    customer: 'Fahrradkurier Breisgau', parts: [{ partNumber: 'TV-DU85', quantity: 1, fromDealerStock: false }], labor: ['DU-RR'], freightMinor: 2200,
    submittedAt: '2026-06-22T07:30:00Z', afterTest: 'passed', core: 'fault_confirmed',
    credit: { issuedAt: '2026-07-20T09:00:00Z', reconciledAt: '2026-08-06T10:00:00Z', statement: { source: 'Kettenblatt Radwerk — monthly statement', file: 'kettenblatt-2026-07.csv', lineDate: '2026-07-31' } },
  },
  {
    brand: 'torvane', dealer: 'lanternhill', frameSerial: 'SW25-010455', partNumber: 'TV-CT20', partSerial: 'CT20-2504-33190',
    symptom: 'Motor stutters at start, controller hot to the touch', description: 'Controller MOSFET stage failing; fitted a controller from shop stock.',
    customer: 'Devon Alvarez', parts: [{ partNumber: 'TV-CT20', quantity: 1, fromDealerStock: true }], labor: ['CT-RR', 'LT-BA'], freightMinor: 0,
    submittedAt: '2026-07-14T18:00:00Z', afterTest: 'accepted_by_hand', core: 'fault_confirmed',
    acceptReason: 'A controller has no wheel spec of its own; the after-run shows smooth torque from standstill and no stutter.',
    credit: { issuedAt: '2026-08-12T15:00:00Z', reconciledAt: '2026-09-04T16:00:00Z', statement: { source: 'Lanternhill Cycles — statement', file: 'lanternhill-aug-2026.csv', lineDate: '2026-08-31' } },
  },
  {
    brand: 'torvane', dealer: 'tidewheel', frameSerial: 'KT26-000220', partNumber: 'TV-BP625', partSerial: 'BP625-2602-10650',
    symptom: 'Battery will not wake from storage mode', description: 'No output on the terminals after the BMS reset procedure.',
    customer: 'Ellen Thibodeau', batteryCycles: 35, parts: [{ partNumber: 'TV-BP625', quantity: 1, fromDealerStock: false }], labor: ['BAT-RR'], freightMinor: 0,
    submittedAt: '2026-08-10T12:00:00Z', afterTest: 'passed', core: 'written_off',
    credit: { issuedAt: '2026-09-22T08:00:00Z' },
  },
  {
    brand: 'torvane', dealer: 'kettenblatt', frameSerial: 'KT25-004187', partNumber: 'TV-DPC2', partSerial: 'DPC2-2502-33310',
    symptom: 'Display backlight flickers and buttons stick', description: 'Remote buttons stick in the cold; fitted a display from shop stock and checked assist on the dyno.',
    customer: 'Mara Kessler', parts: [{ partNumber: 'TV-DPC2', quantity: 1, fromDealerStock: true }], labor: ['DP-RR', 'LT-BA'], freightMinor: 0,
    submittedAt: '2026-09-21T09:00:00Z', afterTest: 'accepted_by_hand', core: 'fault_confirmed', approved: refuseLabor('LT-BA'),
    acceptReason: 'Display swap: the after-run shows normal assist; no load test labor for a display.',
    credit: { issuedAt: '2026-10-16T11:00:00Z' },
  },
  {
    brand: 'torvane', dealer: 'lanternhill', frameSerial: 'KU25-007740', partNumber: 'TV-DU60', partSerial: 'DU60-2507-02231',
    symptom: 'Drive unit loses assist after 10 minutes of climbing', description: 'Thermal cut-out on the dyno after 9 min at 250 W; replaced drive unit.',
    customer: 'Hollis Grant', parts: [{ partNumber: 'TV-DU60', quantity: 1, fromDealerStock: false }], labor: ['DU-RR', 'LT-BA'], freightMinor: 1500,
    submittedAt: '2026-10-19T15:45:00Z', afterTest: 'passed', core: 'fault_confirmed',
    credit: { issuedAt: '2026-11-16T10:30:00Z' },
  },
];

/** The demo brand's warranty liability entries (Torvane, EUR): a starting balance and monthly accruals. */
export const demoLiabilityEntries: { brand: 'torvane'; date: string; kind: 'opening_balance' | 'accrual' | 'change_in_estimate'; amountMinor: number; note: string }[] = [
  { brand: 'torvane', date: '2026-01-01', kind: 'opening_balance', amountMinor: 4_800_000, note: 'Liability brought forward from the 2025 accounts' },
  ...['01', '02', '03', '04', '05', '06', '07', '08', '09', '10', '11'].map((m) => ({
    brand: 'torvane' as const,
    date: `2026-${m}-${m === '02' ? '28' : ['04', '06', '09', '11'].includes(m) ? '30' : '31'}`,
    kind: 'accrual' as const,
    amountMinor: 320_000,
    note: `Accrual for drive systems sold in 2026-${m}`,
  })),
  { brand: 'torvane', date: '2026-06-30', kind: 'change_in_estimate', amountMinor: -150_000, note: 'Coverage expired on 2024 batteries; estimate lowered' },
];
