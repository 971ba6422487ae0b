import { headers } from 'next/headers';
import { unstable_rethrow } from 'next/navigation';
import { getSharedPool } from '../db/sharedPool';
import type { UserPrincipal } from '../auth/principal';
import { requestSession } from './requestSession';

/**
 * The signed-in user for the layout (navigation, session bar), or null.
 * Unlike a page, the layout must render even when the store cannot be read:
 * the root layout frames the error page, and an error thrown here would
 * replace the whole document. The page itself still fails and says why.
 */
export async function layoutSession(): Promise<{ principal: UserPrincipal; csrfToken: string } | null> {
  // Outside the try: reading the request marks every page dynamic (rendered per request,
  // never prerendered at build time without a store), and Next.js must see that signal.
  await headers();
  try {
    const session = await requestSession(getSharedPool());
    return session.check.ok ? { principal: session.check.principal, csrfToken: session.check.csrfToken } : null;
  } catch (error) {
    unstable_rethrow(error); // Next.js' own control flow (redirects, dynamic rendering) passes through
    return null;
  }
}
