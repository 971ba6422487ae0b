import Link from 'next/link';
import { longDay } from '../../lib/charts/days';
import type { CampaignListItem } from '../../lib/queries/campaigns';
import { campaignPhase, coordinate } from '../../lib/web/campaignTable';

const PHASE_LABEL = { upcoming: 'Upcoming', running: 'Running', ended: 'Ended' } as const;

/** Campaigns as registered, each linking to its report; shared by the Campaigns and Admin pages. */
export default function CampaignList({ campaigns, today, testId }: { campaigns: CampaignListItem[]; today: string; testId: string }) {
  return (
    <div className="table-scroll" role="region" aria-label="Campaigns" tabIndex={0}>
      <table className="data-table" data-testid={testId}>
        <thead>
          <tr>
            <th scope="col">Campaign</th>
            <th scope="col">Charterer</th>
            <th scope="col">Site</th>
            <th scope="col">Dates</th>
            <th scope="col">Watch circles</th>
            <th scope="col">Vessels</th>
          </tr>
        </thead>
        <tbody>
          {campaigns.map((c) => {
            const phase = campaignPhase(c.from, c.to, today);
            return (
              <tr key={c.key} data-testid="campaign-row" data-campaign-key={c.key}>
                <th scope="row">
                  <Link href={`/campaigns/${c.key}`}>{c.key}</Link> <span className={`status status--${phase}`}>{PHASE_LABEL[phase]}</span>
                </th>
                <td>{c.charterer}</td>
                <td>
                  {c.siteName}{' '}
                  <span className="muted">
                    ({coordinate(c.siteLat, 'N', 'S')}, {coordinate(c.siteLon, 'E', 'W')})
                  </span>
                </td>
                <td className="nowrap">
                  {longDay(c.from)} – {longDay(c.to)}
                </td>
                <td>{c.watchCirclesM.map((l) => `${l} m`).join(', ')}</td>
                <td>
                  {c.vessels.map((v, i) => (
                    <span key={v.key}>
                      {i > 0 ? ', ' : ''}
                      <Link href={`/vessels/${v.key}`}>{v.name}</Link>
                    </span>
                  ))}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
