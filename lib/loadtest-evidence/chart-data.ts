import { legalLimitIn, type DynoAnalysis, type LegalClassId } from '@/lib/loadtest';
import { displayUnit, fromSi, type UnitSystem } from '@/lib/units';

/** One point of the binned curve in display units; a bin without torque (derived torque below walking pace) has none. */
export interface CurvePoint {
  readonly speed: number;
  readonly power: number | null;
  readonly torque: number | null;
  readonly samples: number;
}

export interface ChartRun {
  readonly points: readonly CurvePoint[];
  readonly peakPower: { readonly speed: number; readonly power: number };
  readonly peakTorque: { readonly speed: number; readonly torque: number } | null;
}

export interface ChartAxes {
  readonly speedUnit: string;
  readonly powerUnit: string;
  readonly torqueUnit: string;
  readonly powerDecimals: number;
}

export function chartAxes(units: UnitSystem): ChartAxes {
  return units === 'metric'
    ? { speedUnit: 'km/h', powerUnit: 'W', torqueUnit: 'N·m', powerDecimals: 0 }
    : { speedUnit: 'mph', powerUnit: 'hp', torqueUnit: 'lbf·ft', powerDecimals: 2 };
}

const round = (x: number, d: number) => Math.round(x * 10 ** d) / 10 ** d;

/**
 * The chart's data for one run: the speed-binned curve (bin mean speed, mean power, mean torque)
 * and the two peaks, in the reader's units. A run of any length stays a few dozen points, so the
 * chart never draws every sample.
 */
export function chartRun(analysis: DynoAnalysis, units: UnitSystem): ChartRun {
  const speedUnit = displayUnit('speed', units);
  const powerUnit = displayUnit('power', units);
  const torqueUnit = displayUnit('torque', units);
  const v = (ms: number) => round(fromSi('speed', ms, speedUnit), 2);
  const p = (w: number) => round(fromSi('power', w, powerUnit), units === 'metric' ? 1 : 4);
  const t = (nm: number) => round(fromSi('torque', nm, torqueUnit), 2);
  return {
    points: analysis.bins.map((b) => ({
      speed: v(b.meanSpeedMs),
      power: b.power ? p(b.power.mean) : null,
      torque: b.torque ? t(b.torque.mean) : null,
      samples: b.count,
    })),
    peakPower: { speed: v(analysis.peakPower.speedMs), power: p(analysis.peakPower.watts) },
    peakTorque: analysis.peakTorque ? { speed: v(analysis.peakTorque.speedMs), torque: t(analysis.peakTorque.nm) } : null,
  };
}

/** The legal class's speed limit in the reader's speed unit, for a marker line on the chart. */
export function legalLimitForChart(classId: LegalClassId | null, units: UnitSystem): number | null {
  return classId ? round(legalLimitIn(classId, units === 'metric' ? 'kmh' : 'mph'), 2) : null;
}
