import Link from 'next/link';
import type { ReactNode } from 'react';

/** A page's heading: where it sits (crumbs), its title, a line or two about it, and anything set beside it. */
export default function PageHead({
  crumbs,
  title,
  children,
  aside,
}: {
  crumbs?: { href: string; label: string; here: string };
  title: ReactNode;
  children?: ReactNode;
  aside?: ReactNode;
}) {
  return (
    <div className="page-head">
      <div>
        {crumbs ? (
          <p className="crumbs">
            <Link href={crumbs.href}>{crumbs.label}</Link> / {crumbs.here}
          </p>
        ) : null}
        <h1>{title}</h1>
        {children}
      </div>
      {aside}
    </div>
  );
}
