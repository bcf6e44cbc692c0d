import Link from 'next/link';
import { NavLinks } from '@/components/shell/nav-links';
import { SignOutButton } from '@/components/shell/sign-out-button';
import { UnitsSwitch } from '@/components/shell/units-switch';
import { Wordmark } from '@/components/shell/wordmark';
import { HOME_PATH, isAdminRole, navFor, ROLE_LABELS } from '@/lib/auth/roles';
import { requireUser } from '@/lib/auth/session';
import { unreadNotificationCount } from '@/lib/db/notifications';
import { env } from '@/lib/env';

export default async function AppLayout({ children }: { children: React.ReactNode }) {
  const user = await requireUser();
  const unread = await unreadNotificationCount(user.id);
  const items = navFor(user.role);
  if (isAdminRole(user.role) && env().LOADPROOF_LOCAL && env().LOCAL_MAILBOX_URL) items.push({ href: '/mailbox', label: 'Mailbox' });
  return (
    <div className="min-h-screen">
      <header className="bg-ink text-paper print:hidden">
        <div className="mx-auto flex max-w-7xl flex-wrap items-center gap-x-6 gap-y-2 px-4 py-3">
          <Link href={HOME_PATH[user.role]} aria-label="Loadproof home">
            <Wordmark inverted />
          </Link>
          <NavLinks items={items} />
          <div className="ml-auto flex items-center gap-3">
            <UnitsSwitch units={user.units} />
            <Link href="/notifications" className="relative rounded-md px-3 py-2 text-sm text-paper/80 hover:bg-paper/10 hover:text-paper">
              Updates
              {unread > 0 ? (
                <span className="ml-1 rounded-full bg-volt-300 px-1.5 text-xs font-bold text-ink" aria-label={`${unread} unread`}>
                  {unread}
                </span>
              ) : null}
            </Link>
            <div className="hidden text-right leading-tight sm:block">
              <p className="text-sm font-bold" data-testid="signed-in-as">{user.name}</p>
              <p className="text-xs text-paper/60">
                {ROLE_LABELS[user.role]} · {user.orgName}
              </p>
            </div>
            <SignOutButton />
          </div>
        </div>
      </header>
      <main className="mx-auto max-w-7xl px-4 py-8">{children}</main>
    </div>
  );
}
