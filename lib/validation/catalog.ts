import { z } from 'zod';
import { DYNO_CATEGORIES, LEGAL_CLASS_IDS, MASS_INPUT_UNITS, POWER_INPUT_UNITS, specToSi, TORQUE_INPUT_UNITS } from '@/lib/catalog';
import { EXCLUSION_CODES, PART_CATEGORIES, type ExclusionCode } from '@/lib/coverage';
import { parseTyreSize } from '@/lib/units';

// Catalog forms post FormData: every value arrives as text, a checkbox as "on" or not at all.
const blank = (v: unknown) => v === '' || v === null || v === undefined;
const optionalId = z.preprocess((v) => (blank(v) ? undefined : v), z.uuid('Unknown item.').optional());
const checkbox = z.preprocess((v) => v === 'on' || v === 'true' || v === true, z.boolean());
const code = (what: string, max = 20) =>
  z
    .string()
    .trim()
    .min(1, `Enter the ${what}.`)
    .max(max, `At most ${max} characters.`)
    .regex(/^[A-Za-z0-9][A-Za-z0-9\-_./]*$/, 'Letters, digits and - _ . / only, starting with a letter or digit.');
const text = (what: string, min: number, max: number) =>
  z.string().trim().min(min, `Enter the ${what}.`).max(max, `At most ${max} characters.`);
const isoDate = z.iso.date({ message: 'Use a date like 2026-03-14.' });

/** A number typed into a form: empty is "not given", anything else must be a finite number. */
const optionalNumber = (check: z.ZodNumber) =>
  z.preprocess(
    (v) => (blank(v) ? undefined : typeof v === 'string' ? Number(v.trim().replace(/\s/g, '')) : v),
    z.number({ message: 'Enter a number, like 24.5.' }).pipe(check).optional(),
  );
const wholeNumber = (label: string, min: number, max: number) =>
  z.preprocess(
    (v) => (blank(v) ? undefined : typeof v === 'string' ? Number(v.trim()) : v),
    z.number({ message: `Enter the ${label}.` }).int('Whole numbers only.').min(min, `At least ${min}.`).max(max, `At most ${max}.`),
  );
const optionalWhole = (min: number, max: number) =>
  z.preprocess(
    (v) => (blank(v) ? undefined : typeof v === 'string' ? Number(v.trim()) : v),
    z.number({ message: 'Enter a whole number.' }).int('Whole numbers only.').min(min, `At least ${min}.`).max(max, `At most ${max}.`).optional(),
  );
/** An amount as typed; parsed to minor units in the brand's currency by the service (lib/money). */
const amount = (what: string) => z.string().trim().min(1, `Enter the ${what}.`).max(30);

export const modelSchema = z.object({
  id: optionalId,
  code: code('model code'),
  name: text('model name', 2, 80),
  modelYear: optionalWhole(1990, 2100),
  legalClass: z.enum(LEGAL_CLASS_IDS, { message: 'Choose the class the bike is sold as.' }),
  tyreSize: z
    .string()
    .trim()
    .transform((v, ctx) => {
      const r = parseTyreSize(v);
      if (!r.ok) {
        ctx.addIssue({ code: 'custom', message: r.message });
        return z.NEVER;
      }
      return r.tyre.iso;
    }),
  active: checkbox,
});
export type ModelInput = z.infer<typeof modelSchema>;

export const partSchema = z
  .object({
    id: optionalId,
    partNumber: code('part number', 40),
    name: text('part name', 2, 120),
    category: z.enum(PART_CATEGORIES, { message: 'Choose the kind of part.' }),
    minWheelPower: optionalNumber(z.number().positive('Must be above zero.').max(20000, 'That is not an e-bike wheel power.')),
    powerUnit: z.enum(POWER_INPUT_UNITS).default('w'),
    minWheelTorque: optionalNumber(z.number().positive('Must be above zero.').max(2000, 'That is not an e-bike wheel torque.')),
    torqueUnit: z.enum(TORQUE_INPUT_UNITS).default('nm'),
    ratedCapacityAh: optionalNumber(z.number().positive('Must be above zero.').max(1000, 'At most 1000 Ah.').multipleOf(0.01, 'At most two decimals.')),
    nominalVoltageV: optionalNumber(z.number().positive('Must be above zero.').max(1000, 'At most 1000 V.').multipleOf(0.1, 'At most one decimal.')),
    weight: optionalNumber(z.number().positive('Must be above zero.').max(200, 'That is heavier than any e-bike part.')),
    massUnit: z.enum(MASS_INPUT_UNITS).default('kg'),
    unitCost: z.string().trim().max(30).default(''),
    active: checkbox,
  })
  .superRefine((p, ctx) => {
    const issue = (path: string, message: string) => ctx.addIssue({ code: 'custom', path: [path], message });
    if (p.category === 'battery') {
      if (p.ratedCapacityAh === undefined) issue('ratedCapacityAh', 'A battery needs its rated capacity.');
      if (p.nominalVoltageV === undefined) issue('nominalVoltageV', 'A battery needs its nominal voltage.');
    } else {
      if (p.ratedCapacityAh !== undefined) issue('ratedCapacityAh', 'Only a battery has a rated capacity.');
      if (p.nominalVoltageV !== undefined) issue('nominalVoltageV', 'Only a battery has a nominal voltage.');
    }
    if (DYNO_CATEGORIES.includes(p.category)) {
      if (p.category === 'drive_unit' && p.minWheelPower === undefined && p.minWheelTorque === undefined) {
        issue('minWheelPower', 'A drive unit needs a minimum wheel power or torque to judge its dyno runs against.');
      }
    } else {
      if (p.minWheelPower !== undefined) issue('minWheelPower', 'Only a drive unit or controller has a dyno spec.');
      if (p.minWheelTorque !== undefined) issue('minWheelTorque', 'Only a drive unit or controller has a dyno spec.');
    }
  })
  .transform((p, ctx) => {
    // Stored in SI at the column's precision; a value that rounds to nothing is refused.
    const power = p.minWheelPower === undefined ? null : specToSi.power(p.minWheelPower, p.powerUnit);
    const torque = p.minWheelTorque === undefined ? null : specToSi.torque(p.minWheelTorque, p.torqueUnit);
    const weight = p.weight === undefined ? null : specToSi.mass(p.weight, p.massUnit);
    if (power === 0) ctx.addIssue({ code: 'custom', path: ['minWheelPower'], message: 'Too small to store; enter at least 0.1 W.' });
    if (torque === 0) ctx.addIssue({ code: 'custom', path: ['minWheelTorque'], message: 'Too small to store; enter at least 0.01 N·m.' });
    if (weight === 0) ctx.addIssue({ code: 'custom', path: ['weight'], message: 'Too small to store; enter at least 0.01 kg.' });
    return {
      id: p.id, partNumber: p.partNumber, name: p.name, category: p.category, active: p.active, unitCost: p.unitCost,
      minWheelPowerW: power, minWheelTorqueNm: torque, ratedCapacityAh: p.ratedCapacityAh ?? null,
      nominalVoltageV: p.nominalVoltageV ?? null, weightKg: weight,
    };
  });
