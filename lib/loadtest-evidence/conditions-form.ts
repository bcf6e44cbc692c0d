import { validateConditions, type ConditionField, type TestConditions } from '@/lib/loadtest';
import {
  BAR_PA,
  celsiusToFahrenheit,
  fahrenheitToCelsius,
  fromSi,
  parseTyreSize,
  roundTo,
  toSi,
  type UnitSystem,
} from '@/lib/units';
import { CONDITION_LABELS as LABEL, EMPTY_CONDITIONS_FORM, type ConditionsForm, type ConditionsFormField } from './form-labels';

export { CONDITION_LABELS, EMPTY_CONDITIONS_FORM, FORM_UNITS, type ConditionsForm, type ConditionsFormField } from './form-labels';

const PRESSURE = { metric: 'bar', imperial: 'psi' } as const;
const MASS = { metric: 'kg', imperial: 'lb' } as const;
const LENGTH = { metric: 'mm', imperial: 'in' } as const;

/** Plausible ranges, SI; the same bounds the analysis library checks (lib/loadtest/conditions.ts). */
const BOUNDS = {
  batterySocStartPct: [0, 100],
  pressurePa: [0, 20 * BAR_PA],
  loadKg: [0, 500],
  ambientTempC: [-40, 60],
  circumferenceMm: [500, 3500],
} as const;

const MAX_TEXT = { dynoId: 80, rollerId: 80, notes: 1000 } as const;

/** "3,5" and "3.5" both read as 3.5; empty is "not recorded"; anything else is refused. */
function readNumber(text: string): number | null | 'bad' {
  const t = text.trim().replace(/\s+/g, '');
  if (t === '') return null;
  if (!/^[-+]?(\d+([.,]\d*)?|[.,]\d+)$/.test(t)) return 'bad';
  return Number(t.replace(',', '.'));
}


const FIELD_OF: Partial<Record<ConditionField, ConditionsFormField>> = {
  batterySocStartPct: 'batterySocStartPct',
  tyreSize: 'tyreSize',
  measuredCircumferenceMm: 'measuredCircumference',
  tyrePressurePa: 'tyrePressure',
  tyreMaxPressurePa: 'tyreMaxPressure',
  dynoId: 'dynoId',
  rollerId: 'rollerId',
  loadKg: 'load',
  ambientTempC: 'ambientTemp',
};

export type ConditionsFormResult =
  | { readonly ok: true; readonly conditions: TestConditions }
  | { readonly ok: false; readonly fieldErrors: Partial<Record<ConditionsFormField, string[]>> };

/**
 * The form, typed in `units`, → conditions in SI. Errors name the field and give the range in the
 * user's own units.
 */
