'use client';

import { useRouter } from 'next/navigation';
import { useEffect, useTransition } from 'react';

interface Props {
  /** When the server rendered the data on screen (ISO 8601). */
  renderedAt: string;
  /** Seconds between refreshes. */
  everySeconds?: number;
}

/**
 * Re-renders the current page's server components every `everySeconds`
 * (skipped while the tab is hidden, caught up when it shows again) and says
 * when the data on screen was read. The time comes from the server render, so
 * it is the time of the data, not of the last attempt.
 *
 * Skipped while someone is typing: when a form field has focus, or a form is
 * marked `data-dirty="true"` (a note written but not sent), so a refresh
 * never disturbs a half-written acknowledgement.
 */
function editing(): boolean {
  const active = document.activeElement;
  if (active instanceof HTMLElement && active.matches('input, textarea, select')) return true;
  return document.querySelector('form[data-dirty="true"]') !== null;
}

export default function AutoRefresh({ renderedAt, everySeconds = 10 }: Props) {
  const router = useRouter();
  const [refreshing, startTransition] = useTransition();

  useEffect(() => {
    const refresh = () => startTransition(() => router.refresh());
    const timer = window.setInterval(() => {
      if (document.visibilityState === 'visible' && !editing()) refresh();
    }, everySeconds * 1000);
    const onVisible = () => {
      if (document.visibilityState === 'visible') refresh();
    };
    document.addEventListener('visibilitychange', onVisible);
    return () => {
      window.clearInterval(timer);
      document.removeEventListener('visibilitychange', onVisible);
    };
  }, [router, everySeconds]);

  return (
    <p className="refresh" data-testid="auto-refresh" aria-busy={refreshing}>
      <span className={refreshing ? 'refresh__dot refresh__dot--busy' : 'refresh__dot'} aria-hidden="true" />
      <span>
        Updated <time dateTime={renderedAt}>{renderedAt.slice(11, 19)}</time> UTC
      </span>
      <span className="refresh__every">every {everySeconds} s</span>
    </p>
  );
}
