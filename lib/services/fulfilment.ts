import 'server-only';
import { randomUUID } from 'node:crypto';
import {
  CARRIERS,
  CarrierRefusal,
  CarrierUnavailable,
  carrierClient,
  carrierName,
  checkTrackingNumber,
  findService,
  type PostalAddress,
} from '@/lib/carrier';
import { listAttachments } from '@/lib/db/attachments';
import { findPart, type Part } from '@/lib/db/catalog';
import { findClaimForUser, type ClaimRecord } from '@/lib/db/claims';
import { organisationAddress, type OrgAddress } from '@/lib/db/fulfilment';
import { insertShipment, isBookingRecorded, liveShipment, markReturnHandedOver, markReturnReceived, voidShipment, type ShipmentLine } from '@/lib/db/shipments';
import { stockLevelsFor, takeStock } from '@/lib/db/stock';
import type { AppUser } from '@/lib/db/users';
import { AppError, ConflictError, ForbiddenError, NotFoundError, ValidationError } from '@/lib/errors';
import {
  approvedPartLines,
  chosenServiceProblem,
  classifyPart,
  declarationOf,
  lineAvailability,
  linesToShip,
  pickProblem,
  quantitiesByPart,
  shortageProblem,
  storedClass,
  type PartLine,
  type StoredBatteryClass,
} from '@/lib/fulfilment';
import { applyStep, type StepOutcome } from '@/lib/services/claim-steps';
import { notifyBrandRole, notifyDealer } from '@/lib/services/claim-notify';
import { deleteObject, putObject } from '@/lib/storage/s3';
import type { LithiumClassification } from '@/lib/shipping';
import {
  coreReceivedSchema,
  coreShippedSchema,
  inspectSchema,
  returnLabelSchema,
  shipSchema,
  waiveCoreSchema,
} from '@/lib/validation/fulfilment';
import { CORE_CONDITION_LABELS, describeState, EVENT_RULES, INSPECTION_RESULT_LABELS, stepClaim, WAIVER_REASON_LABELS, type ClaimEventType } from '@/machines/claim';

export type FulfilmentOutcome = StepOutcome & { shipmentId?: string };

function currentOf(claim: ClaimRecord) {
  const d = describeState(claim.stateValue);
  return { state: claim.stateValue, stage: d.stage, label: d.label, version: claim.version };
}

/**
 * Asks the machine before any outside work (a carrier booking, a label): a step it would refuse is
 * refused here with its own words, and nothing is booked. applyStep asks again under the row lock.
 */
function assertStepPossible(user: AppUser, claim: ClaimRecord, type: ClaimEventType, payload: Record<string, unknown>, version?: number) {
  const event = { ...payload, type, actor: { id: user.id, role: user.role }, at: new Date().toISOString() };
  const result = stepClaim({ value: claim.stateValue, context: claim.context }, event as never);
  if (!result.ok) {
    if (!(EVENT_RULES[type].roles as readonly string[]).includes(user.role)) throw new ForbiddenError(result.refusal);
    throw new ConflictError(result.refusal, currentOf(claim));
  }
  if (version !== undefined && version !== claim.version) {
    throw new ConflictError('This claim changed since you opened it. Here is where it stands now; nothing was changed.', currentOf(claim));
  }
}

async function claimFor(user: AppUser, claimId: string): Promise<ClaimRecord> {
  const claim = await findClaimForUser(user, claimId);
  if (!claim) throw new NotFoundError('No such claim.');
  return claim;
}

function postal(a: OrgAddress): PostalAddress {
  return { name: a.name, line: a.line, city: a.city, postcode: a.postcode, country: a.country };
}

async function addresses(claim: ClaimRecord) {
  const [brand, dealer] = await Promise.all([organisationAddress(claim.brandId), organisationAddress(claim.dealerId)]);
  if (!brand || !dealer) throw new Error(`claim ${claim.id}: brand or dealer address missing`);
  return { brand, dealer };
}

export function partLinesOf(claim: ClaimRecord): PartLine[] {
  return approvedPartLines(claim.approvedLines, claim.requestedLines, claim.context.approvedLines);
}

/** The carrier's answer in our error types: a refusal is the user's to fix (422), an outage is ours (503). */
function carrierError(err: unknown): never {
  if (err instanceof CarrierRefusal) throw new ValidationError(`The carrier refused: ${err.message} Nothing was shipped.`, { carrier: [err.message] });
  if (err instanceof CarrierUnavailable) throw new AppError(`${err.message} Nothing was shipped; try again in a moment.`, 503);
  throw err;
}

