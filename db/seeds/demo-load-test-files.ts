// Invented load-test files for the demo scenario: deterministic (seeded noise), no real bench or
// bike behind them. The shapes follow how wheel dynos and battery testers log (our column names).

const LBF_FT_NM = 0.3048 * 4.4482216152605;
const HP_W = 550 * LBF_FT_NM;
const MPH_MS = 0.44704;

function noise(seed: number) {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 4294967296 - 0.5;
  };
}

export type DynoProfile = {
  /** Wheel torque, N·m, while the motor assists, at a speed in km/h. */
  torqueAt: (kmh: number) => number;
  /** Sweep from standstill to this speed, km/h, over `rampS` seconds. */
  topKmh: number;
  rampS: number;
  rateHz: number;
  /** Tyre the run was made on, ISO 5775. */
  tyre: { widthMm: number; bsdMm: number };
  seed: number;
  units: 'metric' | 'imperial';
  comment: string;
};

/** A dyno sweep with torque and power, power = T·ω with ω from the tyre's π × (BSD + 2 × width). */
export function dynoFile(p: DynoProfile): string {
  const rnd = noise(p.seed);
  const r = (Math.PI * (p.tyre.bsdMm + 2 * p.tyre.widthMm)) / 1000 / (2 * Math.PI);
  const n = Math.round(p.rampS * p.rateHz);
  const head = p.units === 'metric' ? 'time_s,speed_kmh,wheel_torque_nm,wheel_power_w' : 'time_s,speed_mph,wheel_torque_lbft,wheel_power_hp';
  const lines = [`# ${p.comment}`, head];
  for (let i = 0; i <= n; i++) {
    const t = i / p.rateHz;
    const kmh = Math.max(0, (p.topKmh * t) / p.rampS + 0.03 * rnd());
    const torque = Math.max(0, p.torqueAt(kmh) + 0.5 * rnd());
    const power = torque * (kmh / 3.6 / r);
    lines.push(
      p.units === 'metric'
        ? `${t.toFixed(3)},${kmh.toFixed(3)},${torque.toFixed(3)},${power.toFixed(1)}`
        : `${t.toFixed(3)},${(kmh / 3.6 / MPH_MS).toFixed(3)},${(torque / LBF_FT_NM).toFixed(3)},${(power / HP_W).toFixed(4)}`,
    );
  }
  return lines.join('\n') + '\n';
}

/** Assistance that fades out between `fadeFrom` and `cutKmh`. */
export function assisted(opts: { flatNm: number; untilKmh: number; slopeNmPerKmh: number; fadeFrom: number; cutKmh: number }) {
  return (kmh: number) => {
    const base = kmh < opts.untilKmh ? opts.flatNm : opts.flatNm - opts.slopeNmPerKmh * (kmh - opts.untilKmh);
    const fade = kmh < opts.fadeFrom ? 1 : Math.max(0, (opts.cutKmh - kmh) / (opts.cutKmh - opts.fadeFrom));
    return Math.max(0, base) * fade;
  };
}

/**
 * A capacity discharge: a few minutes at a low current, then the test current to the cut-off
 * voltage. Voltage = open-circuit voltage (falling with charge drawn) − I × R.
 */
export function dischargeFile(p: { cells: number; capacityAh: number; lowA: number; testA: number; ohms: number; stepS: number; seed: number; comment: string }): string {
  const rnd = noise(p.seed);
  const lines = [`# ${p.comment}`, 'time_s,voltage_v,current_a'];
  let q = 0;
  const cutoff = p.cells * 3.0;
  for (let t = 0; t < 6 * 3600; t += p.stepS) {
    const i = t < 180 ? p.lowA : p.testA;
    const soc = Math.max(0, 1 - q / p.capacityAh);
    const cell = 3.05 + 1.05 * soc + 0.12 * Math.exp(-30 * (1 - soc)) - 0.25 * Math.exp(-25 * soc);
    const v = p.cells * cell - i * p.ohms + 0.004 * rnd();
    lines.push(`${t},${v.toFixed(3)},${(i + 0.01 * rnd()).toFixed(3)}`);
    if (v < cutoff) break;
    q += (i * p.stepS) / 3600;
  }
  return lines.join('\n') + '\n';
}

