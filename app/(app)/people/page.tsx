import type { Metadata } from 'next';
import { InviteForm } from '@/components/people/invite-form';
import { UserToggle } from '@/components/people/user-toggle';
import { Badge } from '@/components/ui/badge';
import { PageHeader } from '@/components/ui/page-header';
import { invitableRoles, ROLE_DESCRIPTIONS, ROLE_LABELS } from '@/lib/auth/roles';
import { requireRole } from '@/lib/auth/session';
import { pendingInvitations } from '@/lib/db/invitations';
import { listOrganisationUsers } from '@/lib/db/users';

export const metadata: Metadata = { title: 'People' };

export default async function PeoplePage() {
  const admin = await requireRole('dealer_admin', 'brand_admin');
  const [users, invites] = await Promise.all([listOrganisationUsers(admin.organisationId), pendingInvitations(admin.organisationId)]);
  const roles = invitableRoles(admin.role, admin.orgKind).map((r) => ({ value: r, label: ROLE_LABELS[r], description: ROLE_DESCRIPTIONS[r] }));
  return (
    <>
      <PageHeader title="People" lead={`Everyone who works in Loadproof for ${admin.orgName}. Invite a colleague, or switch an account off when someone leaves.`} />
      <div className="grid gap-8 lg:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
        <section className="card self-start overflow-hidden">
          <table className="w-full text-left text-sm">
            <thead className="bg-paper-sunk text-xs uppercase tracking-wide text-ink-muted">
              <tr>
                <th className="px-4 py-2">Name</th>
                <th className="px-4 py-2">Role</th>
                <th className="px-4 py-2">Status</th>
                <th className="px-4 py-2 text-right">Account</th>
              </tr>
            </thead>
            <tbody>
              {users.map((u) => (
                <tr key={u.id} className="border-t border-paper-line" data-testid={`person-${u.email}`}>
                  <td className="px-4 py-3">
                    <p className="font-bold">{u.name}</p>
                    <p className="text-ink-muted">{u.email}</p>
                  </td>
                  <td className="px-4 py-3">{ROLE_LABELS[u.role]}</td>
                  <td className="px-4 py-3">{u.disabledAt ? <Badge tone="fault">Switched off</Badge> : <Badge tone="charge">Active</Badge>}</td>
                  <td className="px-4 py-3 text-right">{u.id === admin.id ? <span className="text-ink-faint">You</span> : <UserToggle userId={u.id} disabled={!!u.disabledAt} name={u.name} />}</td>
                </tr>
              ))}
              {invites.map((i) => (
                <tr key={i.id} className="border-t border-paper-line bg-volt-50/40">
                  <td className="px-4 py-3">
                    <p className="font-bold">{i.name}</p>
                    <p className="text-ink-muted">{i.email}</p>
                  </td>
                  <td className="px-4 py-3">{ROLE_LABELS[i.role]}</td>
                  <td className="px-4 py-3" colSpan={2}>
                    <Badge tone="volt">Invited</Badge>
                    <span className="ml-2 text-xs text-ink-muted">link valid until {i.expiresAt.toISOString().slice(0, 10)}</span>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </section>
        <section className="card self-start p-5">
          <h2 className="mb-4">Invite someone</h2>
          <InviteForm roles={roles} />
        </section>
      </div>
    </>
  );
}
