import { z } from 'zod';
import { CARRIER_CODES, type CarrierCode } from '@/lib/carrier/carriers';
import { ADJUSTMENT_REASONS } from '@/lib/fulfilment/stock';
import { CORE_CONDITIONS, INSPECTION_RESULTS, WAIVER_REASONS } from '@/machines/claim';

// Forms and server share these: the warehouse's shipping and receiving, the dealer's core return.

const carrier = z.enum(CARRIER_CODES as [CarrierCode, ...CarrierCode[]], { error: 'Choose a carrier.' });
const service = z.string({ error: 'Choose a service.' }).trim().min(1, 'Choose a service.');
const version = z.number().int().min(0).optional();

export const shipSchema = z
  .object({
    carrier,
    service,
    /** book = the carrier books it and sends the tracking number and label; manual = a label printed elsewhere. */
    tracking: z.enum(['book', 'manual'], { error: 'Book the label with the carrier or enter a tracking number.' }),
    trackingNumber: z.string().trim().max(40).optional(),
    pickedLineIds: z.array(z.string().min(1)).max(20, 'Too many lines.'),
    version,
  })
  .refine((v) => v.tracking === 'book' || (v.trackingNumber ?? '').length > 0, { path: ['trackingNumber'], message: 'Enter the tracking number from the label.' });
export type ShipInput = z.infer<typeof shipSchema>;

export const returnLabelSchema = z.object({
  carrier,
  service,
  batteryCondition: z.enum(['sound', 'damaged_or_defective'], { error: 'Say whether the battery is sound or damaged.' }).optional(),
  packagingConfirmed: z.boolean().optional(),
  version,
});
export type ReturnLabelInput = z.infer<typeof returnLabelSchema>;

export const coreShippedSchema = z.object({
  carrier,
  trackingNumber: z.string({ error: 'Enter the tracking number.' }).trim().min(1, 'Enter the tracking number.').max(40),
  packedAsInstructed: z.boolean().optional(),
  version,
});
export type CoreShippedInput = z.infer<typeof coreShippedSchema>;

export const coreReceivedSchema = z.object({
  condition: z.enum(CORE_CONDITIONS, { error: 'Choose the condition the core arrived in.' }),
  notes: z.string().trim().max(2000).optional(),
  version,
});
export type CoreReceivedInput = z.infer<typeof coreReceivedSchema>;

export const inspectSchema = z.object({
  result: z.enum(INSPECTION_RESULTS, { error: 'Choose the inspection result.' }),
  notes: z.string().trim().max(4000).optional(),
  version,
});
export type InspectInput = z.infer<typeof inspectSchema>;

export const waiveCoreSchema = z.object({
  reason: z.enum(WAIVER_REASONS, { error: 'Choose why the return is waived.' }),
  proofAttachmentId: z.uuid('Choose the photo that proves the disposal.'),
  version,
});
export type WaiveCoreInput = z.infer<typeof waiveCoreSchema>;

export const stockAdjustmentSchema = z.object({
  delta: z.coerce.number({ error: 'Enter a whole number, like 5 or -2.' }).int('Whole parts only.').min(-10000).max(10000),
  reason: z.enum(ADJUSTMENT_REASONS, { error: 'Choose a reason.' }),
  note: z.string().trim().max(500).default(''),
  /** The level the user saw; a different current level means someone (or a retry) got there first. */
  expectedOnHand: z.number().int().min(0).optional(),
});

export const restockDateSchema = z.object({
  expectedOn: z.union([z.iso.date({ message: 'Use a date like 2026-03-14.' }), z.literal('').transform(() => null), z.null()]),
  note: z.string().trim().max(500).default(''),
});

const paging = {
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
  dir: z.enum(['asc', 'desc']).default('asc'),
  q: z.string().trim().max(60).optional(),
};

export const toShipQuerySchema = z.object({
  ...paging,
  filter: z.enum(['all', 'ready', 'backordered', 'batteries']).default('all'),
  sort: z.enum(['approved', 'rma', 'dealer']).default('approved'),
});
export type ToShipQuery = z.infer<typeof toShipQuerySchema>;

export const returnsQuerySchema = z.object({
  ...paging,
  filter: z.enum(['open', 'label_needed', 'awaiting_dealer', 'in_transit', 'received', 'overdue', 'closed']).default('open'),
  sort: z.enum(['due', 'rma', 'dealer']).default('due'),
});
export type ReturnsQuery = z.infer<typeof returnsQuerySchema>;
