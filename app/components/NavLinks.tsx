'use client';

import Link from 'next/link';
import { usePathname } from 'next/navigation';

/** The main navigation; the current section is marked for screen readers and by style. */
const SECTIONS = [
  { href: '/', label: 'Fleet', match: (p: string) => p === '/' || p.startsWith('/vessels') },
  { href: '/watchlist', label: 'Watchlist', match: (p: string) => p.startsWith('/watchlist') },
  { href: '/campaigns', label: 'Campaigns', match: (p: string) => p.startsWith('/campaigns') },
  { href: '/reception', label: 'Reception', match: (p: string) => p.startsWith('/reception') },
  { href: '/admin', label: 'Admin', match: (p: string) => p.startsWith('/admin') },
];

/** `hrefs`: the sections the signed-in role may open (a charterer has no fleet-wide screens); none when signed out. */
export default function NavLinks({ hrefs }: { hrefs: readonly string[] }) {
  const path = usePathname() ?? '/';
  return (
    <nav className="site-nav" aria-label="Main">
      <ul>
        {SECTIONS.filter((s) => hrefs.includes(s.href)).map((s) => (
          <li key={s.href}>
            <Link href={s.href} aria-current={s.match(path) ? 'page' : undefined}>
              {s.label}
            </Link>
          </li>
        ))}
      </ul>
    </nav>
  );
}
