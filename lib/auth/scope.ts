import { addDays } from '../time/fleetDay';
import type { Principal } from './principal';

/**
 * The tenancy rule of issue 8, as pure functions: what a principal may see.
 *
 * - admin, fleet manager, shore engineer: the whole fleet, every day.
 * - charterer user: the vessels of its organisation's campaigns, and of each
 *   vessel only the days inside the dates of those campaigns.
 * - charterer token: the same for its one campaign.
 *
 * Everything else is refused: a charterer without an organisation or
 * campaign, an unknown role. Pages, the API, CSV/PDF exports and flag
 * actions all ask these functions (through lib/auth/scopeData.ts for the
 * campaign facts), so no reader can apply a rule of its own.
 *
 * Days are fleet days `YYYY-MM-DD`, both ends included (api-v1); that form
 * sorts as text, so comparisons are plain string comparisons.
 */

/** What the rule needs to know about one campaign. */
export interface CampaignFacts {
  id: number;
  key: string;
  organisationId: number | null;
  fromDay: string;
  toDay: string;
  vesselKeys: readonly string[];
}

export interface DayRange {
  from: string;
  to: string;
}

export type Scope =
  | { kind: 'fleet' }
  | {
      kind: 'campaigns';
      campaignKeys: ReadonlySet<string>;
      /** Per visible vessel: its visible days, sorted, disjoint and not touching. */
      windows: ReadonlyMap<string, readonly DayRange[]>;
    };

const FLEET: Scope = { kind: 'fleet' };

/** The campaigns a charterer principal is tied to (empty for any other role: they are not tied). */
export function campaignsOf(principal: Principal, campaigns: readonly CampaignFacts[]): CampaignFacts[] {
  if (principal.role !== 'charterer') return [];
  if (principal.kind === 'token') {
    return principal.campaignId === null ? [] : campaigns.filter((c) => c.id === principal.campaignId);
  }
  // A campaign without an organisation belongs to no charterer user.
  return principal.organisationId === null ? [] : campaigns.filter((c) => c.organisationId === principal.organisationId);
}

export function scopeFor(principal: Principal, campaigns: readonly CampaignFacts[]): Scope {
  if (principal.role === 'admin' || principal.role === 'fleet_manager' || principal.role === 'shore_engineer') return FLEET;
  const own = campaignsOf(principal, campaigns); // [] for an unknown role: sees nothing
  const ranges = new Map<string, DayRange[]>();
  for (const campaign of own) {
    if (!(campaign.fromDay <= campaign.toDay)) continue; // the table's CHECK forbids it; refuse rather than guess
    for (const vessel of campaign.vesselKeys) {
      const list = ranges.get(vessel) ?? [];
      list.push({ from: campaign.fromDay, to: campaign.toDay });
      ranges.set(vessel, list);
    }
  }
  const windows = new Map<string, readonly DayRange[]>();
  for (const [vessel, list] of ranges) windows.set(vessel, mergeRanges(list));
  return { kind: 'campaigns', campaignKeys: new Set(own.map((c) => c.key)), windows };
}

/**
 * Sorted, disjoint ranges. Ranges that overlap or touch (one ends the day
 * before the next starts) become one, so a span across two back-to-back
 * campaigns of the same organisation counts as visible throughout.
 */
export function mergeRanges(ranges: readonly DayRange[]): DayRange[] {
  const sorted = [...ranges].sort((a, b) => (a.from < b.from ? -1 : a.from > b.from ? 1 : 0));
  const merged: DayRange[] = [];
  for (const r of sorted) {
    const last = merged.at(-1);
    if (last && r.from <= addDays(last.to, 1)) {
      if (r.to > last.to) last.to = r.to;
    } else {
      merged.push({ from: r.from, to: r.to });
    }
  }
  return merged;
}

export function canSeeVessel(scope: Scope, vesselKey: string): boolean {
  return scope.kind === 'fleet' || scope.windows.has(vesselKey);
}

/** 'all', or the vessel keys the scope shows, sorted. */
export function visibleVesselKeys(scope: Scope): 'all' | string[] {
  return scope.kind === 'fleet' ? 'all' : [...scope.windows.keys()].sort();
}

/** 'all', or the visible days of one vessel ([] when the vessel is not visible). */
export function visibleDays(scope: Scope, vesselKey: string): 'all' | readonly DayRange[] {
  return scope.kind === 'fleet' ? 'all' : (scope.windows.get(vesselKey) ?? []);
}

export function canSeeDay(scope: Scope, vesselKey: string, day: string): boolean {
  const days = visibleDays(scope, vesselKey);
  return days === 'all' || days.some((r) => r.from <= day && day <= r.to);
}

/**
 * The visible parts of the days from `from` to `to` of one vessel: what a
 * daily query or export may return. [] when nothing of it is visible.
 */
export function clipToScope(scope: Scope, vesselKey: string, from: string, to: string): DayRange[] {
  if (from > to) return [];
  const days = visibleDays(scope, vesselKey);
  if (days === 'all') return [{ from, to }];
  const parts: DayRange[] = [];
  for (const r of days) {
    const start = r.from > from ? r.from : from;
    const end = r.to < to ? r.to : to;
    if (start <= end) parts.push({ from: start, to: end });
  }
  return parts;
}

/**
 * True when every day from `from` to `to` is visible: the test for anything
 * computed over a window, such as a trend flag. A flag whose window reaches
 * outside the campaign was computed from days the charterer may not see, so
 * it is not shown to them, even when it was opened inside the campaign.
 */
export function canSeeSpan(scope: Scope, vesselKey: string, from: string, to: string): boolean {
  if (from > to) return false;
  const days = visibleDays(scope, vesselKey);
  return days === 'all' || days.some((r) => r.from <= from && to <= r.to);
}

export function canSeeCampaign(scope: Scope, campaignKey: string): boolean {
  return scope.kind === 'fleet' || scope.campaignKeys.has(campaignKey);
}
