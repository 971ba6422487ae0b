import type { Metadata } from 'next';
import RegisterImport from '../../components/admin/RegisterImport';
import PageHead from '../../components/PageHead';
import { pageContextFor } from '../../../lib/web/context';

export const dynamic = 'force-dynamic';
export const metadata: Metadata = { title: 'Fleet register' };

export default async function RegisterPage() {
  const ctx = await pageContextFor('register.import');
  return (
    <>
      <PageHead title="Fleet register" crumbs={{ href: '/admin', label: 'Admin', here: 'fleet register' }}>
        <p className="page-head__lede">
          Import a fleet register file (fleet-v1): vessels with their thrusters, switchboards and reference systems, and
          campaigns. Holdfast checks the whole file first and shows what would change; importing the same file again
          changes nothing. Vessels and campaigns missing from the file are left as they are; a thruster, switchboard or
          reference system no longer listed for its vessel leaves the register, and its stored telemetry stays. The
          command line does the same:{' '}
          <code>holdfast fleet import FILE</code>.
        </p>
      </PageHead>
      <RegisterImport csrfToken={ctx.csrfToken} />
    </>
  );
}
