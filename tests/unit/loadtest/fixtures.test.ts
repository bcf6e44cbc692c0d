/**
 * The sample files in tests/fixtures/loadtest (invented runs written by generate.ts) read the way a
 * dealer would expect. Expected figures here are the generator's own design values, not outside
 * sources: these tests check file handling end to end.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyseBattery, analyseDynoCsv, parseBatteryCsv, parseDynoCsv, type DynoAnalysisOptions } from '@/lib/loadtest';
import { isoCircumferenceM } from '@/lib/units';

const file = (name: string) => readFileSync(path.join(__dirname, '../../fixtures/loadtest', name));
const C57_622 = isoCircumferenceM({ widthMm: 57, bsdMm: 622 });
const C60_584 = isoCircumferenceM({ widthMm: 60, bsdMm: 584 });

function analysed(name: string, o: DynoAnalysisOptions) {
  const r = analyseDynoCsv(file(name), o);
  if (r.status !== 'ok') throw new Error(`${name}: ${r.status}`);
  return r;
}

describe('sample dyno files', () => {
  it('mid-drive, metric: 38 N·m design plateau, assistance out by 25 km/h, power matches torque × wheel speed', () => {
    const { analysis: a, run } = analysed('dyno-mid-drive-metric.csv', { circumferenceM: C57_622, units: 'metric', legalClass: 'eu-pedelec' });
    expect(run.warnings).toEqual([]);
    expect(a.peakTorque?.nm).toBeGreaterThan(37.5);
    expect(a.peakTorque?.nm).toBeLessThan(38.5);
    expect(a.legal?.possibleTampering).toBe(false);
    expect(a.consistency?.flagged).toBe(false);
  });

  it('the same run exported with semicolons, decimal commas, ms, a BOM and a repeated line gives the same peaks', () => {
    const a = analysed('dyno-mid-drive-metric.csv', { circumferenceM: C57_622, units: 'metric' }).analysis;
    const r = analysed('dyno-semicolon-decimal-comma.csv', { circumferenceM: C57_622, units: 'metric' });
    expect(r.run.source).toMatchObject({ delimiter: ';', decimalMark: ',' });
    expect(r.run.warnings.map((w) => [w.code, w.row])).toEqual([['time-repeated', 303]]);
    expect(Math.abs(r.analysis.peakPower.watts - a.peakPower.watts) / a.peakPower.watts).toBeLessThan(0.01);
    expect(Math.abs(r.analysis.topSpeed.speedMs - a.topSpeed.speedMs)).toBeLessThan(0.01);
  });

  it('hub motor, imperial: class 2 limit 20 mph respected', () => {
    const { analysis: a, run } = analysed('dyno-hub-imperial.csv', { circumferenceM: C60_584, units: 'imperial', legalClass: 'us-class-2' });
    expect(run.fileUnits).toBe('imperial');
    expect(a.legal?.possibleTampering).toBe(false);
    expect(a.bins[0]?.unit).toBe('mph');
  });

  it('power only, limiter defeated: torque derived and possible limiter tampering flagged for the rep', () => {
    const { analysis: a } = analysed('dyno-limiter-defeated.csv', { circumferenceM: C57_622, units: 'metric', legalClass: 'eu-pedelec' });
    expect(a.basis.torque).toBe('derived');
    expect(a.legal?.possibleTampering).toBe(true);
    expect((a.topSpeedUnderPower?.speedMs ?? 0) * 3.6).toBeGreaterThan(31);
  });

  it('foreign headers ask for a mapping; the proposed mapping reads the file', () => {
    const first = parseDynoCsv(file('dyno-needs-mapping.csv'));
    expect(first.status).toBe('needs-mapping');
    if (first.status !== 'needs-mapping') return;
    const second = parseDynoCsv(file('dyno-needs-mapping.csv'), { mapping: first.proposedMapping });
    expect(second.status).toBe('ok');
  });
});

describe('sample battery files', () => {
  it('36 V 14 Ah pack: both sign conventions give the same capacity; 0.15 Ω design resistance recovered within 5 %', () => {
    const pos = parseBatteryCsv(file('battery-discharge-36v.csv'));
    const neg = parseBatteryCsv(file('battery-discharge-negative-current.csv'));
    if (pos.status !== 'ok' || neg.status !== 'ok') throw new Error('battery sample refused');
    expect(pos.run.signFlipped).toBe(false);
    expect(neg.run.signFlipped).toBe(true);
    const a = analyseBattery(pos.run, { ratedCapacityAh: 14, thresholdPct: 80, nominalVoltageV: 36 });
    const b = analyseBattery(neg.run, { ratedCapacityAh: 14, thresholdPct: 80, nominalVoltageV: 36 });
    expect(Math.abs(a.deliveredAh - b.deliveredAh) / a.deliveredAh).toBeLessThan(0.005);
    expect(Math.abs((a.internalResistance?.ohms ?? 0) - 0.15) / 0.15).toBeLessThan(0.05);
    expect(a.ratedEnergyWh).toBe(504);
    expect(a.verdict?.status).toBe('below');
  });
});
