import type { Metadata } from 'next';
import { listApiTokens } from '../../../lib/api/tokens';
import { pageContext } from '../../../lib/web/context';
import PageHead from '../../components/PageHead';

export const dynamic = 'force-dynamic';
export const metadata: Metadata = { title: 'Users and access' };

const when = (d: Date | null) => (d ? d.toISOString().replace('T', ' ').slice(0, 16) + ' UTC' : '—');

export default async function AccessPage() {
  const tokens = await listApiTokens(pageContext().db);
  return (
    <>
      <PageHead title="Users and access" crumbs={{ href: '/admin', label: 'Admin', here: 'users and access' }} />
      <section className="empty" data-testid="access-placeholder">
        <p>
          <strong>Users, roles and sign-in are not part of this version.</strong> They come with the access-control work: admins,
          fleet managers, shore engineers and charterers, each seeing what their role allows. Until then the web app has no
          sign-in, and flag acknowledgements record the name typed in the form.
        </p>
      </section>
      <section className="section" aria-labelledby="tokens-title">
        <h2 id="tokens-title">API tokens</h2>
        <p className="section__lede">
          Read-only here. Create and revoke them with <code>holdfast token create</code> and <code>holdfast token revoke</code>.
        </p>
        {tokens.length === 0 ? (
          <p className="empty-line">No API tokens.</p>
        ) : (
          <div className="table-scroll" role="region" aria-labelledby="tokens-title" tabIndex={0}>
            <table className="data-table" data-testid="tokens">
              <thead>
                <tr>
                  <th scope="col">Id</th>
                  <th scope="col">Name</th>
                  <th scope="col">Role</th>
                  <th scope="col">Campaign</th>
                  <th scope="col">Created</th>
                  <th scope="col">Last used</th>
                  <th scope="col">State</th>
                </tr>
              </thead>
              <tbody>
                {tokens.map((t) => (
                  <tr key={t.id}>
                    <td>{t.id}</td>
                    <th scope="row">{t.name}</th>
                    <td>{t.role}</td>
                    <td>{t.campaign ?? '—'}</td>
                    <td>{when(t.createdAt)}</td>
                    <td>{when(t.lastUsedAt)}</td>
                    <td>{t.revokedAt ? `revoked ${when(t.revokedAt)}` : 'active'}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </section>
    </>
  );
}
