import { comparableCampaign, comparableVessel } from '../register/comparable';
import type { FleetFile } from '../register/fleetFile';

/**
 * What importing a fleet register file would change, field by field: the
 * stored register (lib/queries/registerSnapshot.ts, in the file's shape)
 * against the validated file. The admin page shows this before and after
 * an import. It compares the same fields lib/register/importFleet.ts writes,
 * so "unchanged" here is "unchanged" there.
 */

export interface FieldChange {
  /** "name", "thrusters.T3.service_interval_h", "vessels". */
  path: string;
  /** Written for people; null when the field or unit did not exist before / does not exist after. */
  before: string | null;
  after: string | null;
}

export interface EntityDiff {
  key: string;
  status: 'created' | 'updated' | 'unchanged';
  changes: FieldChange[];
}

export interface RegisterDiff {
  vessels: EntityDiff[];
  campaigns: EntityDiff[];
  /** Stored but not in the file: an import leaves them as they are. */
  notInFile: { vessels: string[]; campaigns: string[] };
}

type Plain = null | boolean | number | string | Plain[] | { [k: string]: Plain };

const show = (v: Plain | undefined): string | null =>
  v === undefined ? null : Array.isArray(v) ? `[${v.map((x) => show(x)).join(', ')}]` : v !== null && typeof v === 'object' ? JSON.stringify(v) : String(v);

const same = (a: Plain | undefined, b: Plain | undefined) => JSON.stringify(a) === JSON.stringify(b);

/** Lists of units (thrusters, buses, refs) compare by id; anything else compares whole. */
function isUnitList(v: Plain | undefined): v is { id: string }[] {
  return Array.isArray(v) && v.every((x) => x !== null && typeof x === 'object' && !Array.isArray(x) && typeof x.id === 'string');
}

function diffObject(before: Record<string, Plain>, after: Record<string, Plain>, prefix = ''): FieldChange[] {
  const changes: FieldChange[] = [];
  const keys = [...new Set([...Object.keys(after), ...Object.keys(before)])];
  for (const k of keys) {
    const b = before[k];
    const a = after[k];
    const path = prefix + k;
    if (same(b, a)) continue;
    if (isUnitList(b ?? []) && isUnitList(a ?? []) && (Array.isArray(a) || Array.isArray(b))) {
      const bl = new Map(((b ?? []) as { id: string }[]).map((u) => [u.id, u as unknown as Record<string, Plain>]));
      const al = new Map(((a ?? []) as { id: string }[]).map((u) => [u.id, u as unknown as Record<string, Plain>]));
      for (const id of [...new Set([...al.keys(), ...bl.keys()])].sort()) {
        const bu = bl.get(id);
        const au = al.get(id);
        if (!bu) changes.push({ path: `${path}.${id}`, before: null, after: 'added' });
        else if (!au) changes.push({ path: `${path}.${id}`, before: 'registered', after: 'removed from the register (its telemetry is kept)' });
        else changes.push(...diffObject(bu, au, `${path}.${id}.`));
      }
      continue;
    }
    changes.push({ path, before: show(b), after: show(a) });
  }
  return changes;
}

type Stored = FleetFile;

const vesselState = (v: FleetFile['vessels'][number]): Record<string, Plain> => comparableVessel(v);
const campaignState = (c: FleetFile['campaigns'][number]): Record<string, Plain> => comparableCampaign(c);

function diffEntities<T extends { key: string }>(
  stored: readonly T[],
  file: readonly T[],
  state: (x: T) => Record<string, Plain>,
): EntityDiff[] {
  const byKey = new Map(stored.map((s) => [s.key, s]));
  return file.map((f) => {
    const s = byKey.get(f.key);
    if (!s) return { key: f.key, status: 'created', changes: diffObject({}, state(f)) };
    const changes = diffObject(state(s), state(f));
    return { key: f.key, status: changes.length === 0 ? 'unchanged' : 'updated', changes };
  });
}

export function registerDiff(stored: Stored, file: FleetFile): RegisterDiff {
  const fileVessels = new Set(file.vessels.map((v) => v.key));
  const fileCampaigns = new Set(file.campaigns.map((c) => c.key));
  return {
    vessels: diffEntities(stored.vessels, file.vessels, vesselState),
    campaigns: diffEntities(stored.campaigns, file.campaigns, campaignState),
    notInFile: {
      vessels: stored.vessels.map((v) => v.key).filter((k) => !fileVessels.has(k)),
      campaigns: stored.campaigns.map((c) => c.key).filter((k) => !fileCampaigns.has(k)),
    },
  };
}

export function diffCounts(diff: RegisterDiff): Record<'vessels' | 'campaigns', Record<EntityDiff['status'], number>> {
  const countOf = (list: EntityDiff[]) => ({
    created: list.filter((e) => e.status === 'created').length,
    updated: list.filter((e) => e.status === 'updated').length,
    unchanged: list.filter((e) => e.status === 'unchanged').length,
  });
  return { vessels: countOf(diff.vessels), campaigns: countOf(diff.campaigns) };
}
