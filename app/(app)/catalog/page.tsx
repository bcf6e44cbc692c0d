import type { Metadata } from 'next';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { requireRole } from '@/lib/auth/session';

export const metadata: Metadata = { title: 'Catalog' };

export default async function CatalogPage() {
  const user = await requireRole('brand_admin');
  return (
    <>
      <PageHeader title="Catalog" lead={`Models, parts and warranty terms of ${user.orgName}.`} />
      <EmptyState title="The catalog is empty">
        Bike models, parts with their load-test specs, warranty policies per part category, the labor-time schedule, dealer
        prices and the registry of sold units will be kept here.
      </EmptyState>
    </>
  );
}