export function conditionsFromForm(form: Partial<ConditionsForm>, units: UnitSystem): ConditionsFormResult {
  const f = { ...EMPTY_CONDITIONS_FORM, ...form };
  const errors: Partial<Record<ConditionsFormField, string[]>> = {};
  const fail = (field: ConditionsFormField, message: string) => ((errors[field] ??= []).push(message), null);

  const number = (field: ConditionsFormField): number | null => {
    const v = readNumber(String(f[field] ?? ''));
    if (v === 'bad') return fail(field, `${LABEL[field]} must be a number, like 3.5.`);
    return v;
  };
  const within = (field: ConditionsFormField, si: number | null, [lo, hi]: readonly [number, number], show: (x: number) => string): number | null => {
    if (si === null) return null;
    if (!(si >= lo && si <= hi)) return fail(field, `${LABEL[field]} must be between ${show(lo)} and ${show(hi)}.`);
    return si;
  };
  const text = (field: 'dynoId' | 'rollerId' | 'notes'): string => {
    const t = String(f[field] ?? '').trim();
    if (t.length > MAX_TEXT[field]) fail(field, `${LABEL[field]} can be at most ${MAX_TEXT[field]} characters.`);
    return t;
  };

  const soc = within('batterySocStartPct', number('batterySocStartPct'), BOUNDS.batterySocStartPct, (x) => `${x} %`);

  const pressureUnit = PRESSURE[units];
  const showPressure = (pa: number) => `${roundTo(fromSi('pressure', pa, pressureUnit), 0)} ${pressureUnit}`;
  const pressure = (field: 'tyrePressure' | 'tyreMaxPressure') => {
    const v = number(field);
    return within(field, v === null ? null : toSi('pressure', v, pressureUnit), BOUNDS.pressurePa, showPressure);
  };
  const tyrePressurePa = pressure('tyrePressure');
  const tyreMaxPressurePa = pressure('tyreMaxPressure');

  const massUnit = MASS[units];
  const loadRaw = number('load');
  const loadKg = within('load', loadRaw === null ? null : toSi('mass', loadRaw, massUnit), BOUNDS.loadKg, (kg) => `${roundTo(fromSi('mass', kg, massUnit), 0)} ${massUnit}`);

  const tempRaw = number('ambientTemp');
  const ambientTempC = within(
    'ambientTemp',
    tempRaw === null ? null : units === 'metric' ? tempRaw : fahrenheitToCelsius(tempRaw),
    BOUNDS.ambientTempC,
    (c) => (units === 'metric' ? `${c} °C` : `${roundTo(celsiusToFahrenheit(c), 0)} °F`),
  );

  const lengthUnit = LENGTH[units];
  const circRaw = number('measuredCircumference');
  const circMm = within(
    'measuredCircumference',
    circRaw === null ? null : toSi('length', circRaw, lengthUnit) * 1000,
    BOUNDS.circumferenceMm,
    (mm) => `${roundTo(fromSi('length', mm / 1000, lengthUnit), units === 'metric' ? 0 : 1)} ${lengthUnit}`,
  );

  let tyreSize: string | null = null;
  const tyreText = String(f.tyreSize ?? '').trim();
  if (tyreText !== '') {
    const parsed = parseTyreSize(tyreText);
    if (parsed.ok) tyreSize = parsed.tyre.iso;
    else fail('tyreSize', parsed.message);
  }

  const conditions: TestConditions = {
    batterySocStartPct: soc,
    tyreSize,
    measuredCircumferenceMm: circMm === null ? null : roundTo(circMm, 1),
    tyrePressurePa,
    tyreMaxPressurePa,
    dynoId: text('dynoId') || null,
    rollerId: text('rollerId') || null,
    loadKg,
    ambientTempC,
    notes: text('notes'),
  };
  if (Object.keys(errors).length === 0) {
    // The library's own check is the backstop: anything it refuses that the form let through.
    for (const p of validateConditions(conditions)) {
      const field = FIELD_OF[p.field];
      if (field) (errors[field] ??= []).push(p.message);
    }
  }
  return Object.keys(errors).length ? { ok: false, fieldErrors: errors } : { ok: true, conditions };
}

const show = (x: number | null | undefined, decimals: number) => (x === null || x === undefined ? '' : String(roundTo(x, decimals)));

/** Stored SI conditions → the form in the user's units (to prefill an after-test from the before-test). */
export function conditionsToForm(c: TestConditions, units: UnitSystem): ConditionsForm {
  return {
    batterySocStartPct: show(c.batterySocStartPct, 0),
    tyreSize: c.tyreSize ?? '',
    measuredCircumference:
      c.measuredCircumferenceMm === null || c.measuredCircumferenceMm === undefined
        ? ''
        : show(fromSi('length', c.measuredCircumferenceMm / 1000, LENGTH[units]), units === 'metric' ? 0 : 2),
    tyrePressure: c.tyrePressurePa === null ? '' : show(fromSi('pressure', c.tyrePressurePa, PRESSURE[units]), units === 'metric' ? 2 : 1),
    tyreMaxPressure: c.tyreMaxPressurePa === null ? '' : show(fromSi('pressure', c.tyreMaxPressurePa, PRESSURE[units]), units === 'metric' ? 2 : 1),
    dynoId: c.dynoId ?? '',
    rollerId: c.rollerId ?? '',
    load: c.loadKg === null ? '' : show(fromSi('mass', c.loadKg, MASS[units]), 1),
    ambientTemp: c.ambientTempC === null ? '' : show(units === 'metric' ? c.ambientTempC : celsiusToFahrenheit(c.ambientTempC), 0),
    notes: c.notes,
  };
}
