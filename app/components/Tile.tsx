import type { ReactNode } from 'react';

/** One headline figure with its name and what it means. */
export default function Tile({ label, value, about, testId }: { label: string; value: ReactNode; about: string; testId?: string }) {
  return (
    <div className="tile" data-testid={testId}>
      <dt className="tile__label">{label}</dt>
      <dd className="tile__value">{value}</dd>
      <dd className="tile__about">{about}</dd>
    </div>
  );
}
