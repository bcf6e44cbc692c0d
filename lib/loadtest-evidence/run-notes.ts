import { FULL_CHARGE_MIN_PCT, PRESSURE_TOLERANCE_PA, type TestConditions } from '@/lib/loadtest';
import { formatPressure, parseTyreSize, type UnitSystem } from '@/lib/units';

/**
 * What one run's own conditions say about how repeatable it is (common practice, no source: a
 * battery charged fully right before the run, the tyre at its sidewall maximum, the bike's own
 * tyre size). These are advice for the next run, not refusals.
 */
export function runConditionNotes(c: TestConditions, units: UnitSystem, opts: { kind: 'dyno' | 'battery'; modelTyreSize?: string | null }): string[] {
  const notes: string[] = [];
  if (c.batterySocStartPct === null) {
    notes.push('The battery charge at the start was not recorded.');
  } else if (c.batterySocStartPct < FULL_CHARGE_MIN_PCT) {
    notes.push(`The battery was at ${c.batterySocStartPct.toFixed(0)} % at the start; charge it fully right before each run so before and after compare.`);
  }
  if (opts.kind === 'battery') return notes;
  if (c.tyrePressurePa !== null && c.tyreMaxPressurePa !== null) {
    const gap = c.tyreMaxPressurePa - c.tyrePressurePa;
    const p = (pa: number) => formatPressure(pa, units).text;
    if (gap > PRESSURE_TOLERANCE_PA) notes.push(`The tyre was at ${p(c.tyrePressurePa)}, below its sidewall maximum of ${p(c.tyreMaxPressurePa)}; inflate to the sidewall maximum for dyno runs.`);
    else if (gap < -PRESSURE_TOLERANCE_PA) notes.push(`The tyre was at ${p(c.tyrePressurePa)}, above its sidewall maximum of ${p(c.tyreMaxPressurePa)}; never inflate beyond the sidewall maximum.`);
  } else if (c.tyrePressurePa === null) {
    notes.push('The tyre pressure was not recorded.');
  }
  if (c.tyreSize && opts.modelTyreSize) {
    const model = parseTyreSize(opts.modelTyreSize);
    if (model.ok && model.tyre.iso !== c.tyreSize) {
      notes.push(`The run was recorded on a ${c.tyreSize} tyre; the bike model is fitted with ${model.tyre.iso} from the factory.`);
    }
  }
  return notes;
}