export type PartInput = z.infer<typeof partSchema>;

/** Exclusions come as one checkbox per code, named `exclusion_<code>`. */
const exclusionsFrom = (raw: Record<string, unknown>): ExclusionCode[] =>
  EXCLUSION_CODES.filter((c) => raw[`exclusion_${c}`] === 'on' || raw[`exclusion_${c}`] === 'true');

export const policySchema = z.preprocess(
  (raw) => (raw && typeof raw === 'object' ? { ...raw, exclusions: exclusionsFrom(raw as Record<string, unknown>) } : raw),
  z
    .object({
      category: z.enum(PART_CATEGORIES, { message: 'Choose the kind of part.' }),
      coverageMonths: wholeNumber('months covered', 1, 240),
      cycleLimit: optionalWhole(1, 10000),
      capacityThresholdPct: optionalNumber(z.number().min(1, 'At least 1 %.').max(100, 'At most 100 %.').multipleOf(0.01, 'At most two decimals.')),
      coreReturnDays: wholeNumber('days to return the core', 1, 365),
      coreGraceDays: wholeNumber('grace days', 0, 60),
      reviewDays: wholeNumber('review deadline', 1, 60),
      appealDays: wholeNumber('appeal window', 1, 365),
      exclusions: z.array(z.enum(EXCLUSION_CODES as [ExclusionCode, ...ExclusionCode[]])),
    })
    .superRefine((p, ctx) => {
      if (p.category === 'battery') return;
      for (const key of ['cycleLimit', 'capacityThresholdPct'] as const) {
        if (p[key] !== undefined) ctx.addIssue({ code: 'custom', path: [key], message: 'Only a battery policy has this.' });
      }
    }),
);
export type PolicyInput = z.infer<typeof policySchema>;

export const laborSchema = z.object({
  id: optionalId,
  code: code('operation code'),
  description: text('description', 3, 200),
  category: z.preprocess((v) => (blank(v) ? null : v), z.enum(PART_CATEGORIES, { message: 'Choose a kind of part or leave it open.' }).nullable()),
  standardHours: z
    .string()
    .trim()
    .regex(/^\d{1,2}(\.\d{1,2})?$/, 'Hours with up to two decimals and a dot, like 1.25.')
    .pipe(z.string().refine((h) => Number(h) > 0 && Number(h) <= 40, 'Between 0.01 and 40 hours.'))
    // At most two decimals were typed, so this only pads ("1.5" → "1.50"); nothing is rounded.
    .transform((h) => Number(h).toFixed(2)),
  active: checkbox,
});
export type LaborInput = z.infer<typeof laborSchema>;

export const priceSchema = z.object({
  partId: z.uuid('Choose a part.'),
  netPrice: amount('net price'),
  effectiveFrom: isoDate,
});
export type PriceInput = z.infer<typeof priceSchema>;

export const holidaySchema = z.object({ day: isoDate, name: text('name of the day', 2, 80) });
export type HolidayInput = z.infer<typeof holidaySchema>;
export const holidayDaySchema = z.object({ day: isoDate });

export const laborRateSchema = z.object({ accountId: z.uuid('Unknown dealer account.'), laborRate: amount('labor rate') });
export type LaborRateInput = z.infer<typeof laborRateSchema>;

/** The registry page's search: whatever arrives in the address bar, read without a refusal. */
const first = (v: unknown) => (Array.isArray(v) ? v[0] : v);
export const registryQuerySchema = z.object({
  q: z.preprocess(first, z.string().optional().catch(undefined)).transform((v) => v?.trim().slice(0, 60) || undefined),
  page: z.preprocess(first, z.coerce.number().int().min(1).max(10000).catch(1).default(1)),
});
