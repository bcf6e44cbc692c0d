import type { BatteryRun } from './battery-import';
import { ratedEnergyWh } from './rated-energy';

export interface BatteryAnalysisOptions {
  /** Rated capacity on the label, Ah. */
  readonly ratedCapacityAh: number;
  /** The brand's minimum state of health, % of rated capacity; absent → no verdict. */
  readonly thresholdPct?: number | null;
  /** Nominal voltage on the label, V; gives the rated energy. */
  readonly nominalVoltageV?: number | null;
}

export interface InternalResistance {
  readonly ohms: number;
  /** Line of the sample after the step. */
  readonly row: number;
  readonly fromA: number;
  readonly toA: number;
  readonly deltaV: number;
  /** Time between the two samples, s: the longer, the more the reading includes polarisation, not only ohmic drop. */
  readonly intervalS: number;
}

export type CapacityVerdict =
  | { readonly status: 'meets'; readonly sohPct: number; readonly thresholdPct: number; readonly message: string }
  | { readonly status: 'below'; readonly sohPct: number; readonly thresholdPct: number; readonly belowByPoints: number; readonly message: string };

export interface BatteryAnalysis {
  readonly sampleCount: number;
  readonly durationS: number;
  readonly deliveredAh: number;
  readonly deliveredWh: number;
  readonly meanCurrentA: number;
  /** Wh ÷ Ah. */
  readonly meanVoltageV: number;
  readonly startVoltageV: number;
  readonly endVoltageV: number;
  readonly minVoltageV: number;
  readonly ratedCapacityAh: number;
  /** Measured ÷ rated capacity, %. */
  readonly stateOfHealthPct: number;
  /** 100 − state of health (ISO 12405-4 calls this capacity fade). */
  readonly capacityFadePct: number;
  readonly ratedEnergyWh: number | null;
  readonly internalResistance: InternalResistance | null;
  /** Why there is no internal resistance, when there is none. */
  readonly internalResistanceNote: string | null;
  readonly verdict: CapacityVerdict | null;
}

/** Smallest current step that counts for internal resistance, A, and its share of the largest current: below either, noise passes for a step. */
export const MIN_STEP_A = 0.5;
export const MIN_STEP_SHARE = 0.2;

/** Delivered charge and energy by the trapezoidal rule: Ah = ∫I dt / 3600, Wh = ∫V·I dt / 3600. */
export function integrateDischarge(timeS: Float64Array, voltageV: Float64Array, currentA: Float64Array): { ah: number; wh: number } {
  let q = 0;
  let e = 0;
  for (let i = 1; i < timeS.length; i++) {
    const dt = (timeS[i] as number) - (timeS[i - 1] as number);
    const i0 = currentA[i - 1] as number;
    const i1 = currentA[i] as number;
    q += ((i0 + i1) / 2) * dt;
    e += (((voltageV[i - 1] as number) * i0 + (voltageV[i] as number) * i1) / 2) * dt;
  }
  return { ah: q / 3600, wh: e / 3600 };
}

/**
 * DC internal resistance R = −ΔV/ΔI across the largest current change between two adjacent samples
 * (voltage sags when discharge current rises). IEC 61960 steps from 0.2 C to 1 C; any clear step in
 * the log serves, as long as it is large enough not to be noise.
 */
export function internalResistance(run: Pick<BatteryRun, 'timeS' | 'voltageV' | 'currentA' | 'lines'>): { value: InternalResistance | null; note: string | null } {
  const { timeS, voltageV, currentA, lines } = run;
  let maxAbs = 0;
  for (let i = 0; i < currentA.length; i++) maxAbs = Math.max(maxAbs, Math.abs(currentA[i] as number));
  let best = -1;
  let bestStep = 0;
  for (let i = 1; i < currentA.length; i++) {
    const step = Math.abs((currentA[i] as number) - (currentA[i - 1] as number));
    if (step > bestStep) {
      bestStep = step;
      best = i;
    }
  }
  const minStep = Math.max(MIN_STEP_A, MIN_STEP_SHARE * maxAbs);
  if (best === -1 || bestStep < minStep) {
    return {
      value: null,
      note: `No current step of at least ${minStep.toFixed(1)} A between two samples, so internal resistance could not be measured. Log a step in load (e.g. 0.2 C to 1 C) to get it.`,
    };
  }
  const dI = (currentA[best] as number) - (currentA[best - 1] as number);
  const dV = (voltageV[best] as number) - (voltageV[best - 1] as number);
  return {
    value: {
      ohms: -dV / dI,
      row: lines[best] as number,
      fromA: currentA[best - 1] as number,
      toA: currentA[best] as number,
      deltaV: dV,
      intervalS: (timeS[best] as number) - (timeS[best - 1] as number),
    },
    note: null,
  };
}

/** Verdict against the brand's threshold: at the threshold = meets. */
export function capacityVerdict(sohPct: number, thresholdPct: number): CapacityVerdict {
  if (sohPct >= thresholdPct) {
    return { status: 'meets', sohPct, thresholdPct, message: `Capacity is ${sohPct.toFixed(1)} % of rated, at or above the ${thresholdPct} % threshold.` };
  }
  const by = thresholdPct - sohPct;
  return {
    status: 'below',
    sohPct,
    thresholdPct,
    belowByPoints: by,
    message: `Capacity is ${sohPct.toFixed(1)} % of rated, below the ${thresholdPct} % threshold by ${by.toFixed(1)} points.`,
  };
}

export function analyseBattery(run: BatteryRun, options: BatteryAnalysisOptions): BatteryAnalysis {
  const { ratedCapacityAh, thresholdPct, nominalVoltageV } = options;
  if (!Number.isFinite(ratedCapacityAh) || ratedCapacityAh <= 0) throw new RangeError(`ratedCapacityAh must be a positive number of Ah, got ${ratedCapacityAh}`);
  if (thresholdPct !== null && thresholdPct !== undefined && (!Number.isFinite(thresholdPct) || thresholdPct <= 0 || thresholdPct > 100)) {
    throw new RangeError(`thresholdPct must be a percentage in (0, 100], got ${thresholdPct}`);
  }
  const n = run.count;
  const { ah, wh } = integrateDischarge(run.timeS, run.voltageV, run.currentA);
  const durationS = (run.timeS[n - 1] as number) - (run.timeS[0] as number);
  let minV = Infinity;
  for (let i = 0; i < n; i++) minV = Math.min(minV, run.voltageV[i] as number);
  const soh = (ah / ratedCapacityAh) * 100;
  const ir = internalResistance(run);
  return {
    sampleCount: n,
    durationS,
    deliveredAh: ah,
    deliveredWh: wh,
    meanCurrentA: durationS > 0 ? (ah * 3600) / durationS : 0,
    meanVoltageV: ah !== 0 ? wh / ah : NaN,
    startVoltageV: run.voltageV[0] as number,
    endVoltageV: run.voltageV[n - 1] as number,
    minVoltageV: minV,
    ratedCapacityAh,
    stateOfHealthPct: soh,
    capacityFadePct: 100 - soh,
    ratedEnergyWh: nominalVoltageV ? ratedEnergyWh(nominalVoltageV, ratedCapacityAh) : null,
    internalResistance: ir.value,
    internalResistanceNote: ir.note,
    verdict: thresholdPct ? capacityVerdict(soh, thresholdPct) : null,
  };
}