const LEGAL_CUT_KMH: Record<string, number> = { eu_pedelec: 25, us_class1: 32, us_class2: 32, us_class3: 45 };

export type RepairRunsInput = {
  category: string;
  partNumber: string;
  /** ISO 5775 size of the bike's tyre, e.g. `50-622`, and its legal class from the catalog. */
  tyre: string;
  legalClass: string | null;
  ratedCapacityAh: number | null;
  nominalVoltageV: number | null;
  units: 'metric' | 'imperial';
  seed: number;
  /** How the after-test turns out: meets the spec, or a run the rep has to judge by hand. */
  after: 'meets' | 'cut_short';
  /** The failed part's share of a good one's capacity or torque in the before run (default 0.6 and 0.45). */
  beforeFraction?: number;
};

/**
 * A before run that shows the fault and an after run on the same bench and tyre, for a demo
 * claim that went all the way to its credit. Drive parts and anything else on the dyno; a
 * battery by capacity discharge. A cut-short after-test stopped part-way (the tester lost its supply,
 * the roller slipped), so it cannot verify the repair by itself.
 */
export function repairRuns(p: RepairRunsInput): { before: { name: string; text: string }; after: { name: string; text: string } } {
  const slug = p.partNumber.toLowerCase();
  if (p.category === 'battery') {
    const rated = p.ratedCapacityAh ?? 10;
    const cells = Math.round((p.nominalVoltageV ?? 36) / 3.6);
    const run = (capacityAh: number, seed: number, comment: string) => dischargeFile({ cells, capacityAh, lowA: 2, testA: 7, ohms: 0.16, stepS: 10, seed, comment });
    const before = run(rated * (p.beforeFraction ?? 0.6), p.seed, `Tester 1, ${cells}S pack, 2 A for 3 min then 7 A to cut-off`);
    const after = run(rated * 0.99, p.seed + 1, `Tester 1, ${cells}S pack, new pack, 2 A for 3 min then 7 A to cut-off`);
    return { before: { name: `${slug}-discharge-before.csv`, text: before }, after: { name: `${slug}-discharge-after.csv`, text: cutShort(after, p.after, 0.66) } };
  }
  const [width, bsd] = p.tyre.split('-').map(Number) as [number, number];
  const cut = LEGAL_CUT_KMH[p.legalClass ?? ''] ?? 25;
  const healthy = p.category === 'drive_unit' && p.partNumber.includes('HM')
    ? assisted({ flatNm: 44, untilKmh: 18, slopeNmPerKmh: 0.6, fadeFrom: cut - 1.5, cutKmh: cut - 0.3 })
    : assisted({ flatNm: 34, untilKmh: 12, slopeNmPerKmh: 0.9, fadeFrom: cut - 1.5, cutKmh: cut - 0.3 });
  const weak = (kmh: number) => (p.beforeFraction ?? 0.45) * healthy(kmh);
  const profile = { topKmh: cut + 2, rampS: 20, rateHz: 20, tyre: { widthMm: width, bsdMm: bsd }, units: p.units };
  return {
    before: { name: `${slug}-dyno-before.csv`, text: dynoFile({ ...profile, torqueAt: weak, seed: p.seed, comment: `Shop dyno, tyre ${p.tyre}` }) },
    after: { name: `${slug}-dyno-after.csv`, text: cutShort(dynoFile({ ...profile, torqueAt: healthy, seed: p.seed + 1, comment: `Shop dyno, tyre ${p.tyre}, after the repair` }), p.after) },
  };
}

/** The first `share` of the file's lines, when the run was cut short. */
function cutShort(text: string, after: RepairRunsInput['after'], share = 0.6): string {
  if (after !== 'cut_short') return text;
  const lines = text.trimEnd().split('\n');
  return lines.slice(0, Math.round(lines.length * share)).join('\n') + '\n';
}
