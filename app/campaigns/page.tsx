import type { Metadata } from 'next';
import Link from 'next/link';
import { listCampaigns } from '../../lib/queries/campaigns';
import { canSeeCampaign } from '../../lib/auth/scope';
import { pageContext } from '../../lib/web/context';
import CampaignList from '../components/CampaignList';
import PageHead from '../components/PageHead';

export const dynamic = 'force-dynamic';
export const metadata: Metadata = { title: 'Campaigns' };

export default async function CampaignsPage() {
  const ctx = await pageContext();
  const campaigns = (await listCampaigns(ctx.db)).filter((c) => canSeeCampaign(ctx.scope, c.key));
  return (
    <>
      <PageHead title="Campaigns">
        <p className="page-head__lede">
          Charter campaigns from the fleet register: each has a station-keeping report for its vessels and dates.{' '}
          <strong>Days are fleet days in {ctx.timeZone}.</strong>
        </p>
      </PageHead>
      {campaigns.length === 0 ? (
        <section className="empty" data-testid="empty-state">
          <p>
            <strong>No campaigns registered.</strong> Campaigns come with the fleet register file (<Link href="/admin/register">Admin</Link>).
          </p>
        </section>
      ) : (
        <CampaignList campaigns={campaigns} today={ctx.today()} testId="campaign-list" />
      )}
    </>
  );
}
