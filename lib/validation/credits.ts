import { z } from 'zod';

// Shared by the accountant's forms, the dealer's downloads and the route handlers.

const isoDate = z.iso.date({ message: 'Use a date like 2026-03-14.' });

export const queueQuerySchema = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
  sort: z.enum(['waiting', 'number', 'dealer']).default('waiting'),
  dir: z.enum(['asc', 'desc']).default('asc'),
  q: z.string().trim().max(60).optional(),
});

export const editLineSchema = z.object({
  claimId: z.uuid('Unknown claim.'),
  lineNo: z.coerce.number().int().min(1),
  amount: z.string().trim().min(1, 'Enter the amount the line should post, like 120.00.').max(30),
  reason: z.string().trim().min(3, 'Say why the line changes; the dealer sees it on the memo.').max(500),
});

export const reverseMemoSchema = z.object({
  memoId: z.uuid('Unknown memo.'),
  reason: z.string().trim().min(3, 'Say why the memo is reversed; the dealer sees it.').max(500),
});

export const chargebackSchema = z.object({
  claimId: z.uuid('Unknown claim.'),
  reason: z.enum(['no_fault_found', 'core_not_returned', 'not_covered_at_inspection'], { message: 'Choose why the claim is charged back.' }),
  note: z.string().trim().min(3, 'Say what was found; the dealer sees it on the memo.').max(500),
});

export const headerMappingSchema = z
  .object({
    date: z.string().min(1, 'Choose the date column.'),
    reference: z.string().min(1).optional(),
    amount: z.string().min(1).optional(),
    credit: z.string().min(1).optional(),
    debit: z.string().min(1).optional(),
    currency: z.string().min(1).optional(),
    account: z.string().min(1).optional(),
  })
  .refine((m) => m.amount !== undefined || m.credit !== undefined || m.debit !== undefined, {
    path: ['amount'],
    message: 'Choose the amount column, or the credit and/or debit columns.',
  })
  .refine((m) => m.amount === undefined || (m.credit === undefined && m.debit === undefined), {
    path: ['amount'],
    message: 'Choose one signed amount column or credit/debit columns, not both.',
  })
  .refine((m) => new Set(Object.values(m)).size === Object.values(m).length, {
    path: ['_form'],
    message: 'Each column can be used for one field only.',
  });

/** 5 MB of text is some 80,000 statement lines. */
export const MAX_STATEMENT_BYTES = 5 * 1024 * 1024;

export const importStatementSchema = z.object({
  sourceName: z.string().trim().min(2, 'Name the source, e.g. “Kettenblatt Radwerk — monthly statement”.').max(120),
  dealerId: z.uuid('Choose a dealer.').nullable(),
  fileName: z.string().trim().min(1).max(200),
  csv: z.string().min(1, 'The file is empty.').refine((s) => Buffer.byteLength(s, 'utf8') <= MAX_STATEMENT_BYTES, 'The file is larger than 5 MB; split it by month.'),
  mapping: headerMappingSchema,
  options: z.object({
    dateFormat: z.enum(['YYYY-MM-DD', 'DD.MM.YYYY', 'DD/MM/YYYY', 'MM/DD/YYYY']),
    decimalSeparator: z.enum(['.', ',']),
    negate: z.boolean(),
    dateWindowDays: z.number().int().min(0, 'At least 0 days.').max(90, 'At most 90 days.'),
  }),
});

export const matchDecisionSchema = z.object({
  action: z.enum(['confirm', 'reject']),
  note: z.string().trim().max(500).optional(),
});

export const chooseMemoSchema = z.object({ memoNumber: z.string().trim().min(4, 'Enter the memo number, like CM-2026-000123-4.').max(40) });

export const periodSchema = z
  .object({ from: isoDate, to: isoDate })
  .refine((p) => p.from <= p.to, { path: ['to'], message: 'The period ends before it starts.' });

export const exportQuerySchema = z.object({ from: isoDate.optional(), to: isoDate.optional() });

export const liabilityEntrySchema = z.object({
  entryDate: isoDate,
  kind: z.enum(['opening_balance', 'accrual', 'change_in_estimate'], { message: 'Choose what the entry is.' }),
  amount: z.string().trim().min(1, 'Enter the amount, like 3200.00.').max(30),
  note: z.string().trim().min(3, 'Say what the entry is for.').max(300),
  /** Made once per entry by the form, so a double click records it once. */
  clientKey: z.string().uuid().optional(),
});
