import type { Metadata } from 'next';
import Link from 'next/link';
import { listCampaigns } from '../../../lib/queries/campaigns';
import { pageContextFor } from '../../../lib/web/context';
import CampaignList from '../../components/CampaignList';
import PageHead from '../../components/PageHead';

export const dynamic = 'force-dynamic';
export const metadata: Metadata = { title: 'Campaigns (admin)' };

export default async function AdminCampaignsPage() {
  const ctx = await pageContextFor('register.import');
  const campaigns = await listCampaigns(ctx.db);
  return (
    <>
      <PageHead title="Campaigns" crumbs={{ href: '/admin', label: 'Admin', here: 'campaigns' }}>
        <p className="page-head__lede">
          As registered. Campaigns are created and changed through the <Link href="/admin/register">fleet register file</Link>, so
          the file stays the one record of who chartered what, where and when.
        </p>
      </PageHead>
      {campaigns.length === 0 ? (
        <section className="empty" data-testid="empty-state">
          <p>
            <strong>No campaigns registered.</strong> Add a <code>campaigns</code> list to the fleet register file and import it.
          </p>
        </section>
      ) : (
        <CampaignList campaigns={campaigns} today={ctx.today()} testId="admin-campaigns" />
      )}
    </>
  );
}
