import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { Suspense } from 'react';
import { fleetTime } from '../../../lib/charts/days';
import { formatAge } from '../../../lib/format/time';
import { getVesselProfile } from '../../../lib/queries/vesselProfile';
import { visibleInstant } from '../../../lib/api/scoped';
import { canSeeCampaign, canSeeVessel } from '../../../lib/auth/scope';
import { pageContext } from '../../../lib/web/context';
import { visiblePageRange } from '../../../lib/web/scopedRange';
import { parsePageRange } from '../../../lib/web/dayRangeParams';
import type { RawSearchParams } from '../../../lib/web/searchParams';
import { isStale } from '../../../lib/web/staleness';
import AutoRefresh from '../../components/AutoRefresh';
import Loading from '../../components/Loading';
import PageHead from '../../components/PageHead';
import RangePicker from '../../components/vessel/RangePicker';
import VesselFigures from './VesselFigures';

export const dynamic = 'force-dynamic';

const REFRESH_SECONDS = 60;

type Props = { params: Promise<{ key: string }>; searchParams: Promise<RawSearchParams> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  return { title: (await params).key };
}

/**
 * The vessel page. Its heading is rendered before anything streams, so an
 * unknown key answers 404; the figures stream in below it (VesselFigures).
 */
export default async function VesselPage({ params, searchParams }: Props) {
  const { key } = await params;
  const ctx = await pageContext();
  const today = ctx.today();
  // A vessel outside the reader's scope is "not found", like an unknown key: its existence is not told.
  if (!canSeeVessel(ctx.scope, key)) notFound();
  const asked = parsePageRange(await searchParams, today);
  const found = await getVesselProfile(ctx.db, key);
  if (!found) notFound();
  const now = new Date();
  // A charterer sees the vessel only on its campaigns' days: the range, the last record and the campaigns are cut to them.
  const range = visiblePageRange(ctx.scope, key, asked, today);
  const profile = {
    ...found,
    lastSeen: visibleInstant(ctx.scope, key, found.lastSeen, ctx.timeZone),
    campaigns: found.campaigns.filter((cmp) => canSeeCampaign(ctx.scope, cmp.key)),
  };
  const stale = isStale(profile.lastSeen, now);

  return (
    <>
      <PageHead
        title={profile.name}
        crumbs={{ href: '/', label: 'Fleet', here: 'vessel' }}
        aside={<AutoRefresh renderedAt={now.toISOString()} everySeconds={REFRESH_SECONDS} />}
      >
          <p className="page-head__lede">
            <span className="vessel__key">{profile.key}</span> · {profile.type} · DP {profile.dpClass} · watch circles{' '}
            {profile.watchCirclesM.join(' and ')} m · heading limits {profile.headingLimitsDeg.join(' and ')}°
            {profile.campaigns.length > 0 ? (
              <>
                {' '}
                · {profile.campaigns.length === 1 ? 'campaign' : 'campaigns'}{' '}
                {profile.campaigns.map((cmp, i) => (
                  <span key={cmp.key}>
                    {i > 0 ? ', ' : ''}
                    <Link href={`/campaigns/${cmp.key}`}>{cmp.key}</Link>
                  </span>
                ))}
              </>
            ) : null}
          </p>
          <p className="page-head__lede" data-testid="last-seen">
            Last station record:{' '}
            {profile.lastSeen ? (
              <>
                <time dateTime={profile.lastSeen.toISOString()}>{fleetTime(profile.lastSeen, ctx.timeZone)}</time> {ctx.timeZone} (
                {formatAge(now.getTime() - profile.lastSeen.getTime())})
              </>
            ) : (
              'never'
            )}{' '}
            {stale ? <span className="badge badge--stale" data-testid="stale-marker">Stale</span> : null}
          </p>
      </PageHead>

      {range ? (
        <>
          <RangePicker basePath={`/vessels/${profile.key}`} range={range} today={today} timeZone={ctx.timeZone} />
          <Suspense fallback={<Loading what="this vessel's figures" />}>
            <VesselFigures ctx={ctx} profile={profile} range={range} today={today} />
          </Suspense>
        </>
      ) : (
        <section className="empty" data-testid="empty-range">
          <p>
            <strong>No day of your campaigns with this vessel has begun yet.</strong>
          </p>
        </section>
      )}
    </>
  );
}
