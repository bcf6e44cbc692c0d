import 'server-only';
import { db } from '@/db/connection';
import { CarrierUnavailable, carrierClient, carrierName } from '@/lib/carrier';
import { localDate } from '@/lib/calendar';
import { brandHolidays, findPolicy, type PartCategory } from '@/lib/db/catalog';
import { findClaimById, insertEvent } from '@/lib/db/claims';
import { organisationAddress } from '@/lib/db/fulfilment';
import { coresAwaitingReturn, recordTracking, setClaimCoreDueOn, setCoreDueOn, shipmentsToPoll, touchPolled } from '@/lib/db/shipments';
import { coreClock, coreClockAction, type CorePolicy } from '@/lib/fulfilment';
import { applyStep, SYSTEM } from '@/lib/services/claim-steps';
import { notifyBrandRole, notifyDealer } from '@/lib/services/claim-notify';

/** Policy days when a category has no policy row (our own default, common practice, no source). */
const FALLBACK_POLICY: CorePolicy = { returnDays: 15, graceDays: 5 };

async function corePolicyFor(brandId: string, category: string | null): Promise<CorePolicy> {
  const policy = category ? await findPolicy(brandId, category as PartCategory) : null;
  return policy ? { returnDays: policy.coreReturnDays, graceDays: policy.coreGraceDays } : FALLBACK_POLICY;
}

async function brandCalendar(brandId: string) {
  const [org, holidays] = await Promise.all([organisationAddress(brandId), brandHolidays(brandId)]);
  return { timeZone: org?.timeZone ?? 'UTC', calendar: { holidays } };
}

/**
 * Asks the carrier about every parcel on its way, records new tracking events, and acts on a
 * delivery: the replacement's delivery starts the core-return clock (and tells the dealer); a
 * core's delivery tells the warehouse to receive it. One parcel's trouble never stops the rest.
 */
export async function pollTracking(limit = 50): Promise<{ polled: number; delivered: number; failed: number }> {
  const carrier = carrierClient();
  const parcels = await shipmentsToPoll(limit);
  let delivered = 0;
  let failed = 0;
  for (const p of parcels) {
    let report;
    try {
      report = await carrier.track(p.trackingNumber);
    } catch (err) {
      failed++;
      await touchPolled(p.id);
      if (!(err instanceof CarrierUnavailable)) console.error(`[tracking] ${p.trackingNumber}:`, (err as Error).message);
      continue;
    }
    if (!report) {
      await touchPolled(p.id);
      continue;
    }
    const deliveredEvent = report.status === 'delivered' ? report.events.find((e) => e.status === 'delivered') : undefined;
    await db().transaction(async (trx) => {
      await recordTracking(trx, p.id, report.status, report.events, deliveredEvent?.at ?? null);
      if (!deliveredEvent) return;
      const claim = await findClaimById(p.claimId, trx);
      if (!claim) return;
      delivered++;
      await insertEvent(trx, {
        claimId: claim.id, actorId: null, actorRole: 'system', event: p.direction === 'outbound' ? 'REPLACEMENT_DELIVERED' : 'CORE_PARCEL_DELIVERED',
        fromState: claim.stateValue, toState: claim.stateValue,
        payload: { carrier: p.carrier, trackingNumber: p.trackingNumber, deliveredAt: deliveredEvent.at, location: deliveredEvent.location },
      });
      if (p.direction === 'outbound') {
        let dueText = '';
        if (claim.stage === 'approved' && claim.coreStep === 'requested') {
          const { timeZone, calendar } = await brandCalendar(claim.brandId);
          const clock = coreClock({ deliveredAt: deliveredEvent.at, now: new Date(Math.max(Date.now(), Date.parse(deliveredEvent.at))).toISOString(), timeZone, calendar, policy: await corePolicyFor(claim.brandId, claim.partCategory) });
          await setCoreDueOn(trx, p.id, clock.dueDate);
          dueText = ` Please send the failed part back by ${clock.dueDate} (business days of ${claim.brandName}).`;
        }
        await notifyDealer(trx, claim, {
          kind: 'replacement_delivered',
          title: `Replacement for ${claim.number} delivered`,
          body: `${carrierName(p.carrier)} delivered tracking ${p.trackingNumber}.${dueText}`,
        });
      } else {
        await notifyBrandRole(trx, claim, 'warehouse', {
          kind: 'core_delivered',
          title: `Core for ${claim.rmaNumber ?? claim.number} delivered`,
          body: `${carrierName(p.carrier)} delivered the core (tracking ${p.trackingNumber}). Scan the RMA to receive it and record its condition.`,
        });
      }
    });
  }
  return { polled: parcels.length, delivered, failed };
}

/**
 * The core-return clock for every delivered replacement whose core has not been sent back:
 * a reminder once the core is overdue, a write-off (flagged for chargeback) after the grace
 * period. Both go to the dealer through the outbox; the write-off also to accounts and the warehouse.
 */
export async function runCoreClock(now: Date = new Date()): Promise<{ checked: number; reminded: number; writtenOff: number }> {
  let reminded = 0;
  let writtenOff = 0;
  const due = await coresAwaitingReturn();
  for (const row of due) {
    const claim = await findClaimById(row.claimId);
    if (!claim || claim.stage !== 'approved' || claim.coreStep !== 'requested') continue;
    if (new Date(row.deliveredAt).getTime() > now.getTime()) continue;
    const { timeZone, calendar } = await brandCalendar(claim.brandId);
    const clock = coreClock({ deliveredAt: new Date(row.deliveredAt).toISOString(), now: now.toISOString(), timeZone, calendar, policy: await corePolicyFor(claim.brandId, claim.partCategory) });
    if (row.coreDueOn !== clock.dueDate) {
      await db().transaction((trx) => (row.shipmentId ? setCoreDueOn(trx, row.shipmentId, clock.dueDate) : setClaimCoreDueOn(trx, row.claimId, clock.dueDate)));
    }
    const action = coreClockAction(clock, claim.context.core, timeZone);
    try {
      if (action === 'remind') {
        await applyStep(SYSTEM, claim.id, 'REMIND_CORE', {}, {
          expectedVersion: claim.version,
          after: async ({ trx, claim: locked }) => {
            await notifyDealer(trx, locked, {
              kind: 'core_reminder',
              title: `Core for ${locked.number} is overdue`,
              body: `The failed part was due back on ${clock.dueDate} under RMA ${locked.rmaNumber ?? locked.number}. Send it by ${clock.graceEndsDate} or it is written off and charged back. Use the return label on the claim.`,
            });
          },
        });
        reminded++;
      } else if (action === 'write_off') {
        await applyStep(SYSTEM, claim.id, 'WRITE_OFF_CORE', {}, {
          expectedVersion: claim.version,
          logPayload: { dueDate: clock.dueDate, graceEndedOn: clock.graceEndsDate, today: localDate(now.toISOString(), timeZone) },
          after: async ({ trx, claim: locked }) => {
            const n = {
              kind: 'core_written_off',
              title: `Core for ${locked.number} written off`,
              body: `The core was not returned by the end of grace on ${clock.graceEndsDate} (due ${clock.dueDate}). It is flagged for a chargeback on the claim's credit.`,
            };
            await notifyDealer(trx, locked, n);
            await notifyBrandRole(trx, locked, 'accountant', n);
            await notifyBrandRole(trx, locked, 'warehouse', n);
          },
        });
        writtenOff++;
      }
    } catch (err) {
      // A claim that changed meanwhile is looked at again on the next run.
      console.error(`[core clock] ${claim.number}:`, (err as Error).message);
    }
  }
  return { checked: due.length, reminded, writtenOff };
}
