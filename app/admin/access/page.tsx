import type { Metadata } from 'next';
import { listApiTokens } from '../../../lib/api/tokens';
import { listUsers } from '../../../lib/auth/users';
import { pageContextFor } from '../../../lib/web/context';
import PageHead from '../../components/PageHead';

export const dynamic = 'force-dynamic';
export const metadata: Metadata = { title: 'Users and access' };

const when = (d: Date | null) => (d ? d.toISOString().replace('T', ' ').slice(0, 16) + ' UTC' : '—');

export default async function AccessPage() {
  const ctx = await pageContextFor('user.manage');
  const [users, tokens] = await Promise.all([listUsers(ctx.db), listApiTokens(ctx.db)]);
  return (
    <>
      <PageHead title="Users and access" crumbs={{ href: '/admin', label: 'Admin', here: 'users and access' }} />
      <section className="section" aria-labelledby="users-title">
        <h2 id="users-title">Users</h2>
        <p className="section__lede">
          Read-only here. Create, disable and change passwords with <code>holdfast user</code>: a password is typed at the
          terminal, never on a web form that a stolen session could use.
        </p>
        <div className="table-scroll" role="region" aria-labelledby="users-title" tabIndex={0}>
          <table className="data-table" data-testid="users">
            <thead>
              <tr>
                <th scope="col">E-mail</th>
                <th scope="col">Name</th>
                <th scope="col">Role</th>
                <th scope="col">Organisation</th>
                <th scope="col">Last sign-in</th>
                <th scope="col">State</th>
              </tr>
            </thead>
            <tbody>
              {users.map((u) => (
                <tr key={u.id}>
                  <th scope="row">{u.email}</th>
                  <td>{u.displayName}</td>
                  <td>{u.role}</td>
                  <td>{u.organisation ?? '—'}</td>
                  <td>{when(u.lastSignInAt)}</td>
                  <td>{u.disabledAt ? `disabled ${when(u.disabledAt)}` : 'active'}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
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
