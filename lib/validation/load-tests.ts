import { z } from 'zod';

/** A form value as sent: text (possibly empty) or a number; the conditions form reads it in the user's units. */
const formValue = z.union([z.string().max(2000), z.number(), z.null()]).transform((v) => (v === null ? '' : String(v)));

export const conditionsFormSchema = z
  .object({
    batterySocStartPct: formValue,
    tyreSize: formValue,
    measuredCircumference: formValue,
    tyrePressure: formValue,
    tyreMaxPressure: formValue,
    dynoId: formValue,
    rollerId: formValue,
    load: formValue,
    ambientTemp: formValue,
    notes: formValue,
  })
  .partial();

const columnRoleSchema = z.object({
  quantity: z.string().max(40),
  unit: z.string().max(10).optional(),
});

export const loadTestRequestSchema = z.object({
  intentId: z.uuid({ message: 'The upload is missing; add the file again.' }),
  units: z.enum(['metric', 'imperial'], { message: 'Say which units the conditions are in.' }),
  conditions: conditionsFormSchema.default({}),
  // The library checks each column's quantity and unit and names the column when one is wrong.
  mapping: z
    .record(z.string().max(200), columnRoleSchema)
    .refine((m) => Object.keys(m).length <= 200, 'A file has at most 200 columns to map.')
    .nullable()
    .optional(),
  saveMapping: z.boolean().optional(),
});

export const afterTestStepSchema = z.object({
  afterTestId: z.uuid({ message: 'Choose the after-test to send with this step.' }),
});

export const acceptByHandSchema = z.object({
  reason: z
    .string({ message: 'Say why the after-test is accepted.' })
    .trim()
    .min(10, 'Say in a sentence why the after-test is accepted (at least 10 characters); the dealer and accounts read it.')
    .max(2000, 'Keep the reason under 2000 characters.'),
});