/** Books with the carrier and stores its label; on any later failure `undo` releases both. */
async function book(
  claim: ClaimRecord,
  req: Parameters<ReturnType<typeof carrierClient>['createShipment']>[0],
): Promise<{ id: string; trackingNumber: string; labelKey: string | null; undo: () => Promise<void> }> {
  const carrier = carrierClient();
  let booked: Awaited<ReturnType<typeof carrier.createShipment>>;
  try {
    booked = await carrier.createShipment(req);
  } catch (err) {
    carrierError(err);
  }
  let labelKey: string | null = null;
  const undo = async (opts: { keepBooking?: boolean } = {}) => {
    if (labelKey) await deleteObject(labelKey).catch(() => {});
    if (!opts.keepBooking) await carrier.cancelShipment(booked.id).catch(() => {});
  };
  if (booked.hasLabel) {
    try {
      const pdf = await carrier.label(booked.id);
      labelKey = `shipments/${claim.id}/${randomUUID()}-label.pdf`;
      await putObject(labelKey, pdf, 'application/pdf');
    } catch (err) {
      await undo();
      carrierError(err);
    }
  }
  return {
    id: booked.id,
    trackingNumber: booked.trackingNumber,
    labelKey,
    // A repeated request gets the same booking back from the carrier (same idempotency key):
    // when another request already recorded it, cancelling would void the parcel that did ship.
    undo: async () => {
      const recorded = await isBookingRecorded(claim.id, booked.id);
      await undo({ keepBooking: recorded });
    },
  };
}

function uniqueViolation(err: unknown, constraint?: string): boolean {
  const e = err as { code?: string; constraint?: string };
  return e.code === '23505' && (constraint === undefined || e.constraint === constraint);
}

function trackingTaken(err: unknown, trackingNumber: string, claim: ClaimRecord): void {
  if (uniqueViolation(err, 'shipments_tracking_unique')) {
    throw new ConflictError(`Tracking number ${trackingNumber} is already on another parcel; check the label. Nothing was changed.`, currentOf(claim));
  }
}

// ---------------------------------------------------------------- SHIP

type PreparedParcel = {
  toShip: PartLine[];
  parts: Map<string, Part>;
  batteries: { line: PartLine; classification: LithiumClassification }[];
};

async function prepareOutbound(claim: ClaimRecord, carrier: string, service: string): Promise<PreparedParcel> {
  const toShip = linesToShip(partLinesOf(claim));
  const parts = new Map<string, Part>();
  for (const l of toShip) {
    const p = await findPart(claim.brandId, l.partId);
    if (!p) throw new Error(`claim ${claim.id}: part ${l.partId} is not in the brand's catalog`);
    parts.set(l.partId, p);
  }
  const transport = findService(carrier, service)?.transport ?? 'ground';
  const batteries = toShip.flatMap((line) => {
    const c = classifyPart(parts.get(line.partId)!, { direction: 'outbound', condition: 'sound', transport });
    return c ? [{ line, classification: c }] : [];
  });
  return { toShip, parts, batteries };
}

