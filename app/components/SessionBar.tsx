import { layoutSession } from '../../lib/web/layoutSession';

const ROLE_LABEL: Record<string, string> = {
  admin: 'admin',
  fleet_manager: 'fleet manager',
  shore_engineer: 'shore engineer',
  charterer: 'charterer',
};

/**
 * Who is signed in, and the two ways out: this browser, or every device.
 * Both are CSRF-checked POST forms (a link would let any page sign a user
 * out). Renders nothing when no one is signed in (the sign-in page).
 */
export default async function SessionBar() {
  const session = await layoutSession();
  if (!session) return null;
  const { principal, csrfToken } = session;
  return (
    <div className="session-bar" data-testid="session-bar">
      <span className="session-bar__who" title={principal.email}>
        {principal.email} · {ROLE_LABEL[principal.role] ?? principal.role}
      </span>
      <form method="post" action="/auth/signout">
        <input type="hidden" name="csrf_token" value={csrfToken} />
        <button type="submit" className="button button--quiet">
          Sign out
        </button>
      </form>
      <form method="post" action="/auth/signout-everywhere">
        <input type="hidden" name="csrf_token" value={csrfToken} />
        <button type="submit" className="button button--quiet" title="Ends every session of your account, on every device">
          Sign out everywhere
        </button>
      </form>
    </div>
  );
}
