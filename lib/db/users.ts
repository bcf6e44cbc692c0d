import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/connection';
import type { OrgKind, Role } from '@/lib/auth/roles';

export type AppUser = {
  id: string;
  email: string;
  name: string;
  role: Role;
  organisationId: string;
  orgKind: OrgKind;
  orgName: string;
  units: 'metric' | 'imperial';
  timeZone: string;
};

export type UserListing = AppUser & { disabledAt: Date | null; createdAt: Date; hasPassword: boolean };

const columns = [
  'u.id', 'u.email', 'u.name', 'u.role', 'u.organisation_id as organisationId', 'u.org_kind as orgKind',
  'o.name as orgName', 'u.units', 'u.time_zone as timeZone',
];

function base(q: Knex = db()) {
  return q('users as u').join('organisations as o', 'o.id', 'u.organisation_id');
}

export async function findActiveUser(id: string): Promise<AppUser | null> {
  const row = await base().select(columns).where('u.id', id).whereNull('u.disabled_at').first();
  return row ?? null;
}

/** For sign-in only: the one place the password hash leaves the database. */
export async function findUserForSignIn(email: string) {
  const row = await base()
    .select([...columns, 'u.password_hash as passwordHash', 'u.disabled_at as disabledAt'])
    .whereRaw('lower(u.email) = lower(?)', [email])
    .first();
  return (row ?? null) as (AppUser & { passwordHash: string | null; disabledAt: Date | null }) | null;
}

export async function emailTaken(email: string, q: Knex = db()): Promise<boolean> {
  return !!(await q('users').whereRaw('lower(email) = lower(?)', [email]).first('id'));
}

export async function listOrganisationUsers(organisationId: string): Promise<UserListing[]> {
  return base()
    .select([...columns, 'u.disabled_at as disabledAt', 'u.created_at as createdAt', db().raw('(u.password_hash IS NOT NULL) as "hasPassword"')])
    .where('u.organisation_id', organisationId)
    .orderBy([{ column: 'u.disabled_at', order: 'desc', nulls: 'first' }, { column: 'u.name' }]);
}

/** Scoped to the admin's organisation: another organisation's user is "not found". */
export async function setUserDisabled(organisationId: string, userId: string, disabled: boolean): Promise<boolean> {
  const n = await db()('users')
    .where({ id: userId, organisation_id: organisationId })
    .update({ disabled_at: disabled ? db().fn.now() : null, updated_at: db().fn.now() });
  return n === 1;
}

export async function setUserUnits(userId: string, units: 'metric' | 'imperial'): Promise<void> {
  await db()('users').where({ id: userId }).update({ units, updated_at: db().fn.now() });
}

export async function usersWithRole(organisationId: string, role: Role): Promise<{ id: string; email: string; name: string }[]> {
  return db()('users')
    .select('id', 'email', 'name')
    .where({ organisation_id: organisationId, role })
    .whereNull('disabled_at')
    .orderBy('name');
}


/** E-mails of an organisation's users and of the people it invited (lower-cased). */
export async function organisationEmails(organisationId: string): Promise<Set<string>> {
  const rows = await db()
    .select(db().raw('lower(email) as email'))
    .from('users')
    .where({ organisation_id: organisationId })
    .union((q) =>
      q
        .select(db().raw('lower(i.email)'))
        .from('invitations as i')
        .where({ 'i.organisation_id': organisationId })
        // An address invited once but now someone's account elsewhere is no longer ours to read.
        .whereNotExists((w) => w.select(db().raw('1')).from('users as u').whereRaw('lower(u.email) = lower(i.email)').whereNot('u.organisation_id', organisationId)),
    );
  return new Set(rows.map((r: { email: string }) => r.email));
}
