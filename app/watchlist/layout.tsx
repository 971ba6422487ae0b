import type { ReactNode } from 'react';
import { pageContext } from '../../lib/web/context';

/**
 * The session check of this screen, above its loading screen: a layout
 * renders before the page's Suspense boundary streams anything, so a
 * reader whose session ended gets a real redirect to /signin instead of a
 * loading screen that turns into one.
 */
export default async function WatchlistGate({ children }: { children: ReactNode }) {
  await pageContext();
  return children;
}
