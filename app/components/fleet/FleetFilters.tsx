import type { FleetView } from '../../../lib/web/fleetView';
import FilterActions from '../FilterActions';
import SelectFilter from '../SelectFilter';

/**
 * Filters as a plain GET form: works without script, every control
 * reachable by keyboard, and the URL can be bookmarked or shared.
 */
export default function FleetFilters({ view, types, campaigns }: { view: FleetView; types: string[]; campaigns: string[] }) {
  return (
    <form className="filters" method="get" action="/" aria-label="Filter vessels" data-testid="fleet-filters">
      <SelectFilter id="filter-type" name="type" label="Type" value={view.type ?? ''} options={[{ value: '', label: 'All types' }, ...types.map((t) => ({ value: t, label: t }))]} />
      <SelectFilter
        id="filter-class"
        name="class"
        label="DP class"
        value={view.dpClass ? String(view.dpClass) : ''}
        options={[{ value: '', label: 'All classes' }, ...[1, 2, 3].map((c) => ({ value: String(c), label: `DP ${c}` }))]}
      />
      <SelectFilter
        id="filter-campaign"
        name="campaign"
        label="Campaign"
        value={view.campaign ?? ''}
        options={[{ value: '', label: 'All vessels' }, ...campaigns.map((c) => ({ value: c, label: c }))]}
      />
      {/* Keep the chosen order when filtering. */}
      <input type="hidden" name="sort" value={view.sort} />
      <input type="hidden" name="dir" value={view.dir} />
      <FilterActions clearHref="/" />
    </form>
  );
}
