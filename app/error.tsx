'use client';

import { useEffect } from 'react';

const RETRY_SECONDS = 30;

/**
 * Shown when a page cannot be rendered. On the pages here that nearly always
 * means the store could not be read; in production the error's message is
 * withheld from the browser, so the text says what to check and gives the
 * digest that identifies the error in the server log.
 */
export default function ErrorPage({ error, retry }: { error: unknown; retry: () => void }) {
  const digest =
    typeof error === 'object' && error !== null && 'digest' in error && typeof error.digest === 'string'
      ? error.digest
      : undefined;

  // A wall display should recover by itself once the database is back.
  useEffect(() => {
    const timer = window.setInterval(retry, RETRY_SECONDS * 1000);
    return () => window.clearInterval(timer);
  }, [retry]);

  return (
    <section className="problem" role="alert" data-testid="error-state">
      <h1>The fleet data could not be read</h1>
      <p>
        Holdfast could not reach its PostgreSQL database, or the database could not answer. Check that the database
        is running and that <code>DATABASE_URL</code> names it; the web server's log has the details.
      </p>
      {digest ? (
        <p className="problem__ref">
          Reference <code>{digest}</code>
        </p>
      ) : null}
      <p className="problem__actions">
        <button type="button" className="button" onClick={() => retry()}>
          Try again
        </button>
        <span className="problem__note">Retrying automatically every {RETRY_SECONDS} s.</span>
      </p>
    </section>
  );
}