export async function shipReplacement(user: AppUser, claimId: string, body: unknown): Promise<FulfilmentOutcome> {
  const input = shipSchema.parse(body);
  const claim = await claimFor(user, claimId);
  assertStepPossible(user, claim, 'SHIP', { carrier: input.carrier, trackingNumber: 'to be booked' }, input.version);

  const service = findService(input.carrier, input.service);
  if (!service) throw new ValidationError(`${CARRIERS[input.carrier].name} has no such service.`, { service: ['Choose one of the carrier’s services.'] });
  const parcel = await prepareOutbound(claim, input.carrier, input.service);
  const pick = pickProblem(parcel.toShip, input.pickedLineIds);
  if (pick) throw new ValidationError(pick, { pickedLineIds: [pick] });
  const serviceRefusal = chosenServiceProblem(input.carrier, input.service, parcel.batteries.map((b) => b.classification));
  if (serviceRefusal) throw new ValidationError(serviceRefusal, { service: [serviceRefusal] });

  let manualNumber: string | undefined;
  if (input.tracking === 'manual') {
    const check = checkTrackingNumber(input.carrier, input.trackingNumber ?? '');
    if (!check.ok) throw new ValidationError(check.message, { trackingNumber: [check.message] });
    manualNumber = check.canonical;
  }

  const shortage = shortageProblem(lineAvailability(parcel.toShip, await stockLevelsFor(claim.brandId, parcel.toShip.map((l) => l.partId))));
  if (shortage) throw new ConflictError(shortage, currentOf(claim));

  const { brand, dealer } = await addresses(claim);
  const booked = await book(claim, {
    carrier: input.carrier,
    service: input.service,
    reference: claim.rmaNumber ?? claim.number,
    shipFrom: postal(brand),
    shipTo: postal(dealer),
    parcels: [{ weightKg: totalWeight(parcel), description: parcel.toShip.map((l) => `${l.quantity} x ${l.partNumber}`).join(', ') }],
    dangerousGoods: parcel.batteries.map((b) => declarationOf(b.line.partNumber, b.classification, false)),
    trackingNumber: manualNumber,
    handover: 'collection',
    // What is booked is part of the key: two different requests at one version are two bookings, never one shared.
    idempotencyKey: `ship:${claim.id}:${claim.version}:${input.carrier}:${input.service}:${manualNumber ?? ''}:${parcel.toShip.map((l) => `${l.lineId}x${l.quantity}`).join(',')}`,
  });

  const lines: ShipmentLine[] = parcel.toShip.map((l) => ({ lineId: l.lineId, partId: l.partId, partNumber: l.partNumber, name: l.name, quantity: l.quantity }));
  const dg = parcel.batteries.map((b) => storedClass(b.line.partNumber, b.line.quantity, b.classification));
  let shipmentId = '';
  try {
    const outcome = await applyStep(
      user,
      claim.id,
      'SHIP',
      { carrier: input.carrier, trackingNumber: booked.trackingNumber, service: input.service, lines: lines.map((l) => `${l.quantity} × ${l.partNumber}`) },
      {
        expectedVersion: input.version,
        after: async ({ trx, claim: locked }) => {
          // Parts in a fixed order, so two shipments never wait on each other's rows (no deadlock).
          const need = [...quantitiesByPart(parcel.toShip).entries()].sort(([a], [b]) => a.localeCompare(b));
          for (const [partId, { partNumber, quantity }] of need) {
            const left = await takeStock(trx, { brandId: locked.brandId, partId, quantity, claimId: locked.id, userId: user.id, reason: `shipped under ${locked.rmaNumber ?? locked.number}` });
            if (left === null) {
              throw new ConflictError(`Not enough stock to ship: ${partNumber} ran out while you were shipping (another parcel took it). Nothing was shipped; the line stays back-ordered.`, currentOf(locked));
            }
          }
          try {
            shipmentId = await insertShipment(trx, {
              claimId: locked.id, brandId: locked.brandId, direction: 'outbound', carrier: input.carrier, service: input.service,
              transport: service.transport, trackingNumber: booked.trackingNumber, carrierShipmentId: booked.id, labelKey: booked.labelKey,
              lines, dangerousGoods: dg.length ? dg : null, batteryCondition: dg.length ? 'sound' : null, packagingConfirmedBy: null,
              handedOverAt: 'now', createdBy: user.id,
            });
          } catch (err) {
            trackingTaken(err, booked.trackingNumber, locked);
            if (uniqueViolation(err)) throw new ConflictError('This replacement has already been shipped; nothing was changed.', currentOf(locked));
            throw err;
          }
          await notifyDealer(trx, locked, {
            kind: 'replacement_shipped',
            title: `Replacement for ${locked.number} shipped`,
            body: `${lines.map((l) => `${l.quantity} × ${l.partNumber}`).join(', ')} left ${locked.brandName} with ${carrierName(input.carrier)} (${service.name}), tracking ${booked.trackingNumber}. You will see it in transit and delivered on the claim.${dg.length ? ' A lithium battery is in the parcel: see the cautions on the claim before opening it.' : ''}`,
          });
        },
      },
    );
    return { ...outcome, shipmentId };
  } catch (err) {
    await booked.undo();
    throw err;
  }
}

function totalWeight(p: PreparedParcel): number {
  let kg = 0;
  for (const l of p.toShip) kg += (p.parts.get(l.partId)?.weightKg ?? 1) * l.quantity;
  return Math.round(kg * 100) / 100 || 1;
}

// ---------------------------------------------------------------- ISSUE_RETURN_LABEL

export async function corePart(claim: ClaimRecord): Promise<Part | null> {
  return claim.partId ? findPart(claim.brandId, claim.partId) : null;
}

