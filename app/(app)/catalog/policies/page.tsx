import type { Metadata } from 'next';
import Link from 'next/link';
import { PolicyForm } from '@/components/catalog/policy-form';
import { Badge } from '@/components/ui/badge';
import { requireRole } from '@/lib/auth/session';
import { DEADLINE_RULE_TEXT } from '@/lib/calendar';
import { CATEGORY_NAMES } from '@/lib/catalog';
import { COVERAGE_PERIOD_RULE_TEXT, EXCLUSION_LABELS, PART_CATEGORIES, type ExclusionCode, type PartCategory } from '@/lib/coverage';
import { listPolicies, type WarrantyPolicy } from '@/lib/db/catalog';

export const metadata: Metadata = { title: 'Warranty terms · Catalog' };

export default async function PoliciesPage({ searchParams }: { searchParams: Promise<{ edit?: string }> }) {
  const user = await requireRole('brand_admin');
  const { edit } = await searchParams;
  const policies = await listPolicies(user.organisationId);
  const byCategory = new Map(policies.map((p) => [p.category, p]));
  const editing = (PART_CATEGORIES as readonly string[]).includes(edit ?? '') ? (edit as PartCategory) : null;

  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
      <div className="space-y-3">
        {PART_CATEGORIES.map((c) => (
          <PolicyCard key={c} category={c} policy={byCategory.get(c) ?? null} active={c === editing} />
        ))}
        <div className="space-y-1 text-xs text-ink-muted">
          <p>{COVERAGE_PERIOD_RULE_TEXT}</p>
          <p>{DEADLINE_RULE_TEXT}</p>
        </div>
      </div>
      <section className="card self-start p-5 lg:sticky lg:top-4">
        {editing ? (
          <>
            <h2 className="mb-4">Terms for {CATEGORY_NAMES[editing].toLowerCase()}</h2>
            <PolicyForm key={editing} category={editing} policy={byCategory.get(editing) ?? null} />
          </>
        ) : (
          <>
            <h2 className="mb-2">Change terms</h2>
            <p className="text-sm text-ink-muted">
              Choose a kind of part to edit its terms. A change applies to coverage shown from now on; decided claims keep the
              decision they got.
            </p>
          </>
        )}
      </section>
    </div>
  );
}

function PolicyCard({ category, policy, active }: { category: PartCategory; policy: WarrantyPolicy | null; active: boolean }) {
  return (
    <section className={`card p-4 ${active ? 'border-charge-400 ring-2 ring-charge-100' : ''}`} data-testid={`policy-${category}`}>
      <div className="flex items-start justify-between gap-3">
        <h2 className="text-base">{CATEGORY_NAMES[category]}</h2>
        <Link href={`/catalog/policies?edit=${category}`} className="text-sm font-bold text-charge-700 hover:underline" aria-label={`${policy ? 'Edit' : 'Add'} terms for ${CATEGORY_NAMES[category]}`}>
          {policy ? 'Edit' : 'Add terms'}
        </Link>
      </div>
      {policy ? (
        <>
          <dl className="mt-2 grid grid-cols-2 gap-x-4 gap-y-1 text-sm sm:grid-cols-3">
            <Term label="Covered">{policy.coverageMonths} months from sale</Term>
            {category === 'battery' ? <Term label="Cycles">{policy.cycleLimit ? `up to ${policy.cycleLimit}` : 'no limit'}</Term> : null}
            {category === 'battery' ? <Term label="Capacity fault below">{policy.capacityThresholdPct !== null ? `${policy.capacityThresholdPct} % of rated` : 'not set'}</Term> : null}
            <Term label="Review within">{policy.reviewDays} business days</Term>
            <Term label="Core back within">{policy.coreReturnDays} days + {policy.coreGraceDays} grace</Term>
            <Term label="Appeal within">{policy.appealDays} days</Term>
          </dl>
          <div className="mt-2 flex flex-wrap gap-1">
            {policy.exclusions.length ? (
              policy.exclusions.map((x) => <Badge key={x} tone="fault">Not covered: {EXCLUSION_LABELS[x as ExclusionCode]?.split(' (')[0] ?? x}</Badge>)
            ) : (
              <span className="text-xs text-ink-muted">No exclusions.</span>
            )}
          </div>
        </>
      ) : (
        <p className="mt-1 text-sm text-ink-muted">No terms yet: claims for this kind of part show no coverage check, and the rep decides by hand.</p>
      )}
    </section>
  );
}

function Term({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div>
      <dt className="text-xs text-ink-muted">{label}</dt>
      <dd className="font-bold">{children}</dd>
    </div>
  );
}
