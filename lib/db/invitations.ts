import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/connection';
import type { OrgKind, Role } from '@/lib/auth/roles';

export type Invitation = {
  id: string;
  organisationId: string;
  orgKind: OrgKind;
  orgName: string;
  email: string;
  name: string;
  role: Role;
  expiresAt: Date;
  acceptedAt: Date | null;
};

const columns = [
  'i.id', 'i.organisation_id as organisationId', 'i.org_kind as orgKind', 'o.name as orgName', 'i.email', 'i.name',
  'i.role', 'i.expires_at as expiresAt', 'i.accepted_at as acceptedAt',
];

export async function insertInvitation(
  trx: Knex,
  row: { organisationId: string; orgKind: OrgKind; email: string; name: string; role: Role; tokenHash: string; invitedBy: string; expiresAt: Date },
): Promise<string> {
  const [r] = await trx('invitations')
    .insert({
      organisation_id: row.organisationId, org_kind: row.orgKind, email: row.email, name: row.name, role: row.role,
      token_hash: row.tokenHash, invited_by: row.invitedBy, expires_at: row.expiresAt,
    })
    .returning('id');
  return r.id;
}

export async function findInvitationByTokenHash(tokenHash: string, trx: Knex = db(), forUpdate = false): Promise<Invitation | null> {
  const q = trx('invitations as i').join('organisations as o', 'o.id', 'i.organisation_id').select(columns).where('i.token_hash', tokenHash);
  if (forUpdate) q.forUpdate('i');
  return (await q.first()) ?? null;
}

export async function markInvitationAccepted(trx: Knex, id: string, userId: string): Promise<void> {
  await trx('invitations').where({ id }).update({ accepted_at: trx.fn.now(), accepted_user_id: userId });
}

export async function pendingInvitationFor(organisationId: string, email: string): Promise<boolean> {
  return !!(await db()('invitations')
    .where({ organisation_id: organisationId })
    .whereRaw('lower(email) = lower(?)', [email])
    .whereNull('accepted_at')
    .where('expires_at', '>', db().fn.now())
    .first('id'));
}

export async function pendingInvitations(organisationId: string) {
  return db()('invitations as i')
    .join('organisations as o', 'o.id', 'i.organisation_id')
    .select(columns)
    .where('i.organisation_id', organisationId)
    .whereNull('i.accepted_at')
    .where('i.expires_at', '>', db().fn.now())
    .orderBy('i.created_at', 'desc') as Promise<Invitation[]>;
}

export async function insertInvitedUser(
  trx: Knex,
  inv: Invitation,
  passwordHash: string,
): Promise<string> {
  const [r] = await trx('users')
    .insert({ organisation_id: inv.organisationId, org_kind: inv.orgKind, email: inv.email, name: inv.name, role: inv.role, password_hash: passwordHash })
    .returning('id');
  return r.id;
}