export async function issueReturnLabel(user: AppUser, claimId: string, body: unknown): Promise<FulfilmentOutcome> {
  const input = returnLabelSchema.parse(body);
  const claim = await claimFor(user, claimId);
  assertStepPossible(user, claim, 'ISSUE_RETURN_LABEL', { labelRef: 'to be booked', dangerousGoods: false }, input.version);

  const service = findService(input.carrier, input.service);
  if (!service) throw new ValidationError(`${CARRIERS[input.carrier].name} has no such service.`, { service: ['Choose one of the carrier’s services.'] });
  const part = await corePart(claim);
  let classification: LithiumClassification | null = null;
  if (part?.category === 'battery') {
    if (!input.batteryCondition) {
      throw new ValidationError('Say whether the battery core is sound or damaged: the label and the packing depend on it.', { batteryCondition: ['Choose sound or damaged or defective.'] });
    }
    classification = classifyPart(part, { direction: 'return', condition: input.batteryCondition, transport: service.transport });
    if (classification?.specialPackagingRequired && input.packagingConfirmed !== true) {
      const m = 'A damaged or defective battery needs its special packaging confirmed before a label is issued (49 CFR 173.185(f)): tick the confirmation once the packing steps are agreed.';
      throw new ValidationError(m, { packagingConfirmed: [m] });
    }
    const refusal = chosenServiceProblem(input.carrier, input.service, classification ? [classification] : []);
    if (refusal) throw new ValidationError(refusal, { service: [refusal] });
  }

  const previous = await liveShipment(claim.id, 'return');
  const { brand, dealer } = await addresses(claim);
  const booked = await book(claim, {
    carrier: input.carrier,
    service: input.service,
    reference: claim.rmaNumber ?? claim.number,
    shipFrom: postal(dealer),
    shipTo: postal(brand),
    parcels: [{ weightKg: part?.weightKg ?? 1, description: `Core ${part?.partNumber ?? ''} ${claim.partSerial}`.trim() }],
    dangerousGoods: classification ? [declarationOf(part!.partNumber, classification, input.packagingConfirmed === true)] : [],
    handover: 'drop_off',
    idempotencyKey: `label:${claim.id}:${claim.version}:${input.carrier}:${input.service}:${input.packagingConfirmed === true ? 'packed' : 'plain'}`,
  });

  const dg: StoredBatteryClass[] | null = classification && part ? [storedClass(part.partNumber, 1, classification)] : null;
  let shipmentId = '';
  try {
    const outcome = await applyStep(
      user,
      claim.id,
      'ISSUE_RETURN_LABEL',
      { labelRef: booked.trackingNumber, dangerousGoods: classification !== null, carrier: input.carrier, service: input.service, batteryCondition: input.batteryCondition ?? null },
      {
        expectedVersion: input.version,
        after: async ({ trx, claim: locked }) => {
          if (previous) await voidShipment(trx, previous.id);
          try {
            shipmentId = await insertShipment(trx, {
              claimId: locked.id, brandId: locked.brandId, direction: 'return', carrier: input.carrier, service: input.service,
              transport: service.transport, trackingNumber: booked.trackingNumber, carrierShipmentId: booked.id, labelKey: booked.labelKey,
              lines: part ? [{ lineId: 'core', partId: part.id, partNumber: part.partNumber, name: part.name, quantity: 1 }] : [],
              dangerousGoods: dg, batteryCondition: classification ? (input.batteryCondition ?? null) : null,
              packagingConfirmedBy: classification?.specialPackagingRequired ? user.id : null, handedOverAt: null, createdBy: user.id,
            });
          } catch (err) {
            trackingTaken(err, booked.trackingNumber, locked);
            if (uniqueViolation(err)) throw new ConflictError('A return label was issued at the same moment; nothing was changed.', currentOf(locked));
            throw err;
          }
          await notifyDealer(trx, locked, {
            kind: 'core_return_label',
            title: `Return label ready for the core of ${locked.number}`,
            body: returnInstructions(locked, part, carrierName(input.carrier), service.name, booked.trackingNumber, classification),
          });
        },
      },
    );
    // The old label is void: release it at the carrier (best effort; an unused label costs nothing).
    if (previous?.carrierShipmentId) await carrierClient().cancelShipment(previous.carrierShipmentId).catch(() => {});
    return { ...outcome, shipmentId };
  } catch (err) {
    await booked.undo();
    throw err;
  }
}

