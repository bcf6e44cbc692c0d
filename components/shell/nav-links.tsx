'use client';

import clsx from 'clsx';
import Link from 'next/link';
import { usePathname } from 'next/navigation';
import type { NavItem } from '@/lib/auth/roles';

export function NavLinks({ items }: { items: NavItem[] }) {
  const path = usePathname();
  // The longest matching prefix wins, so "/claims/new" does not also light up "/claims".
  const active = items
    .filter((i) => path === i.href || path.startsWith(i.href + '/'))
    .sort((a, b) => b.href.length - a.href.length)[0]?.href;
  return (
    <nav aria-label="Main" className="flex flex-wrap gap-1">
      {items.map((i) => (
        <Link
          key={i.href}
          href={i.href}
          aria-current={active === i.href ? 'page' : undefined}
          className={clsx(
            'rounded-md px-3 py-2 text-sm font-bold',
            active === i.href ? 'bg-paper/15 text-paper' : 'text-paper/70 hover:bg-paper/10 hover:text-paper',
          )}
        >
          {i.label}
        </Link>
      ))}
    </nav>
  );
}
