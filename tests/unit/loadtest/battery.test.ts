import { describe, expect, it } from 'vitest';
import { unit } from 'mathjs';
import { analyseBattery, integrateDischarge, parseBatteryCsv, ratedEnergyWh, type BatteryRun } from '@/lib/loadtest';

function run(text: string): BatteryRun {
  const r = parseBatteryCsv(text);
  if (r.status !== 'ok') throw new Error(JSON.stringify(r).slice(0, 500));
  return r.run;
}

/** Constant current I for T seconds, voltage falling linearly from v0 to v1, one sample every dt. */
function discharge(I: number, T: number, v0: number, v1: number, dt: number, sign = 1): string {
  const lines = ['time_s,voltage_v,current_a'];
  for (let t = 0; t <= T + 1e-9; t += dt) lines.push(`${t},${v0 + ((v1 - v0) * t) / T},${sign * I}`);
  return lines.join('\n');
}

describe('delivered charge and energy by trapezoidal integration', () => {
  it('constant 7 A for 2 h with voltage falling linearly 41 → 32 V: Ah = I·T = 14, Wh = I·T·(v0+v1)/2 = 511 (closed form)', () => {
    const a = analyseBattery(run(discharge(7, 7200, 41, 32, 10)), { ratedCapacityAh: 14 });
    expect(a.deliveredAh).toBeCloseTo(14, 9);
    expect(a.deliveredWh).toBeCloseTo(511, 9);
    expect(a.meanVoltageV).toBeCloseTo(36.5, 9);
    expect(a.stateOfHealthPct).toBeCloseTo(100, 7);
    expect(a.durationS).toBe(7200);
  });

  it('Ah and Wh convert to coulombs and joules as mathjs does (1 Ah = 3600 C, 1 Wh = 3600 J)', () => {
    const { ah, wh } = integrateDischarge(Float64Array.from([0, 3600]), Float64Array.from([10, 10]), Float64Array.from([1, 1]));
    expect(ah * 3600).toBeCloseTo(unit(ah, 'Ah').toNumber('C'), 9);
    expect(wh * 3600).toBeCloseTo(unit(wh, 'Wh').toNumber('J'), 9);
  });

  it('a tester that logs discharge as negative current: detected, turned round and said so', () => {
    const r = run(discharge(7, 7200, 41, 32, 10, -1));
    expect(r.signFlipped).toBe(true);
    expect(r.warnings[0]?.code).toBe('current-sign-flipped');
    expect(analyseBattery(r, { ratedCapacityAh: 14 }).deliveredAh).toBeCloseTo(14, 9);
  });

  it('charging samples count against the delivered charge, with their lines named', () => {
    const r = run('time_s,voltage_v,current_a\n0,40,5\n3600,38,5\n3601,38.1,-2\n7200,36,5\n');
    const w = r.warnings.find((x) => x.code === 'charge-current');
    expect(w).toMatchObject({ rows: [4], rowCount: 1 });
    // Trapezoids: 5·3600 + 1.5·1 + 1.5·3599 = 18000 + 5400 = 23400 A·s = 6.5 Ah.
    expect(analyseBattery(r, { ratedCapacityAh: 10 }).deliveredAh).toBeCloseTo(23400 / 3600, 9);
  });
});

