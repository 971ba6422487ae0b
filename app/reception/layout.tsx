import type { ReactNode } from 'react';
import { fleetPageContext } from '../../lib/web/context';

/**
 * The access check of this screen, above its loading screen: a layout
 * renders before the page's Suspense boundary streams anything, so a
 * reader without a live session, or a charterer, gets a real redirect
 * instead of a loading screen that turns into one.
 */
export default async function ReceptionGate({ children }: { children: ReactNode }) {
  await fleetPageContext();
  return children;
}
