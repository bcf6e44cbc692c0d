import { z } from 'zod';

const isoDate = z.iso.date({ message: 'Use a date like 2026-03-14.' });
const optionalNumber = (schema: z.ZodNumber) =>
  z.preprocess((v) => (v === '' || v === null || v === undefined ? undefined : v), z.coerce.number().pipe(schema).optional());

export const requestedPartSchema = z.object({
  partId: z.uuid('Choose a part from the list.'),
  quantity: z.coerce.number().int('Whole parts only.').min(1, 'At least one.').max(10, 'At most 10 per line.'),
  fromDealerStock: z.coerce.boolean().default(false),
});

export const requestedLaborSchema = z.object({ operationId: z.uuid('Choose an operation from the schedule.') });

/**
 * The claim as the dealer fills it in; shared by the form and the server. A draft may be
 * saved with only the brand and frame serial; `missingDetails` says what submitting needs.
 */
export const claimDraftSchema = z
  .object({
    brandId: z.uuid('Choose the brand the claim goes to.'),
    frameSerial: z.string().trim().min(3, 'Enter the frame serial.').max(40),
    modelId: z.uuid('Choose the bike model.').optional().or(z.literal('').transform(() => undefined)),
    saleDate: isoDate.optional().or(z.literal('').transform(() => undefined)),
    partId: z.uuid('Choose the failed part.').optional().or(z.literal('').transform(() => undefined)),
    partSerial: z.string().trim().max(60).default(''),
    failureDate: isoDate.optional().or(z.literal('').transform(() => undefined)),
    odometerKm: optionalNumber(z.number().min(0, 'The odometer cannot be negative.').max(200000, 'That odometer reading looks wrong.')),
    batteryCycles: optionalNumber(z.number().int('Whole cycles only.').min(0, 'Cycles cannot be negative.').max(10000)),
    symptom: z.string().trim().max(500).default(''),
    errorCodes: z.string().trim().max(200).default(''),
    description: z.string().trim().max(4000).default(''),
    customerName: z.string().trim().max(120).default(''),
    customerEmail: z.union([z.literal(''), z.email('Enter a valid e-mail or leave it empty.')]).default(''),
    customerPhone: z.string().trim().max(40).default(''),
    parts: z.array(requestedPartSchema).max(10).default([]),
    labor: z.array(requestedLaborSchema).max(10).default([]),
    clientKey: z.string().regex(/^[A-Za-z0-9-]{8,64}$/).optional(),
    freight: z.string().trim().regex(/^\d{0,6}([.,]\d{1,2})?$/, 'Freight as an amount, like 18.50.').default(''),
  })
  .refine((v) => !v.saleDate || !v.failureDate || v.saleDate <= v.failureDate, { path: ['saleDate'], message: 'The sale date is after the failure date.' })
  // "Future" here means after today anywhere on Earth (UTC+14); the server then checks the shop's own date.
  .refine((v) => !v.failureDate || v.failureDate <= new Date(Date.now() + 14 * 3600_000).toISOString().slice(0, 10), { path: ['failureDate'], message: 'The failure date is in the future.' });

export type ClaimDraftInput = z.infer<typeof claimDraftSchema>;

export const claimListQuerySchema = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(50),
  sort: z.enum(['updated', 'created', 'number', 'stage', 'failure']).default('updated'),
  dir: z.enum(['asc', 'desc']).default('desc'),
  stage: z.string().regex(/^[a-z_]+(,[a-z_]+)*$/).optional(),
  brand: z.uuid().optional(),
  q: z.string().trim().max(60).optional(),
});
export type ClaimListQuery = z.infer<typeof claimListQuerySchema>;

export const claimIdSchema = z.uuid('Unknown claim.');
