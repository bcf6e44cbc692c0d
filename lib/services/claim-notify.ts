import 'server-only';
import type { Knex } from 'knex';
import type { Role } from '@/lib/auth/roles';
import type { ClaimRecord } from '@/lib/db/claims';
import { notifyUser } from '@/lib/db/notifications';
import { env } from '@/lib/env';
import { claimUpdateMail } from '@/lib/mail/templates/claim-update';

type Note = { kind: string; title: string; body: string; onlyAssigned?: boolean; exclude?: readonly string[] };

async function recipients(trx: Knex, organisationId: string, roles: readonly Role[]): Promise<{ id: string; email: string; name: string }[]> {
  return trx('users').select('id', 'email', 'name').where({ organisation_id: organisationId }).whereIn('role', roles).whereNull('disabled_at');
}

async function send(trx: Knex, claim: ClaimRecord, people: { id: string; email: string; name: string }[], n: Note) {
  const link = `/claims/${claim.id}`;
  for (const p of people) {
    await notifyUser(trx, {
      userId: p.id, email: p.email, claimId: claim.id, kind: n.kind, title: n.title, body: n.body, link,
      mail: claimUpdateMail({ name: p.name, title: n.title, body: n.body, claimNumber: claim.number, link: `${env().APP_URL}${link}` }),
    });
  }
}

/** Notifies the brand's people in a role (or only the assigned rep, when asked and there is one), leaving out `exclude` when others remain. */
export async function notifyBrandRole(trx: Knex, claim: ClaimRecord, role: Role, n: Note): Promise<void> {
  let people = await recipients(trx, claim.brandId, [role]);
  const assigned = claim.context.assignedRepId;
  if (n.onlyAssigned && role === 'brand_rep' && assigned) people = people.filter((p) => p.id === assigned);
  // Leaving someone out (the rep who denied, for an appeal) never leaves nobody to tell.
  const kept = people.filter((p) => !n.exclude?.includes(p.id));
  await send(trx, claim, kept.length ? kept : people, n);
}

/** Notifies the shop: whoever filed the claim, and the shop's admins. */
export async function notifyDealer(trx: Knex, claim: ClaimRecord, n: Note): Promise<void> {
  const people = await trx('users')
    .select('id', 'email', 'name')
    .where({ organisation_id: claim.dealerId })
    .whereNull('disabled_at')
    .where((w) => w.where({ id: claim.createdBy }).orWhere({ role: 'dealer_admin' }));
  await send(trx, claim, people, n);
}
