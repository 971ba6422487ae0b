import { signOut } from '../../../lib/auth/signIn';
import { getSharedPool } from '../../../lib/db/sharedPool';
import { authCsrfOk, csrfRefused, readAuthRequest, seeOther } from '../../../lib/web/authResponses';

export const dynamic = 'force-dynamic';

/** POST /auth/signout: ends this session (CSRF-checked, so no other site can sign a user out). */
export async function POST(request: Request): Promise<Response> {
  const auth = await readAuthRequest(request);
  if (!auth.sessionId) return seeOther(auth, '/signin', { clear: true });
  if (!authCsrfOk(request, auth, true)) return csrfRefused();
  await signOut(getSharedPool(), auth.sessionId, { ip: auth.ip });
  return seeOther(auth, '/signin?signed_out=1', { clear: true });
}
