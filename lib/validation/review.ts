import { z } from 'zod';
import { PART_CATEGORIES } from '@/lib/coverage';
import { REQUEST_ITEMS } from '@/lib/review/info-request';
import { DENIAL_REASONS } from '@/machines/claim';

const message = (missing: string, max = 4000) =>
  z.string({ error: missing }).trim().min(1, missing).max(max, `At most ${max} characters.`);

/** The rep's approval: an answer for every requested line. Quantities and hours are checked against the claim by the server. */
export const approveRequestSchema = z.object({
  parts: z
    .array(
      z.object({
        lineId: z.string({ error: 'A part line has no id.' }),
        quantity: z.coerce.number({ error: 'Enter a quantity (0 if the part is not approved).' }).refine(Number.isFinite, 'Enter a quantity (0 if the part is not approved).'),
      }),
      { error: 'The part lines are missing.' },
    )
    .default([]),
  labor: z
    .array(
      z.object({
        lineId: z.string({ error: 'A labor line has no id.' }),
        operationId: z.string({ error: 'Choose an operation from the schedule.' }),
        hours: z.union([z.string(), z.number()], { error: 'Enter the hours (0 if not approved).' }).transform(String),
      }),
      { error: 'The labor lines are missing.' },
    )
    .default([]),
  freight: z.union([z.string(), z.number()]).transform(String).default(''),
  message: z.string().trim().max(2000, 'At most 2000 characters.').optional(),
});
export type ApproveRequest = z.infer<typeof approveRequestSchema>;

const ITEM_KEYS = REQUEST_ITEMS.map((i) => i.key) as [string, ...string[]];

export const requestInfoSchema = z.object({
  items: z
    .array(z.object({ key: z.enum(ITEM_KEYS, { error: 'Not an item of the checklist.' }), detail: z.string().trim().max(300, 'At most 300 characters.').default('') }), {
      error: 'Tick at least one thing the dealer must send.',
    })
    .min(1, 'Tick at least one thing the dealer must send.'),
  message: message('Write the dealer a message: what is missing and why.', 2000),
});
export type RequestInfoRequest = z.infer<typeof requestInfoSchema>;

export const denySchema = z.object({
  reasonCode: z.enum(DENIAL_REASONS, { error: 'Choose the reason from the list.' }),
  message: message('Tell the dealer why, in a sentence or two.', 2000),
});

export const appealSchema = z.object({ message: message('Tell the brand why the decision should change.', 2000) });

export const resubmitSchema = z.object({ message: z.string().trim().max(2000, 'At most 2000 characters.').optional() });

export const claimMessageSchema = z.object({
  message: message('Write a message first.'),
  /** Made by the form once per message, so a double submit is one message. */
  clientKey: z.uuid('The message key is malformed; reload the page.').optional(),
});

export const QUEUE_VIEWS = {
  open: ['submitted', 'in_review', 'waiting_on_dealer', 'appealed'],
  needs_rep: ['submitted', 'appealed'],
  in_review: ['in_review'],
  waiting: ['waiting_on_dealer'],
  decided: ['approved', 'credit_pending', 'credited', 'reconciled', 'denied', 'withdrawn'],
  all: [],
} as const satisfies Record<string, readonly string[]>;
export type QueueView = keyof typeof QUEUE_VIEWS;

export const AGE_BUCKETS = {
  '0-2': { minDays: 0, maxDays: 3, label: 'Up to 2 days' },
  '3-7': { minDays: 3, maxDays: 8, label: '3 to 7 days' },
  '8-30': { minDays: 8, maxDays: 31, label: '8 to 30 days' },
  '31+': { minDays: 31, maxDays: null, label: 'Over 30 days' },
} as const;
export type AgeBucket = keyof typeof AGE_BUCKETS;

export const reviewQueueQuerySchema = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
  sort: z.enum(['deadline', 'age', 'number', 'updated']).default('deadline'),
  dir: z.enum(['asc', 'desc']).default('asc'),
  view: z.enum(Object.keys(QUEUE_VIEWS) as [QueueView, ...QueueView[]]).default('open'),
  assigned: z.enum(['me', 'nobody']).optional(),
  dealer: z.uuid('Unknown dealer.').optional(),
  category: z.enum(PART_CATEGORIES).optional(),
  age: z.enum(Object.keys(AGE_BUCKETS) as [AgeBucket, ...AgeBucket[]]).optional(),
  deadline: z.enum(['overdue', 'due_soon', 'on_track', 'paused']).optional(),
  q: z.string().trim().max(60).optional(),
});
export type ReviewQueueQuery = z.infer<typeof reviewQueueQuerySchema>;
