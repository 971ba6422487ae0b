import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { getCampaignReport } from '../../../lib/api/queries/campaignReport';
import { longDay } from '../../../lib/charts/days';
import { campaignBars } from '../../../lib/charts/campaignChart';
import { CAUTION_REPORT } from '../../../lib/web/cautions';
import { campaignPhase, campaignTable, coordinate } from '../../../lib/web/campaignTable';
import { canSeeCampaign } from '../../../lib/auth/scope';
import { pageContext } from '../../../lib/web/context';
import ChartFrame from '../../components/charts/ChartFrame';
import CampaignBarsChart from '../../components/charts/CampaignBarsChart';
import PageHead from '../../components/PageHead';
import PrintButton from '../../components/PrintButton';

export const dynamic = 'force-dynamic';

type Props = { params: Promise<{ key: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  return { title: `Campaign ${(await params).key}` };
}

export default async function CampaignPage({ params }: Props) {
  const { key } = await params;
  const ctx = await pageContext();
  // Another organisation's campaign is "not found", like an unknown key.
  if (!canSeeCampaign(ctx.scope, key)) notFound();
  const today = ctx.today();
  const report = await getCampaignReport(ctx.db, key, today);
  if (!report) notFound();
  const c = report.campaign;
  const table = campaignTable(report);
  const bars = campaignBars(report);
  const phase = campaignPhase(c.from, c.to, today);

  return (
    <article className="report" data-testid="campaign-report">
      <PageHead
        title={`Station-keeping report: ${c.key}`}
        crumbs={{ href: '/campaigns', label: 'Campaigns', here: 'report' }}
        aside={
        <div className="report__actions no-print">
          <a className="button" href={`/campaigns/${c.key}/report.pdf`} download data-testid="download-pdf">
            Download PDF
          </a>
          <a className="button button--quiet" href={`/campaigns/${c.key}/report.csv`} download data-testid="download-csv">
            Download CSV
          </a>
          <PrintButton />
        </div>
        }
      >
        <p className="page-head__lede">
          For <strong>{c.charterer}</strong> at {c.site.name}. <strong>Days are fleet days in {ctx.timeZone}.</strong>
        </p>
      </PageHead>

      <dl className="facts facts--wide" data-testid="campaign-facts">
        <div>
          <dt>Charterer</dt>
          <dd>{c.charterer}</dd>
        </div>
        <div>
          <dt>Site</dt>
          <dd>
            {c.site.name} ({coordinate(c.site.lat, 'N', 'S')}, {coordinate(c.site.lon, 'E', 'W')})
          </dd>
        </div>
        <div>
          <dt>Campaign dates</dt>
          <dd>
            {longDay(c.from)} to {longDay(c.to)} <span className={`status status--${phase}`}>{phase}</span>
          </dd>
        </div>
        <div>
          <dt>Period in this report</dt>
          <dd data-testid="report-period">
            {report.period ? `${longDay(report.period.from)} to ${longDay(report.period.to)}` : 'Not started: no days yet'}
          </dd>
        </div>
        <div>
          <dt>Watch circles</dt>
          <dd>{c.watch_circles_m.map((l) => `${l} m`).join(', ')}</dd>
        </div>
      </dl>

      <section className="section" aria-labelledby="figures-title">
        <h2 id="figures-title">Figures by vessel</h2>
        <div className="table-scroll" role="region" aria-labelledby="figures-title" tabIndex={0}>
          <table className="data-table" data-testid="campaign-table">
            <thead>
              <tr>
                <th scope="col">Vessel</th>
                {table.columns.map((col) => (
                  <th key={col.key} scope="col" className="num" title={col.about}>
                    {col.label}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {table.rows.map((r) => (
                <tr key={r.vessel} data-testid="campaign-vessel" data-vessel-key={r.vessel}>
                  <th scope="row">
                    <Link href={`/vessels/${r.vessel}?from=${report.period?.from ?? c.from}&to=${report.period?.to ?? today}`}>{r.name}</Link>
                    <span className="vessel__key">{r.vessel}</span>
                  </th>
                  {r.cells.map((cell, i) => (
                    <td key={table.columns[i]!.key} className="num" data-column={table.columns[i]!.key}>
                      {cell}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        <ul className="definitions">
          {table.columns.map((col) => (
            <li key={col.key}>
              <strong>{col.label}:</strong> {col.about}
            </li>
          ))}
          <li>A dash means the figure could not be computed (no DP time or no data), never zero.</li>
        </ul>
      </section>

      {report.vessels.length > 0 ? (
        <ChartFrame id="campaign-bars" title="Inside the watch circles" note={bars.note}>
          <CampaignBarsChart data={bars} />
        </ChartFrame>
      ) : null}

      <aside className="caution-box" aria-labelledby="report-caution" data-testid="report-caution">
        <h2 id="report-caution">Caution</h2>
        {CAUTION_REPORT.map((p) => (
          <p key={p}>{p}</p>
        ))}
      </aside>
      <p className="print-only report__stamp">
        Printed from Holdfast; figures as of {report.as_of}, fleet days in {ctx.timeZone}.
      </p>
    </article>
  );
}
