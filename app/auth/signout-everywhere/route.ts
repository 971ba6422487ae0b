import { signOutEverywhere } from '../../../lib/auth/signIn';
import { readSession } from '../../../lib/auth/sessions';
import { getSharedPool } from '../../../lib/db/sharedPool';
import { authCsrfOk, csrfRefused, readAuthRequest, seeOther } from '../../../lib/web/authResponses';

export const dynamic = 'force-dynamic';

/** POST /auth/signout-everywhere: ends every session of the signed-in user, on every device. */
export async function POST(request: Request): Promise<Response> {
  const auth = await readAuthRequest(request);
  const db = getSharedPool();
  const session = await readSession(db, auth.sessionId);
  if (!session.ok) return seeOther(auth, '/signin', { clear: true });
  if (!authCsrfOk(request, auth, true)) return csrfRefused();
  await signOutEverywhere(db, session.principal, { ip: auth.ip });
  return seeOther(auth, '/signin?signed_out=everywhere', { clear: true });
}
