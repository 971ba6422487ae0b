import type { Metadata } from 'next';
import { listFleetWebhooks } from '../../../lib/queries/webhooks';
import { pageContextFor } from '../../../lib/web/context';
import PageHead from '../../components/PageHead';

export const dynamic = 'force-dynamic';
export const metadata: Metadata = { title: 'Webhooks' };

/** A URL shown without its query string or credentials, which may hold secrets. */
function safeUrl(value: string): string {
  try {
    const u = new URL(value);
    return `${u.protocol}//${u.host}${u.pathname}${u.search ? '?…' : ''}`;
  } catch {
    return 'not a URL';
  }
}

export default async function WebhooksPage() {
  const webhooks = await listFleetWebhooks((await pageContextFor('webhook.manage')).db);
  return (
    <>
      <PageHead title="Webhooks" crumbs={{ href: '/admin', label: 'Admin', here: 'webhooks' }}>
        <p className="page-head__lede">
          New trend flags are posted as JSON to these addresses, through an outbox that retries until each is delivered. Add and
          remove them with <code>holdfast flags webhook</code>.
        </p>
      </PageHead>
      {webhooks === null ? (
        <section className="empty" data-testid="webhooks-placeholder">
          <p>
            <strong>No webhook store in this database yet.</strong> Flag notifications arrive with the flag job&apos;s outbox;
            once its migration has run, the webhooks it holds are listed here.
          </p>
        </section>
      ) : webhooks.length === 0 ? (
        <section className="empty" data-testid="webhooks-empty">
          <p>
            <strong>No webhooks configured.</strong> New flags are shown on the watchlist only.
          </p>
        </section>
      ) : (
        <div className="table-scroll" role="region" aria-label="Webhooks" tabIndex={0}>
          <table className="data-table" data-testid="webhooks">
            <thead>
              <tr>
                <th scope="col">Id</th>
                <th scope="col">Address</th>
                <th scope="col">Signed</th>
                <th scope="col">Enabled</th>
                <th scope="col" className="num">
                  Waiting
                </th>
                <th scope="col" className="num">
                  Delivered
                </th>
                <th scope="col">Last error</th>
              </tr>
            </thead>
            <tbody>
              {webhooks.map((w) => (
                <tr key={w.id} data-testid="webhook-row">
                  <td>{w.id}</td>
                  <th scope="row">
                    <code>{safeUrl(w.url)}</code>
                  </th>
                  <td>{w.hasSecret ? 'yes (HMAC)' : 'no'}</td>
                  <td>{w.enabled ? 'yes' : 'no'}</td>
                  <td className="num">{w.pending}</td>
                  <td className="num">{w.delivered}</td>
                  <td>{w.lastError ?? '—'}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
