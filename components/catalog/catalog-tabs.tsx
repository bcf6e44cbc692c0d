'use client';

import clsx from 'clsx';
import Link from 'next/link';
import { usePathname } from 'next/navigation';

export const CATALOG_TABS = [
  { href: '/catalog', label: 'Overview' },
  { href: '/catalog/models', label: 'Models' },
  { href: '/catalog/parts', label: 'Parts & specs' },
  { href: '/catalog/policies', label: 'Warranty terms' },
  { href: '/catalog/labor', label: 'Labor times' },
  { href: '/catalog/prices', label: 'Dealer prices' },
  { href: '/catalog/holidays', label: 'Holidays' },
  { href: '/catalog/dealers', label: 'Dealers' },
  { href: '/catalog/registry', label: 'Registry' },
] as const;

/** The catalog's sections as a tab strip; the overview is lit only on itself. */
export function CatalogTabs() {
  const path = usePathname();
  const active = (href: string) => (href === '/catalog' ? path === href : path === href || path.startsWith(`${href}/`));
  return (
    <nav aria-label="Catalog sections" className="mb-6 flex flex-wrap gap-1 border-b border-paper-line">
      {CATALOG_TABS.map((t) => (
        <Link
          key={t.href}
          href={t.href}
          aria-current={active(t.href) ? 'page' : undefined}
          className={clsx(
            '-mb-px rounded-t-md border-b-2 px-3 py-2 text-sm font-bold',
            active(t.href) ? 'border-charge-600 text-charge-700' : 'border-transparent text-ink-muted hover:text-ink',
          )}
        >
          {t.label}
        </Link>
      ))}
    </nav>
  );
}
