/** The buttons that end every GET filter form: apply, or go back to the unfiltered page. */
export default function FilterActions({ clearHref }: { clearHref: string }) {
  return (
    <div className="filters__actions">
      <button type="submit" className="button">
        Apply
      </button>
      <a href={clearHref} className="button button--quiet">
        Clear
      </a>
    </div>
  );
}
