import 'server-only';
import { createHash, randomBytes } from 'node:crypto';
import bcrypt from 'bcryptjs';
import { db } from '@/db/connection';
import { invitableRoles, isAdminRole, ROLE_LABELS, roleFitsKind } from '@/lib/auth/roles';
import { findInvitationByTokenHash, insertInvitation, pendingInvitationFor, insertInvitedUser, markInvitationAccepted } from '@/lib/db/invitations';
import { queueMail } from '@/lib/db/notifications';
import { emailTaken, setUserDisabled, type AppUser } from '@/lib/db/users';
import { env } from '@/lib/env';
import { ForbiddenError, NotFoundError, ValidationError } from '@/lib/errors';
import { invitationMail } from '@/lib/mail/templates/invitation';
import type { InviteInput } from '@/lib/validation/people';

export const INVITATION_DAYS = 7;

const hashToken = (token: string) => createHash('sha256').update(token).digest('hex');

export async function inviteUser(admin: AppUser, input: InviteInput): Promise<{ invitationId: string }> {
  if (!isAdminRole(admin.role)) throw new ForbiddenError('Only a shop admin or brand admin can invite people.');
  if (!roleFitsKind(input.role, admin.orgKind) || !invitableRoles(admin.role, admin.orgKind).includes(input.role)) {
    throw new ValidationError('That role does not exist in your organisation.', {
      role: [`A ${admin.orgKind === 'dealer' ? 'shop' : 'brand'} can only have: ${invitableRoles(admin.role, admin.orgKind).map((r) => ROLE_LABELS[r]).join(', ')}.`],
    });
  }
  if (await emailTaken(input.email)) {
    throw new ValidationError('Someone already uses that e-mail.', { email: ['This e-mail already has an account.'] });
  }
  if (await pendingInvitationFor(admin.organisationId, input.email)) {
    throw new ValidationError('This person is invited already.', { email: ['An invitation to this e-mail is still open; it stays valid until it expires.'] });
  }
  const token = randomBytes(32).toString('base64url');
  const expiresAt = new Date(Date.now() + INVITATION_DAYS * 24 * 3600 * 1000);
  const invitationId = await db().transaction(async (trx) => {
    const id = await insertInvitation(trx, {
      organisationId: admin.organisationId, orgKind: admin.orgKind, email: input.email, name: input.name, role: input.role,
      tokenHash: hashToken(token), invitedBy: admin.id, expiresAt,
    });
    const link = `${env().APP_URL}/invite/${token}`;
    await queueMail(trx, { to: input.email, ...invitationMail({ name: input.name, orgName: admin.orgName, invitedBy: admin.name, role: input.role, link, days: INVITATION_DAYS }) });
    return id;
  });
  return { invitationId };
}

export type InvitationLookup =
  | { ok: true; name: string; email: string; orgName: string; role: AppUser['role'] }
  | { ok: false; message: string };

export async function lookupInvitation(token: string): Promise<InvitationLookup> {
  const inv = await findInvitationByTokenHash(hashToken(token));
  if (!inv) return { ok: false, message: 'This invitation link is not valid. Ask your admin to send a new one.' };
  if (inv.acceptedAt) return { ok: false, message: 'This invitation has been used already. Sign in with the password you chose.' };
  if (inv.expiresAt <= new Date()) return { ok: false, message: 'This invitation has expired. Ask your admin to send a new one.' };
  return { ok: true, name: inv.name, email: inv.email, orgName: inv.orgName, role: inv.role };
}

/** Creates the account; the row lock makes a link used twice at once still create one user. */
export async function acceptInvitation(token: string, password: string): Promise<{ email: string }> {
  const passwordHash = await bcrypt.hash(password, 10);
  return db().transaction(async (trx) => {
    const inv = await findInvitationByTokenHash(hashToken(token), trx, true);
    if (!inv) throw new NotFoundError('This invitation link is not valid. Ask your admin to send a new one.');
    if (inv.acceptedAt) throw new ValidationError('This invitation has been used already. Sign in with the password you chose.');
    if (inv.expiresAt <= new Date()) throw new ValidationError('This invitation has expired. Ask your admin to send a new one.');
    if (await emailTaken(inv.email, trx)) throw new ValidationError('This e-mail already has an account. Sign in instead.');
    const userId = await insertInvitedUser(trx, inv, passwordHash);
    await markInvitationAccepted(trx, inv.id, userId);
    return { email: inv.email };
  });
}

export async function setDisabled(admin: AppUser, userId: string, disabled: boolean): Promise<void> {
  if (!isAdminRole(admin.role)) throw new ForbiddenError('Only an admin can switch accounts on or off.');
  if (userId === admin.id && disabled) throw new ValidationError('You cannot switch off your own account.');
  const changed = await setUserDisabled(admin.organisationId, userId, disabled);
  if (!changed) throw new NotFoundError('No such person in your organisation.');
}