export function returnInstructions(
  claim: Pick<ClaimRecord, 'rmaNumber' | 'number' | 'partSerial'>,
  part: Pick<Part, 'partNumber' | 'name'> | null,
  carrier: string,
  service: string,
  tracking: string,
  c: LithiumClassification | null,
): string {
  const what = part ? `${part.partNumber} ${part.name}` : 'the failed part';
  const base = `Send ${what}${claim.partSerial ? ` (serial ${claim.partSerial})` : ''} back under RMA ${claim.rmaNumber ?? claim.number} with the prepaid ${carrier} label (${service}, tracking ${tracking}). Print the label from the claim, put a copy of the packing slip in the box, hand it in, then mark the core shipped on the claim.`;
  if (!c) return base;
  if (c.specialPackagingRequired) {
    return `${base} It is a damaged or defective lithium battery (${c.unNumber}, ${c.watthours} Wh): pack it exactly as the packing steps on the claim say, ground transport only. If it is hot, swollen, smoking or leaking, do not ship it: isolate it and contact us.`;
  }
  return `${base} It is a lithium battery (${c.unNumber}, ${c.watthours} Wh): cover the terminals, use non-conductive packaging with cushioning, and follow the marks shown on the claim.`;
}

// ---------------------------------------------------------------- CORE_SHIPPED (dealer)

export async function markCoreShipped(user: AppUser, claimId: string, body: unknown): Promise<FulfilmentOutcome> {
  const input = coreShippedSchema.parse(body);
  const claim = await claimFor(user, claimId);
  assertStepPossible(user, claim, 'CORE_SHIPPED', { carrier: input.carrier, trackingNumber: input.trackingNumber }, input.version);

  const check = checkTrackingNumber(input.carrier, input.trackingNumber);
  if (!check.ok) throw new ValidationError(check.message, { trackingNumber: [check.message] });
  const label = await liveShipment(claim.id, 'return');
  const part = await corePart(claim);
  const battery = part?.category === 'battery';
  if (battery) {
    if (!label) {
      const m = 'A battery core travels only on the return label the brand issues, which carries its dangerous-goods details. Wait for the label on this claim; do not send it on your own label.';
      throw new ValidationError(m, { trackingNumber: [m] });
    }
    if (label.carrier !== input.carrier || label.trackingNumber !== check.canonical) {
      const m = `Ship the battery on the brand’s return label: ${carrierName(label.carrier)} ${label.trackingNumber}.`;
      throw new ValidationError(m, { trackingNumber: [m] });
    }
    if (input.packedAsInstructed !== true) {
      const m = label.batteryCondition === 'damaged_or_defective'
        ? 'Confirm the damaged battery is packed as the packing steps say (its own non-metallic inner packaging, cushioning, rigid box, the DAMAGED/DEFECTIVE mark) before you mark it shipped.'
        : 'Confirm the battery is packed as instructed (terminals covered, non-conductive packaging with cushioning, the marks shown) before you mark it shipped.';
      throw new ValidationError(m, { packedAsInstructed: [m] });
    }
  }

  return applyStep(user, claim.id, 'CORE_SHIPPED', { carrier: input.carrier, trackingNumber: check.canonical, onReturnLabel: !!label && label.trackingNumber === check.canonical }, {
    expectedVersion: input.version,
    after: async ({ trx, claim: locked }) => {
      if (label) {
        await markReturnHandedOver(trx, label.id, { carrier: input.carrier, trackingNumber: check.canonical });
      } else {
        try {
          await insertShipment(trx, {
            claimId: locked.id, brandId: locked.brandId, direction: 'return', carrier: input.carrier, service: 'booked_by_dealer',
            transport: 'ground', trackingNumber: check.canonical, carrierShipmentId: null, labelKey: null,
            lines: part ? [{ lineId: 'core', partId: part.id, partNumber: part.partNumber, name: part.name, quantity: 1 }] : [],
            dangerousGoods: null, batteryCondition: null, packagingConfirmedBy: null, handedOverAt: 'now', createdBy: user.id,
          });
        } catch (err) {
          trackingTaken(err, check.canonical, locked);
          if (uniqueViolation(err)) throw new ConflictError('The core was marked shipped at the same moment; nothing was changed.', currentOf(locked));
          throw err;
        }
      }
      await notifyBrandRole(trx, locked, 'warehouse', {
        kind: 'core_shipped',
        title: `Core for ${locked.rmaNumber ?? locked.number} on its way`,
        body: `${locked.dealerName} sent the core with ${carrierName(input.carrier)}, tracking ${check.canonical}.${battery ? ` Lithium battery${label?.batteryCondition === 'damaged_or_defective' ? ', declared damaged or defective: unpack it in the battery area' : ''}.` : ''}`,
      });
    },
  });
}

