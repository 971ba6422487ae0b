import type { ReactNode } from 'react';

/**
 * The frame every chart sits in: a titled figure, the chart (or a plain
 * sentence when there is nothing to draw), and the note saying what the
 * figure is and how many days are gaps. Server-rendered, so the title and
 * note are in the page before any script runs.
 */
export default function ChartFrame({
  id,
  title,
  note,
  empty,
  children,
}: {
  id: string;
  title: string;
  note: string;
  /** Shown instead of the chart when set. */
  empty?: string;
  children: ReactNode;
}) {
  return (
    <figure className="chart" aria-labelledby={`${id}-title`} data-testid={`chart-${id}`}>
      <figcaption className="chart__head">
        <h3 id={`${id}-title`} className="chart__title">
          {title}
        </h3>
      </figcaption>
      {empty ? (
        <p className="chart__empty" data-testid="chart-empty">
          {empty}
        </p>
      ) : (
        <div className="chart__body">{children}</div>
      )}
      <p className="chart__note">{note}</p>
    </figure>
  );
}
