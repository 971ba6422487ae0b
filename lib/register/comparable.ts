import type { FleetFile, FleetVessel } from './fleetFile';

/**
 * A vessel and a campaign of the register as the import compares them: the
 * fields it writes, units and vessel lists in a fixed order, a missing
 * diameter as null. The import (importFleet.ts) and the admin page's preview
 * of what an import would change (lib/web/registerDiff.ts) both read these,
 * so "unchanged" in the preview is "unchanged" in the import.
 */
const byId = <T extends { id: string }>(list: readonly T[]) => [...list].sort((a, b) => a.id.localeCompare(b.id));

export function comparableVessel(v: FleetVessel) {
  return {
    name: v.name,
    type: v.type,
    dp_class: v.dp_class,
    watch_circles_m: v.watch_circles_m,
    heading_limits_deg: v.heading_limits_deg,
    thrusters: byId(v.thrusters).map((t) => ({ ...t, diameter_m: t.diameter_m ?? null })),
    buses: byId(v.buses),
    refs: byId(v.refs),
  };
}

export function comparableCampaign(c: FleetFile['campaigns'][number]) {
  return {
    charterer: c.charterer,
    from: c.from,
    to: c.to,
    site: c.site,
    watch_circles_m: c.watch_circles_m,
    vessels: [...c.vessels].sort(),
  };
}
