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

export default function NavLinks() {
  const path = usePathname() ?? '/';
  return (
    <nav className="site-nav" aria-label="Main">
      <ul>
        {SECTIONS.map((s) => (
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