// ---------------------------------------------------------------- CORE_RECEIVED, INSPECT (warehouse)

export async function receiveCore(user: AppUser, claimId: string, body: unknown): Promise<FulfilmentOutcome> {
  const input = coreReceivedSchema.parse(body);
  const claim = await claimFor(user, claimId);
  const payload = { condition: input.condition, ...(input.notes ? { notes: input.notes } : {}) };
  assertStepPossible(user, claim, 'CORE_RECEIVED', payload, input.version);
  return applyStep(user, claim.id, 'CORE_RECEIVED', payload, {
    expectedVersion: input.version,
    after: async ({ trx, claim: locked }) => {
      await markReturnReceived(trx, locked.id);
      await notifyDealer(trx, locked, {
        kind: 'core_received',
        title: `Core for ${locked.number} received`,
        body: `${locked.brandName} received the core (${CORE_CONDITION_LABELS[input.condition].toLowerCase()}). The inspection result follows.`,
      });
    },
  });
}

export async function inspectCore(user: AppUser, claimId: string, body: unknown): Promise<FulfilmentOutcome> {
  const input = inspectSchema.parse(body);
  const claim = await claimFor(user, claimId);
  const payload = { result: input.result, ...(input.notes ? { notes: input.notes } : {}) };
  assertStepPossible(user, claim, 'INSPECT', payload, input.version);
  const photos = (await listAttachments(claim.id)).filter((a) => a.kind === 'inspection_photo');
  if (!photos.length) {
    const m = 'Add at least one inspection photo before recording the result: it is the proof behind the credit or the chargeback.';
    throw new ValidationError(m, { photos: [m] });
  }
  return applyStep(user, claim.id, 'INSPECT', { ...payload, photoAttachmentIds: photos.map((p) => p.id) }, {
    expectedVersion: input.version,
    after: async ({ trx, claim: locked }) => {
      const label = INSPECTION_RESULT_LABELS[input.result];
      const chargeback = input.result === 'fault_confirmed' ? '' : ' This leads to a chargeback on the credit; the notes and photos are on the claim.';
      const n = { kind: 'core_inspected', title: `Core of ${locked.number} inspected: ${label.toLowerCase()}`, body: `${label}.${input.notes ? ` ${input.notes}` : ''}${chargeback}` };
      await notifyDealer(trx, locked, n);
      await notifyBrandRole(trx, locked, 'brand_rep', { ...n, onlyAssigned: true });
      await notifyBrandRole(trx, locked, 'accountant', n);
    },
  });
}

// ---------------------------------------------------------------- WAIVE_CORE (rep)

export async function waiveCore(user: AppUser, claimId: string, body: unknown): Promise<FulfilmentOutcome> {
  const input = waiveCoreSchema.parse(body);
  const claim = await claimFor(user, claimId);
  assertStepPossible(user, claim, 'WAIVE_CORE', { reason: input.reason, proofAttachmentId: input.proofAttachmentId }, input.version);
  const proof = (await listAttachments(claim.id)).find((a) => a.id === input.proofAttachmentId);
  if (!proof || proof.kind !== 'core_disposal_proof') {
    const m = 'Choose a photo of the disposal added to this claim as proof of local recycling or scrapping.';
    throw new ValidationError(m, { proofAttachmentId: [m] });
  }
  const label = await liveShipment(claim.id, 'return');
  const outcome = await applyStep(user, claim.id, 'WAIVE_CORE', { reason: input.reason, proofAttachmentId: proof.id }, {
    expectedVersion: input.version,
    after: async ({ trx, claim: locked }) => {
      if (label) await voidShipment(trx, label.id);
      const n = {
        kind: 'core_waived',
        title: `Core return waived for ${locked.number}`,
        body: `${WAIVER_REASON_LABELS[input.reason]}: the core does not need to come back.${label ? ' The return label is cancelled.' : ''}`,
      };
      await notifyDealer(trx, locked, n);
      await notifyBrandRole(trx, locked, 'warehouse', n);
    },
  });
  if (label?.carrierShipmentId) await carrierClient().cancelShipment(label.carrierShipmentId).catch(() => {});
  return outcome;
}
