'use client';

/** Opens the browser's print dialog; the print stylesheet lays the report out for paper. */
export default function PrintButton() {
  return (
    <button type="button" className="button button--quiet" onClick={() => window.print()}>
      Print
    </button>
  );
}
