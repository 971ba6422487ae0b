import type { Metadata, Viewport } from 'next';
import Link from 'next/link';
import type { ReactNode } from 'react';
import { CAUTION_SHORT } from '../lib/web/cautions';
import { can } from '../lib/auth/permissions';
import { layoutSession } from '../lib/web/layoutSession';
import NavLinks from './components/NavLinks';
import SessionBar from './components/SessionBar';
import './globals.css';

export const metadata: Metadata = {
  title: { default: 'Holdfast', template: '%s · Holdfast' },
  description: 'Fleet station-keeping analytics for dynamically positioned vessels',
};

export const viewport: Viewport = {
  width: 'device-width',
  initialScale: 1,
  themeColor: '#153a47',
};

/** The sections each reader may open: the same rules the pages apply (lib/web/context.ts). */
async function navHrefs(): Promise<string[]> {
  const session = await layoutSession();
  if (!session) return [];
  const principal = session.principal;
  if (principal.role === 'charterer') return ['/watchlist', '/campaigns'];
  return ['/', '/watchlist', '/campaigns', '/reception', ...(can(principal, 'register.import') ? ['/admin'] : [])];
}

export default async function RootLayout({ children }: { children: ReactNode }) {
  const hrefs = await navHrefs();
  return (
    <html lang="en">
      <body>
        <a className="skip-link" href="#main">
          Skip to content
        </a>
        <header className="site-header">
          <div className="wrap site-header__inner">
            <Link className="brand" href="/">
              <svg className="brand__mark" viewBox="0 0 32 32" aria-hidden="true" focusable="false">
                <circle cx="16" cy="16" r="11" fill="none" stroke="currentColor" strokeWidth="2.4" strokeDasharray="3.6 2.6" />
                <circle cx="16" cy="16" r="3.6" fill="currentColor" />
              </svg>
              <span className="brand__name">Holdfast</span>
            </Link>
            <NavLinks hrefs={hrefs} />
            <SessionBar />
          </div>
        </header>
        <main id="main" className="wrap site-main" tabIndex={-1}>
          {children}
        </main>
        <footer className="site-footer">
          <div className="wrap">
            <p className="caution" data-testid="caution">
              <strong className="caution__label">Caution</strong>
              <span>{CAUTION_SHORT}</span>
            </p>
          </div>
        </footer>
      </body>
    </html>
  );
}
