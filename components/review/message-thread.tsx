import clsx from 'clsx';
import { MessageForm } from '@/components/review/message-form';
import { DEALER_ROLES, ROLE_LABELS, isRole } from '@/lib/auth/roles';
import type { AppUser } from '@/lib/db/users';
import { formatDateTime } from '@/lib/format/dates';
import type { ClaimView } from '@/lib/services/claim-view';
import { threadOf } from '@/lib/review';
import { EVENT_LABELS, isClaimEventType } from '@/machines/claim';

/** The claim's thread between the shop and the brand; every message is also in the timeline. */
export function MessageThread({ user, view }: { user: AppUser; view: ClaimView }) {
  const { claim } = view;
  if (claim.stage === 'draft') return null;
  const entries = threadOf(view.events);
  const mayWrite = claim.stage !== 'withdrawn' && ((DEALER_ROLES as readonly string[]).includes(user.role) || user.role === 'brand_rep');
  const fromShop = (role: string) => (DEALER_ROLES as readonly string[]).includes(role);
  return (
    <section className="card p-5" data-testid="message-thread">
      <h2 className="mb-3">Messages</h2>
      {entries.length === 0 ? <p className="mb-3 text-sm text-ink-muted">No messages yet. Write to the {user.orgKind === 'dealer' ? 'brand' : 'dealer'} here.</p> : null}
      <ol className="mb-4 space-y-3">
        {entries.map((m) => {
          const shop = fromShop(m.role);
          return (
            <li key={m.id} className={clsx('rounded-md px-3 py-2 text-sm', shop ? 'mr-6 bg-paper-sunk' : 'ml-6 bg-charge-50')} data-testid="thread-message">
              <p className="whitespace-pre-wrap">{m.text}</p>
              <p className="mt-1 text-xs text-ink-muted">
                {m.by ?? 'Loadproof'} · {shop ? claim.dealerName : claim.brandName}
                {isRole(m.role) ? ` (${ROLE_LABELS[m.role]})` : ''}
                {m.event !== 'MESSAGE' && isClaimEventType(m.event) ? ` · with “${EVENT_LABELS[m.event].done.toLowerCase()}”` : ''} · {formatDateTime(m.at, user.timeZone)}
              </p>
            </li>
          );
        })}
      </ol>
      {mayWrite ? <MessageForm claimId={claim.id} placeholder={user.orgKind === 'dealer' ? `Write to ${claim.brandName}` : `Write to ${claim.dealerName}`} /> : null}
    </section>
  );
}
