/** Shown while a page's figures are read; the layout (navigation, cautions) and the page heading stay in place. */
export default function Loading({ what = 'the fleet figures' }: { what?: string }) {
  return (
    <div className="loading" role="status" aria-live="polite" data-testid="loading">
      <span className="loading__bar" aria-hidden="true" />
      <span>Reading {what}…</span>
    </div>
  );
}
