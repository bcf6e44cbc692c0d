import { z } from 'zod';
import { evidenceSummarySchema, type EvidenceSummary } from '@/lib/claims/evidence';

export const ROLES = ['dealer', 'dealer_admin', 'brand_rep', 'warehouse', 'accountant', 'brand_admin', 'system'] as const;
export type Role = (typeof ROLES)[number];
/** The two dealer roles are equal for every claim step. */
export const DEALER_ROLES = ['dealer', 'dealer_admin'] as const satisfies readonly Role[];

export interface Actor {
  id: string;
  role: Role;
}

/** Our own list of reasons a rep may deny a claim for. */
export const DENIAL_REASONS = [
  'out_of_coverage',
  'unregistered_no_proof',
  'modification_or_tampering',
  'crash_or_impact',
  'water_ingress',
  'wear_item',
  'insufficient_evidence',
  'not_our_part',
] as const;
export type DenialReason = (typeof DENIAL_REASONS)[number];

export const APPROVAL_EXTENTS = ['full', 'partial'] as const;
export type ApprovalExtent = (typeof APPROVAL_EXTENTS)[number];

export const CORE_CONDITIONS = ['sound', 'transit_damage', 'incomplete'] as const;
export type CoreCondition = (typeof CORE_CONDITIONS)[number];

export const INSPECTION_RESULTS = ['fault_confirmed', 'no_fault_found', 'not_covered'] as const;
export type InspectionResult = (typeof INSPECTION_RESULTS)[number];

export const WAIVER_REASONS = ['local_recycling', 'scrapped_at_shop'] as const;
export type WaiverReason = (typeof WAIVER_REASONS)[number];

/** One requested line (part, labor operation, freight) and the rep's verdict on it. */
export interface ApprovalLine {
  lineId: string;
  approved: boolean;
  /** Approved, but less than requested (a lower quantity, fewer hours, another operation, less freight). */
  changed?: boolean;
  note?: string;
}

interface StepBase {
  actor: Actor;
  /** ISO 8601 timestamp with a zone, set by the server. */
  at: string;
}

export interface SubmitEvent extends StepBase { type: 'SUBMIT'; evidence: EvidenceSummary }
export interface WithdrawEvent extends StepBase { type: 'WITHDRAW'; note?: string }
export interface TakeEvent extends StepBase {
  type: 'TAKE';
  /** Set by the server when the brand has no rep other than the one who denied the claim. */
  noOtherRep?: boolean;
}
export interface ReleaseEvent extends StepBase { type: 'RELEASE'; note?: string }
export interface RequestInfoEvent extends StepBase { type: 'REQUEST_INFO'; checklist: string[]; message: string }
export interface ResubmitEvent extends StepBase { type: 'RESUBMIT'; evidence: EvidenceSummary; message?: string }
export interface ApproveEvent extends StepBase {
  type: 'APPROVE';
  extent: ApprovalExtent;
  lines: ApprovalLine[];
  rmaNumber: string;
  /** Return label for the core, when the warehouse has one ready at approval. */
  coreReturnLabelRef?: string;
  /** The core is a lithium battery that ships as dangerous goods (decided by the transport rules). */
  coreDangerousGoods?: boolean;
  /** No approved part is to be shipped: the dealer fitted every one from its own stock, or none was approved. */
  nothingToShip?: boolean;
}
export interface DenyEvent extends StepBase {
  type: 'DENY';
  reasonCode: DenialReason;
  message: string;
  /** Last moment an appeal is accepted; computed by the server from the brand's policy. */
  appealOpenUntil: string;
}
export interface AppealEvent extends StepBase { type: 'APPEAL'; message: string }
export interface ShipEvent extends StepBase { type: 'SHIP'; carrier: string; trackingNumber: string }
export interface MarkFittedEvent extends StepBase { type: 'MARK_FITTED'; afterTestId: string; afterTestPasses: boolean }
export interface SubmitAfterTestEvent extends StepBase {
  type: 'SUBMIT_AFTER_TEST';
  afterTestId: string;
  afterTestPasses: boolean;
}
export interface AcceptByHandEvent extends StepBase { type: 'ACCEPT_BY_HAND'; reason: string }
export interface IssueReturnLabelEvent extends StepBase {
  type: 'ISSUE_RETURN_LABEL';
  labelRef: string;
  dangerousGoods: boolean;
}
export interface RemindCoreEvent extends StepBase { type: 'REMIND_CORE' }
export interface CoreShippedEvent extends StepBase { type: 'CORE_SHIPPED'; carrier: string; trackingNumber: string }
export interface CoreReceivedEvent extends StepBase { type: 'CORE_RECEIVED'; condition: CoreCondition; notes?: string }
export interface InspectEvent extends StepBase { type: 'INSPECT'; result: InspectionResult; notes?: string }
export interface WaiveCoreEvent extends StepBase { type: 'WAIVE_CORE'; reason: WaiverReason; proofAttachmentId: string }
export interface WriteOffCoreEvent extends StepBase { type: 'WRITE_OFF_CORE' }
export interface IssueCreditEvent extends StepBase { type: 'ISSUE_CREDIT'; memoId: string }
export interface ReconcileEvent extends StepBase { type: 'RECONCILE'; statementLineRef: string }

