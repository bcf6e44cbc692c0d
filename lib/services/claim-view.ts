import 'server-only';
import { listAttachments } from '@/lib/db/attachments';
import { findClaimForUser, listEvents } from '@/lib/db/claims';
import type { AppUser } from '@/lib/db/users';
import { NotFoundError } from '@/lib/errors';
import { readinessOf, serialWarnings } from '@/lib/services/claims';
import { coverageForClaim } from '@/lib/services/filing';
import { allowedEvents, describeState, restoreClaim } from '@/machines/claim';

/** Everything the claim page shows, for a party of the claim (anyone else: not found). */
export async function loadClaimView(user: AppUser, id: string) {
  const claim = await findClaimForUser(user, id);
  if (!claim) throw new NotFoundError('No such claim.');
  const [attachments, events, readiness, warnings] = await Promise.all([
    listAttachments(claim.id),
    listEvents(claim.id),
    readinessOf(claim),
    serialWarnings(user, claim),
  ]);
  const coverage = await coverageForClaim(claim, { proofOfPurchase: readiness.evidence.proofOfPurchase });
  const state = describeState(claim.stateValue);
  const allowed = allowedEvents(restoreClaim({ value: claim.stateValue, context: claim.context }), { id: user.id, role: user.role }, { at: new Date().toISOString() });
  return { claim, attachments, events, readiness, warnings, coverage, state, allowed };
}

export type ClaimView = Awaited<ReturnType<typeof loadClaimView>>;
