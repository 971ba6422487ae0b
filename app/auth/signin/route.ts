import { signIn } from '../../../lib/auth/signIn';
import { getSharedPool } from '../../../lib/db/sharedPool';
import { authCsrfOk, csrfRefused, readAuthRequest, safeReturnPath, seeOther } from '../../../lib/web/authResponses';

export const dynamic = 'force-dynamic';

/**
 * POST /auth/signin from the sign-in form: origin check (login CSRF), the
 * rate limits and one password check (lib/auth/signIn.ts), then a new
 * session cookie and back to the page asked for. Every refusal but the rate
 * limit reads the same ("invalid"), so the answer tells no one which
 * addresses have accounts.
 */
export async function POST(request: Request): Promise<Response> {
  const auth = await readAuthRequest(request);
  if (!authCsrfOk(request, auth, false)) return csrfRefused();
  const email = auth.form.get('email');
  const password = auth.form.get('password');
  if (typeof email !== 'string' || typeof password !== 'string' || email === '' || password === '') {
    return seeOther(auth, '/signin?error=invalid');
  }
  const result = await signIn(getSharedPool(), { email, password, ip: auth.ip, userAgent: auth.userAgent });
  if (result.kind === 'limited') return seeOther(auth, `/signin?error=limited&retry=${result.retryAfterS}`);
  if (result.kind === 'invalid') return seeOther(auth, '/signin?error=invalid');
  return seeOther(auth, safeReturnPath(auth.form.get('next')), { set: result.sessionId });
}