export type ClaimEvent =
  | SubmitEvent
  | WithdrawEvent
  | TakeEvent
  | ReleaseEvent
  | RequestInfoEvent
  | ResubmitEvent
  | ApproveEvent
  | DenyEvent
  | AppealEvent
  | ShipEvent
  | MarkFittedEvent
  | SubmitAfterTestEvent
  | AcceptByHandEvent
  | IssueReturnLabelEvent
  | RemindCoreEvent
  | CoreShippedEvent
  | CoreReceivedEvent
  | InspectEvent
  | WaiveCoreEvent
  | WriteOffCoreEvent
  | IssueCreditEvent
  | ReconcileEvent;

export type ClaimEventType = ClaimEvent['type'];
export type ClaimEventOf<T extends ClaimEventType> = Extract<ClaimEvent, { type: T }>;

export const CLAIM_EVENT_TYPES = [
  'SUBMIT',
  'WITHDRAW',
  'TAKE',
  'RELEASE',
  'REQUEST_INFO',
  'RESUBMIT',
  'APPROVE',
  'DENY',
  'APPEAL',
  'SHIP',
  'MARK_FITTED',
  'SUBMIT_AFTER_TEST',
  'ACCEPT_BY_HAND',
  'ISSUE_RETURN_LABEL',
  'REMIND_CORE',
  'CORE_SHIPPED',
  'CORE_RECEIVED',
  'INSPECT',
  'WAIVE_CORE',
  'WRITE_OFF_CORE',
  'ISSUE_CREDIT',
  'RECONCILE',
] as const satisfies readonly ClaimEventType[];

// Fails to compile when an event type is left out of the list above.
type MissingFromList = Exclude<ClaimEventType, (typeof CLAIM_EVENT_TYPES)[number]>;
const everyEventListed: MissingFromList extends never ? true : never = true;
void everyEventListed;

export function isClaimEventType(value: unknown): value is ClaimEventType {
  return typeof value === 'string' && (CLAIM_EVENT_TYPES as readonly string[]).includes(value);
}

// ---- payload validation (zod): messages name the field in words a user can act on ----

export const actorSchema = z.object(
  {
    id: z.string({ error: 'The step has no actor id.' }).refine((s) => s.trim().length > 0, 'The step has an empty actor id.'),
    role: z.enum(ROLES, { error: `The actor role must be one of: ${ROLES.join(', ')}.` }),
  },
  { error: 'The step has no actor.' },
);

export const stepBaseSchema = z.object({
  actor: actorSchema,
  at: z.string({ error: 'The step has no time ("at").' }).pipe(
    z.iso.datetime({ offset: true, error: 'The step time ("at") must be an ISO 8601 timestamp with a time zone.' }),
  ),
});

const text = (what: string) =>
  z.string({ error: `${what} is missing.` }).refine((s) => s.trim().length > 0, `${what} is empty.`);
const optionalText = (what: string) => z.string({ error: `${what} must be text.` }).optional();
const flag = (what: string) => z.boolean({ error: `${what} must be true or false.` });
const oneOf = <T extends readonly [string, ...string[]]>(what: string, values: T) =>
  z.enum(values, { error: `${what} must be one of: ${values.join(', ')}.` });

const lineSchema = z.object(
  {
    lineId: text('A line id ("lineId")'),
    approved: flag('Each line\'s "approved"'),
    changed: flag('Each line\'s "changed"').optional(),
    note: optionalText('A line note'),
  },
  { error: 'Each line must be an object with lineId and approved.' },
);

