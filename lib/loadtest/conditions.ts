import { BAR_PA, formatMass, formatPressure, formatTemperature, parseTyreSize, type UnitSystem } from '@/lib/units';

/** What was recorded with each run, so two runs can be compared like for like. Pressures in Pa, mass in kg, temperature in °C. */
export interface TestConditions {
  /** Battery state of charge at the start of the run, %. */
  readonly batterySocStartPct: number | null;
  /** ISO 5775 size as entered, e.g. "57-622". */
  readonly tyreSize: string | null;
  /** Measured roll-out, mm, when the shop measured it. */
  readonly measuredCircumferenceMm?: number | null;
  readonly tyrePressurePa: number | null;
  /** Maximum pressure printed on the sidewall. */
  readonly tyreMaxPressurePa: number | null;
  readonly dynoId: string | null;
  readonly rollerId: string | null;
  /** Rider or test load, kg. */
  readonly loadKg: number | null;
  readonly ambientTempC: number | null;
  readonly notes: string;
}

/*
 * Tolerances for "the same conditions" (common practice, no source): a repeatable run needs the
 * battery fully charged right before it, the tyre at its sidewall maximum, the same tyre and wheel
 * and the same dyno and roller.
 */
/** State of charge at start: within 5 percentage points (common practice, no source). */
export const SOC_TOLERANCE_POINTS = 5;
/** "Fully charged" means at least 95 % (common practice, no source). */
export const FULL_CHARGE_MIN_PCT = 95;
/** Tyre pressure: within 0.1 bar of each other and of the sidewall maximum (common practice, no source). */
export const PRESSURE_TOLERANCE_PA = 0.1 * BAR_PA;
/** Ambient temperature: within 10 °C (common practice, no source). */
export const TEMPERATURE_TOLERANCE_C = 10;
/** Rider or load: within 5 kg (common practice, no source). */
export const LOAD_TOLERANCE_KG = 5;
/** Measured roll-out: within 1 % (common practice, no source). */
export const CIRCUMFERENCE_TOLERANCE = 0.01;

export type ConditionField = Exclude<keyof TestConditions, 'notes'>;

export interface ConditionCheck {
  readonly field: ConditionField;
  readonly status: 'same' | 'within' | 'differs' | 'missing' | 'not-recorded';
  readonly message: string;
}

export interface ConditionsComparison {
  /** True when every recorded condition matches within tolerance and none is recorded for one run only. */
  readonly comparable: boolean;
  /** Plain-words list of what makes the runs not comparable. */
  readonly differences: readonly string[];
  /** Things to do better next time that do not break the comparison (e.g. tyre below its sidewall maximum in both runs). */
  readonly advice: readonly string[];
  readonly checks: readonly ConditionCheck[];
}

const LABEL: Record<ConditionField, string> = {
  batterySocStartPct: 'Battery charge at start',
  tyreSize: 'Tyre size',
  measuredCircumferenceMm: 'Measured wheel circumference',
  tyrePressurePa: 'Tyre pressure',
  tyreMaxPressurePa: 'Sidewall maximum pressure',
  dynoId: 'Dyno',
  rollerId: 'Roller',
  loadKg: 'Rider or load',
  ambientTempC: 'Ambient temperature',
};

/** Field-by-field problems with one run's conditions, for forms. */
export function validateConditions(c: TestConditions): Array<{ field: ConditionField; message: string }> {
  const out: Array<{ field: ConditionField; message: string }> = [];
  const num = (field: ConditionField, v: number | null | undefined, lo: number, hi: number, what: string) => {
    if (v === null || v === undefined) return;
    if (!Number.isFinite(v) || v < lo || v > hi) out.push({ field, message: `${LABEL[field]} must be ${what}.` });
  };
  num('batterySocStartPct', c.batterySocStartPct, 0, 100, 'between 0 and 100 %');
  num('tyrePressurePa', c.tyrePressurePa, 0, 20 * BAR_PA, 'between 0 and 20 bar');
  num('tyreMaxPressurePa', c.tyreMaxPressurePa, 0, 20 * BAR_PA, 'between 0 and 20 bar');
  num('loadKg', c.loadKg, 0, 500, 'between 0 and 500 kg');
  num('ambientTempC', c.ambientTempC, -40, 60, 'between −40 and 60 °C');
  num('measuredCircumferenceMm', c.measuredCircumferenceMm, 500, 3500, 'between 500 and 3500 mm');
  if (c.tyreSize !== null && c.tyreSize.trim() !== '') {
    const t = parseTyreSize(c.tyreSize);
    if (!t.ok) out.push({ field: 'tyreSize', message: t.message });
  }
  return out;
}

const blank = (v: unknown) => v === null || v === undefined || (typeof v === 'string' && v.trim() === '');

/**
 * Compare the conditions of two runs (usually before and after a repair). Values recorded for only
 * one run make the runs not comparable: nobody can tell whether they matched.
 */
