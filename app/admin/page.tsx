import type { Metadata } from 'next';
import Link from 'next/link';
import { pageContextFor } from '../../lib/web/context';

export const metadata: Metadata = { title: 'Admin' };

const SECTIONS = [
  { href: '/admin/register', title: 'Fleet register', text: 'Import a register file and see, field by field, what it changes.' },
  { href: '/admin/campaigns', title: 'Campaigns', text: 'Charter campaigns as registered: vessels, dates, site and watch circles.' },
  { href: '/admin/webhooks', title: 'Webhooks', text: 'Where new trend flags are delivered.' },
  { href: '/admin/access', title: 'Users and access', text: 'Sign-in, roles and API tokens.' },
];

export default async function AdminPage() {
  await pageContextFor('register.import');
  return (
    <>
      <div className="page-head">
        <div>
          <h1>Admin</h1>
          <p className="page-head__lede">The register and the connections around it.</p>
        </div>
      </div>
      <ul className="cards" data-testid="admin-sections">
        {SECTIONS.map((s) => (
          <li key={s.href} className="card">
            <h2>
              <Link href={s.href}>{s.title}</Link>
            </h2>
            <p>{s.text}</p>
          </li>
        ))}
      </ul>
      <p className="notice">
        Fleet managers and admins see this area; webhooks, users and tokens are for admins only. Every change here is written
        to the audit log.
      </p>
    </>
  );
}