const payloadSchemas = {
  SUBMIT: z.object({ evidence: evidenceSummarySchema }),
  WITHDRAW: z.object({ note: optionalText('The withdrawal note') }),
  TAKE: z.object({ noOtherRep: flag('"noOtherRep"').optional() }),
  RELEASE: z.object({ note: optionalText('The release note') }),
  REQUEST_INFO: z.object({
    checklist: z
      .array(text('A checklist item'), { error: 'The checklist is missing.' })
      .min(1, 'The checklist needs at least one item the dealer must send.'),
    message: text('The message to the dealer'),
  }),
  RESUBMIT: z.object({ evidence: evidenceSummarySchema, message: optionalText('The message to the rep') }),
  APPROVE: z
    .object({
      extent: oneOf('The approval extent', APPROVAL_EXTENTS),
      lines: z.array(lineSchema, { error: 'The approved lines are missing.' }).min(1, 'An approval needs at least one line.'),
      rmaNumber: text('The RMA number'),
      coreReturnLabelRef: optionalText('The core return label'),
      coreDangerousGoods: flag('"coreDangerousGoods"').optional(),
      nothingToShip: flag('"nothingToShip"').optional(),
    })
    .superRefine((e, ctx) => {
      const seen = new Set<string>();
      e.lines.forEach((line, i) => {
        if (seen.has(line.lineId)) {
          ctx.addIssue({ code: 'custom', path: ['lines', i, 'lineId'], message: `Line "${line.lineId}" appears twice.` });
        }
        seen.add(line.lineId);
      });
      const approved = e.lines.filter((l) => l.approved).length;
      const changed = e.lines.find((l) => l.approved && l.changed === true);
      if (approved === 0) {
        ctx.addIssue({ code: 'custom', path: ['lines'], message: 'An approval must approve at least one line; deny the claim instead.' });
      } else if (e.extent === 'full' && changed) {
        ctx.addIssue({
          code: 'custom',
          path: ['extent'],
          message: `A full approval approves every line as requested; line "${changed.lineId}" was changed, so this is a partial approval.`,
        });
      } else if (e.extent === 'full' && approved < e.lines.length) {
        const first = e.lines.find((l) => !l.approved);
        ctx.addIssue({
          code: 'custom',
          path: ['extent'],
          message: `A full approval must approve every line; line "${first?.lineId}" is not approved.`,
        });
      } else if (e.extent === 'partial' && approved === e.lines.length && !changed) {
        ctx.addIssue({
          code: 'custom',
          path: ['extent'],
          message: 'Every line is approved, so this is a full approval, not a partial one.',
        });
      }
    }),
  DENY: z.object({
    reasonCode: oneOf('The denial reason', DENIAL_REASONS),
    message: text('The message to the dealer'),
    appealOpenUntil: z.string({ error: 'The end of the appeal window ("appealOpenUntil") is missing.' }).pipe(
      z.iso.datetime({ offset: true, error: 'The end of the appeal window ("appealOpenUntil") must be an ISO 8601 timestamp with a time zone.' }),
    ),
  }),
  APPEAL: z.object({ message: text('The appeal message') }),
  SHIP: z.object({ carrier: text('The carrier'), trackingNumber: text('The tracking number') }),
  MARK_FITTED: z.object({ afterTestId: text('The after-test ("afterTestId")'), afterTestPasses: flag('"afterTestPasses"') }),
  SUBMIT_AFTER_TEST: z.object({
    afterTestId: text('The after-test ("afterTestId")'),
    afterTestPasses: flag('"afterTestPasses"'),
  }),
  ACCEPT_BY_HAND: z.object({ reason: text('The reason for accepting the after-test by hand') }),
  ISSUE_RETURN_LABEL: z.object({ labelRef: text('The return label'), dangerousGoods: flag('"dangerousGoods"') }),
  REMIND_CORE: z.object({}),
  CORE_SHIPPED: z.object({ carrier: text('The carrier'), trackingNumber: text('The tracking number') }),
  CORE_RECEIVED: z.object({ condition: oneOf('The core condition', CORE_CONDITIONS), notes: optionalText('The notes') }),
  INSPECT: z
    .object({ result: oneOf('The inspection result', INSPECTION_RESULTS), notes: optionalText('The inspection notes') })
    .refine((e) => e.result === 'fault_confirmed' || (e.notes ?? '').trim().length > 0, {
      message: 'Inspection notes are required when the fault is not confirmed (they justify the chargeback).',
      path: ['notes'],
    }),
  WAIVE_CORE: z.object({
    reason: oneOf('The waiver reason', WAIVER_REASONS),
    proofAttachmentId: text('The proof of disposal ("proofAttachmentId")'),
  }),
  WRITE_OFF_CORE: z.object({}),
  ISSUE_CREDIT: z.object({ memoId: text('The credit memo id ("memoId")') }),
  RECONCILE: z.object({ statementLineRef: text('The statement line reference ("statementLineRef")') }),
} satisfies Record<ClaimEventType, z.ZodType>;

function firstIssue(error: z.ZodError): string {
  const issue = error.issues[0];
  return issue?.message ?? 'The step data is malformed.';
}

/** First problem with the step's actor and time, or null. */
export function stepBaseProblem(event: unknown): string | null {
  if (typeof event !== 'object' || event === null) return 'The step is missing.';
  const parsed = stepBaseSchema.safeParse(event);
  return parsed.success ? null : firstIssue(parsed.error);
}

/** First problem with the step's own data (not actor or time), or null. */
export function payloadProblem(event: ClaimEvent): string | null {
  const parsed = payloadSchemas[event.type].safeParse(event);
  return parsed.success ? null : firstIssue(parsed.error);
}

/** zod schema for one event's own data, for the server's form validation. */
export function payloadSchemaFor<T extends ClaimEventType>(type: T): (typeof payloadSchemas)[T] {
  return payloadSchemas[type];
}
