import type { Metadata } from 'next';
import Link from 'next/link';
import { Notice } from '@/components/ui/notice';
import { requireRole } from '@/lib/auth/session';
import { localDate } from '@/lib/calendar';
import { CATEGORY_NAMES } from '@/lib/catalog';
import type { PartCategory } from '@/lib/coverage';
import { catalogCounts, currentPrices, listParts, listPolicies, listRegistryImports } from '@/lib/db/catalog';
import { formatDateTime } from '@/lib/format/dates';

export const metadata: Metadata = { title: 'Catalog' };

export default async function CatalogPage() {
  const user = await requireRole('brand_admin');
  const today = localDate(new Date().toISOString(), user.timeZone);
  const [counts, parts, policies, prices, imports] = await Promise.all([
    catalogCounts(user.organisationId), listParts(user.organisationId), listPolicies(user.organisationId),
    currentPrices(user.organisationId, today), listRegistryImports(user.organisationId, 1),
  ]);
  const priced = new Set(prices.map((p) => p.partId));
  const active = parts.filter((p) => p.active);
  const covered = new Set(policies.map((p) => p.category));
  const uncovered = [...new Set(active.map((p) => p.category))].filter((c) => !covered.has(c)) as PartCategory[];
  const unpriced = active.filter((p) => !priced.has(p.id));
  const unspecified = active.filter((p) => p.category === 'drive_unit' && p.minWheelPowerW === null && p.minWheelTorqueNm === null);
  const last = imports[0];

  const sections = [
    { href: '/catalog/models', title: 'Models', figure: counts.models, text: 'Bikes sold, with the legal class and tyre size a dyno run is checked against.' },
    { href: '/catalog/parts', title: 'Parts & specs', figure: counts.parts, text: 'Part numbers with the load-test spec each replacement must meet.' },
    { href: '/catalog/policies', title: 'Warranty terms', figure: counts.policies, text: 'Coverage, battery wear limits, deadlines and exclusions per kind of part.' },
    { href: '/catalog/labor', title: 'Labor times', figure: counts.labor, text: 'Operations and the standard hours credited for them.' },
    { href: '/catalog/prices', title: 'Dealer prices', figure: counts.prices, text: 'Net prices for parts a shop fits from its own stock, dated.' },
    { href: '/catalog/holidays', title: 'Holidays', figure: counts.holidays, text: 'Days the review and core-return clocks do not count.' },
    { href: '/catalog/dealers', title: 'Dealers', figure: counts.dealers, text: 'Shops with an account, and their agreed labor rates.' },
    { href: '/catalog/registry', title: 'Registry', figure: counts.units, text: 'Sold bikes by frame serial: registration stands in for a receipt.' },
  ];

  return (
    <div className="space-y-6">
      {uncovered.length || unpriced.length || unspecified.length ? (
        <Notice tone="warning" title="Gaps a claim would run into">
          <ul className="list-disc space-y-1 pl-5">
            {uncovered.length ? (
              <li>
                No warranty terms for {uncovered.map((c) => CATEGORY_NAMES[c].toLowerCase()).join(', ')}: coverage of those claims is left to the rep. <Link className="font-bold underline" href="/catalog/policies">Add terms</Link>
              </li>
            ) : null}
            {unpriced.length ? (
              <li>
                {unpriced.length} active part{unpriced.length === 1 ? ' has' : 's have'} no dealer price today ({unpriced.slice(0, 4).map((p) => p.partNumber).join(', ')}{unpriced.length > 4 ? ', …' : ''}). <Link className="font-bold underline" href="/catalog/prices">Set prices</Link>
              </li>
            ) : null}
            {unspecified.length ? (
              <li>
                {unspecified.map((p) => p.partNumber).join(', ')}: no dyno minimum, so an after-repair run cannot be judged. <Link className="font-bold underline" href="/catalog/parts">Set the spec</Link>
              </li>
            ) : null}
          </ul>
        </Notice>
      ) : null}
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
        {sections.map((s) => (
          <Link key={s.href} href={s.href} className="card group p-4 hover:border-charge-300" data-testid={`catalog-card-${s.title}`}>
            <p className="text-sm font-bold text-ink-soft group-hover:text-charge-700">{s.title}</p>
            <p className="figure my-1 text-3xl font-bold">{s.figure}</p>
            <p className="text-sm text-ink-muted">{s.text}</p>
          </Link>
        ))}
      </div>
      <p className="text-sm text-ink-muted">
        {last
          ? <>Last registry import: {last.fileName}, {last.rowsAdded} bikes, by {last.importedByName} on {formatDateTime(last.createdAt, user.timeZone)}.</>
          : 'No registry file imported yet.'}{' '}
        <Link href="/catalog/registry/import" className="font-bold text-charge-700 underline">Import sold bikes from CSV</Link>
      </p>
    </div>
  );
}
