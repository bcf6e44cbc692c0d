import { CatalogTabs } from '@/components/catalog/catalog-tabs';
import { PageHeader } from '@/components/ui/page-header';
import { requireRole } from '@/lib/auth/session';

export default async function CatalogLayout({ children }: { children: React.ReactNode }) {
  const user = await requireRole('brand_admin');
  return (
    <>
      <PageHeader title="Catalog" lead={`What ${user.orgName} sells, and the terms its warranty runs on.`} />
      <CatalogTabs />
      {children}
    </>
  );
}
