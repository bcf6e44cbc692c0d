import type { Metadata } from 'next';
import { RmaScan } from '@/components/fulfilment/rma-scan';
import { ReturnsQueue, ToShipQueue } from '@/components/fulfilment/warehouse-queues';
import { ButtonLink } from '@/components/ui/button';
import { PageHeader } from '@/components/ui/page-header';
import { requireRole } from '@/lib/auth/session';

export const metadata: Metadata = { title: 'Shipping & cores' };

export default async function WarehousePage() {
  const user = await requireRole('warehouse');
  return (
    <div className="space-y-8">
      <PageHeader
        title="Shipping & cores"
        lead={`Replacements to send and failed parts coming back to ${user.orgName}.`}
        actions={<ButtonLink href="/warehouse/stock" variant="secondary">Stock</ButtonLink>}
      />
      <RmaScan />
      <section className="space-y-3">
        <h2>To ship</h2>
        <ToShipQueue />
      </section>
      <section className="space-y-3">
        <h2>Cores coming back</h2>
        <ReturnsQueue />
      </section>
    </div>
  );
}
