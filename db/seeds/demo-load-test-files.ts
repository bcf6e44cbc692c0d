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