export function compareConditions(before: TestConditions, after: TestConditions, system: UnitSystem = 'metric'): ConditionsComparison {
  const checks: ConditionCheck[] = [];
  const advice: string[] = [];
  const pressure = (pa: number) => formatPressure(pa, system).text;
  const pressureFine = (pa: number) =>
    system === 'metric' ? `${(pa / BAR_PA).toFixed(2)} bar` : formatPressure(pa, system).text;

  const presence = (field: ConditionField, b: unknown, a: unknown): boolean => {
    if (blank(b) && blank(a)) {
      checks.push({ field, status: 'not-recorded', message: `${LABEL[field]} was not recorded for either run.` });
      return false;
    }
    if (blank(b) || blank(a)) {
      checks.push({ field, status: 'missing', message: `${LABEL[field]} was recorded for the ${blank(b) ? 'after' : 'before'} run only, so the runs cannot be compared on it.` });
      return false;
    }
    return true;
  };

  const numeric = (field: ConditionField, b: number | null | undefined, a: number | null | undefined, tol: number, show: (x: number) => string, showDiff: (d: number) => string) => {
    if (!presence(field, b, a)) return;
    const bv = b as number;
    const av = a as number;
    const d = Math.abs(av - bv);
    if (d === 0) checks.push({ field, status: 'same', message: `${LABEL[field]}: ${show(bv)} in both runs.` });
    else if (d <= tol) checks.push({ field, status: 'within', message: `${LABEL[field]}: ${show(bv)} before, ${show(av)} after; within ${showDiff(tol)}.` });
    else checks.push({ field, status: 'differs', message: `${LABEL[field]} differs by ${showDiff(d)} (before ${show(bv)}, after ${show(av)}); allowed ${showDiff(tol)}.` });
  };

  const text = (field: ConditionField, b: string | null, a: string | null) => {
    if (!presence(field, b, a)) return;
    const same = (b as string).trim().toLowerCase() === (a as string).trim().toLowerCase();
    checks.push(
      same
        ? { field, status: 'same', message: `${LABEL[field]}: ${(b as string).trim()} in both runs.` }
        : { field, status: 'differs', message: `${LABEL[field]} differs: "${(b as string).trim()}" before, "${(a as string).trim()}" after. Run both tests on the same ${LABEL[field].toLowerCase()}.` },
    );
  };

  numeric('batterySocStartPct', before.batterySocStartPct, after.batterySocStartPct, SOC_TOLERANCE_POINTS, (x) => `${x.toFixed(0)} %`, (d) => `${d.toFixed(0)} points`);
  for (const [run, c] of [['before', before], ['after', after]] as const) {
    if (c.batterySocStartPct !== null && c.batterySocStartPct < FULL_CHARGE_MIN_PCT) {
      advice.push(`The battery was at ${c.batterySocStartPct.toFixed(0)} % at the start of the ${run} run; charge it fully right before each run.`);
    }
  }

  if (presence('tyreSize', before.tyreSize, after.tyreSize)) {
    const b = parseTyreSize(before.tyreSize as string);
    const a = parseTyreSize(after.tyreSize as string);
    const bIso = b.ok ? b.tyre.iso : (before.tyreSize as string).trim();
    const aIso = a.ok ? a.tyre.iso : (after.tyreSize as string).trim();
    checks.push(
      bIso.toLowerCase() === aIso.toLowerCase()
        ? { field: 'tyreSize', status: 'same', message: `Tyre size: ${bIso} in both runs.` }
        : { field: 'tyreSize', status: 'differs', message: `Tyre size differs: ${bIso} before, ${aIso} after. Use the same tyre and wheel for both runs.` },
    );
  }
  if (!blank(before.measuredCircumferenceMm) || !blank(after.measuredCircumferenceMm)) {
    const b = before.measuredCircumferenceMm;
    const a = after.measuredCircumferenceMm;
    const tolMm = (b ?? a ?? 0) * CIRCUMFERENCE_TOLERANCE;
    numeric('measuredCircumferenceMm', b, a, tolMm, (x) => `${x.toFixed(0)} mm`, (d) => `${d.toFixed(0)} mm`);
  }

  numeric('tyrePressurePa', before.tyrePressurePa, after.tyrePressurePa, PRESSURE_TOLERANCE_PA, pressure, pressureFine);
  for (const [run, c] of [['before', before], ['after', after]] as const) {
    if (c.tyrePressurePa === null || c.tyreMaxPressurePa === null) continue;
    const gap = c.tyreMaxPressurePa - c.tyrePressurePa;
    if (gap > PRESSURE_TOLERANCE_PA) {
      advice.push(`In the ${run} run the tyre was at ${pressure(c.tyrePressurePa)}, below its sidewall maximum of ${pressure(c.tyreMaxPressurePa)}; inflate to the sidewall maximum for dyno runs.`);
    } else if (gap < -PRESSURE_TOLERANCE_PA) {
      advice.push(`In the ${run} run the tyre was at ${pressure(c.tyrePressurePa)}, above its sidewall maximum of ${pressure(c.tyreMaxPressurePa)}; never inflate beyond the sidewall maximum.`);
    }
  }
  if (!blank(before.tyreMaxPressurePa) || !blank(after.tyreMaxPressurePa)) {
    numeric('tyreMaxPressurePa', before.tyreMaxPressurePa, after.tyreMaxPressurePa, PRESSURE_TOLERANCE_PA, pressure, pressureFine);
  }

  text('dynoId', before.dynoId, after.dynoId);
  text('rollerId', before.rollerId, after.rollerId);
  numeric('loadKg', before.loadKg, after.loadKg, LOAD_TOLERANCE_KG, (x) => formatMass(x, system).text, (d) => formatMass(d, system).text);
  numeric('ambientTempC', before.ambientTempC, after.ambientTempC, TEMPERATURE_TOLERANCE_C, (x) => formatTemperature(x, system).text, (d) =>
    system === 'metric' ? `${d.toFixed(0)} °C` : `${((d * 9) / 5).toFixed(0)} °F`,
  );

  const differences = checks.filter((c) => c.status === 'differs' || c.status === 'missing').map((c) => c.message);
  return { comparable: differences.length === 0, differences, advice, checks };
}