describe('state of health and verdict against the brand threshold', () => {
  const r = run(discharge(5, 3600 * 2, 41, 33, 60)); // 10 Ah delivered
  it('state of health = measured / rated capacity; capacity fade = 100 − SoH (ISO 12405-4 terms)', () => {
    const a = analyseBattery(r, { ratedCapacityAh: 12.5 });
    expect(a.stateOfHealthPct).toBeCloseTo(80, 9);
    expect(a.capacityFadePct).toBeCloseTo(20, 9);
  });

  it('at the threshold = meets; below it = below by x points', () => {
    expect(analyseBattery(r, { ratedCapacityAh: 12.5, thresholdPct: 80 }).verdict?.status).toBe('meets');
    const below = analyseBattery(r, { ratedCapacityAh: 12.5, thresholdPct: 85 }).verdict;
    expect(below).toMatchObject({ status: 'below' });
    expect(below?.status === 'below' && below.belowByPoints).toBeCloseTo(5, 9);
    expect(below?.message).toMatch(/80\.0 % of rated, below the 85 % threshold by 5\.0 points/);
  });

  it('refuses a rated capacity or threshold that makes no sense', () => {
    expect(() => analyseBattery(r, { ratedCapacityAh: 0 })).toThrow(RangeError);
    expect(() => analyseBattery(r, { ratedCapacityAh: 10, thresholdPct: 180 })).toThrow(/thresholdPct/);
  });
});

describe('DC internal resistance from the largest current step (R = −ΔV/ΔI)', () => {
  it('synthetic step 2 A → 10 A on a 40 V source with 0.12 Ω gives 0.12 Ω', () => {
    const lines = ['time_s,voltage_v,current_a'];
    for (let t = 0; t <= 60; t++) {
      const I = t < 10 ? 2 : 10;
      lines.push(`${t},${(40 - 0.0005 * t - I * 0.12).toFixed(6)},${I}`);
    }
    const a = analyseBattery(run(lines.join('\n')), { ratedCapacityAh: 10 });
    expect(a.internalResistance?.ohms).toBeCloseTo(0.12 + 0.0005 / 8, 6); // the 0.5 mV/s drift over the 1 s step is in ΔV too
    expect(a.internalResistance).toMatchObject({ row: 12, fromA: 2, toA: 10, intervalS: 1 });
  });

  it('no step big enough: no value, and a note saying how to get one', () => {
    const a = analyseBattery(run(discharge(7, 600, 41, 40, 1)), { ratedCapacityAh: 10 });
    expect(a.internalResistance).toBeNull();
    expect(a.internalResistanceNote).toMatch(/No current step of at least 1\.4 A/);
  });
});

describe('rated energy Wh = V × Ah (49 CFR 171.8)', () => {
  it('36 V × 14 Ah = 504 Wh; 48 V × 17.5 Ah = 840 Wh (both above the 100 Wh line of 49 CFR 173.185(c))', () => {
    expect(ratedEnergyWh(36, 14)).toBe(504);
    expect(ratedEnergyWh(48, 17.5)).toBe(840);
  });
  it('a single 3.6 V, 3.35 Ah cell: 12.06 Wh (below the 20 Wh per-cell line)', () => {
    expect(ratedEnergyWh(3.6, 3.35)).toBeCloseTo(12.06, 12);
  });
  it('is given with the analysis when the nominal voltage is known', () => {
    expect(analyseBattery(run(discharge(7, 600, 41, 40, 1)), { ratedCapacityAh: 14, nominalVoltageV: 36 }).ratedEnergyWh).toBe(504);
  });
  it('refuses non-positive inputs', () => {
    expect(() => ratedEnergyWh(0, 14)).toThrow(/Nominal voltage/);
    expect(() => ratedEnergyWh(36, -1)).toThrow(/Rated capacity/);
  });
});

describe('battery CSV refusals', () => {
  const err = (text: string) => {
    const r = parseBatteryCsv(text);
    if (r.status !== 'error') throw new Error(r.status);
    return r.errors;
  };
  it('no current column, all-zero current, negative voltage', () => {
    expect(err('time_s,voltage_v\n0,40\n1,39\n')[0]?.message).toMatch(/no current column/);
    expect(err('time_s,voltage_v,current_a\n0,40,0\n1,39,0\n')[0]).toMatchObject({ code: 'all-zero', columnNumber: 3 });
    expect(err('time_s,voltage_v,current_a\n0,40,1\n1,-39,1\n')[0]).toMatchObject({ code: 'negative-value', row: 3, columnNumber: 2 });
  });
});
