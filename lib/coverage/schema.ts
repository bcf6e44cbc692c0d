import { z } from 'zod';
import { parseIsoDate } from '@/lib/calendar';
import { EXCLUSION_CODES, PART_CATEGORIES } from './policy';
import { CoverageInputError } from './input-error';

const shown = (v: unknown) => (v === undefined ? 'nothing' : JSON.stringify(v));

const isoDate = z.string({ error: 'expected a date YYYY-MM-DD' }).superRefine((value, ctx) => {
  try {
    parseIsoDate(value);
  } catch (e) {
    ctx.addIssue({ code: 'custom', message: (e as Error).message.replace(/^date: /, '') });
  }
});

const exclusionCode = z.enum(EXCLUSION_CODES as [string, ...string[]], {
  error: (issue) => `${shown(issue.input)} is not a known exclusion code (known: ${EXCLUSION_CODES.join(', ')})`,
});

export const coveragePolicySchema = z
  .object({
    category: z.enum(PART_CATEGORIES, {
      error: (issue) => `${shown(issue.input)} is not a part category (one of ${PART_CATEGORIES.join(', ')})`,
    }),
    coverageMonths: z.number({ error: 'expected a number of months' }).int({ error: 'expected a whole number of months' }).min(1, { error: 'must be at least 1 month' }).max(240, { error: 'must be at most 240 months' }),
    cycleLimit: z.number({ error: 'expected a number of cycles' }).int({ error: 'expected a whole number of cycles' }).positive({ error: 'must be at least 1 cycle' }).optional(),
    capacityThresholdPct: z.number({ error: 'expected a percentage' }).gt(0, { error: 'must be above 0 %' }).max(100, { error: 'must be at most 100 %' }).optional(),
    exclusions: z.array(exclusionCode, { error: 'expected a list of exclusion codes (may be empty)' }),
  })
  .superRefine((p, ctx) => {
    if (p.category === 'battery') return;
    for (const key of ['cycleLimit', 'capacityThresholdPct'] as const) {
      if (p[key] !== undefined) ctx.addIssue({ code: 'custom', path: [key], message: `only a battery policy can set this (this policy is for ${p.category})` });
    }
  });

export const coverageInputSchema = z
  .object({
    policy: coveragePolicySchema,
    saleDate: isoDate.nullable(),
    failureDate: isoDate,
    proofOfPurchase: z.boolean({ error: 'expected true or false' }),
    registered: z.boolean({ error: 'expected true or false' }),
    batteryCycles: z.number({ error: 'expected a number of cycles' }).int({ error: 'expected a whole number of cycles' }).min(0, { error: 'cannot be negative' }).optional(),
    measuredCapacityPct: z.number({ error: 'expected a percentage' }).min(0, { error: 'cannot be negative' }).max(150, { error: 'above 150 % of rated is not a plausible measurement; check the test' }).optional(),
    batteryFault: z.enum(['capacity_loss', 'other'], { error: "expected 'capacity_loss' or 'other'" }).optional(),
    flaggedExclusions: z.array(exclusionCode, { error: 'expected a list of exclusion codes' }).optional(),
  })
  .superRefine((input, ctx) => {
    if (input.policy.category !== 'battery') {
      for (const key of ['batteryCycles', 'measuredCapacityPct', 'batteryFault'] as const) {
        if (input[key] !== undefined) ctx.addIssue({ code: 'custom', path: [key], message: `applies to a battery only (this policy is for ${input.policy.category})` });
      }
    }
  });

/** Formats zod issues as `path: message` and throws them as one CoverageInputError. */
export function parseOrThrow<T>(schema: z.ZodType<T>, value: unknown, prefix = ''): T {
  const result = schema.safeParse(value);
  if (result.success) return result.data;
  throw new CoverageInputError(
    result.error.issues.map((issue) => ({
      field: prefix + (issue.path.length ? issue.path.map((p, i) => (typeof p === 'number' ? `[${p}]` : `${i ? '.' : ''}${String(p)}`)).join('') : 'input'),
      message: issue.message,
    })),
  );
}
