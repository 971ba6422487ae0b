/**
 * Who may publish and subscribe where, as pure functions over topic levels.
 * The embedded broker applies them (embeddedAccess.ts); the Mosquitto ACL
 * file says the same in Mosquitto's words (mosquittoFiles.ts).
 *
 * - A vessel publishes only `{root}/{its own key}/{stream}`: exactly three
 *   parts after the root's, its key in the middle (telemetry-v1: "the
 *   topic's vessel is the only source of identity"). It subscribes to
 *   nothing: shore sends it nothing, and it must not read other vessels.
 * - The ingest worker subscribes under `{root}/`, also through a shared
 *   subscription `$share/{group}/…` (MQTT 5, 4.8.2), and publishes nothing.
 * - The demo publisher of `npm start` plays every vessel of the demo fleet,
 *   so it may publish `{root}/{any key}/{stream}`; it exists only inside the
 *   embedded broker, with a password made at each start.
 *
 * The stream part is any one level: unknown streams reach the worker, which
 * quarantines them, as it does records of unregistered vessels.
 */

export type BrokerRole = { kind: 'vessel'; vesselKey: string } | { kind: 'ingest' } | { kind: 'publisher' };

const VESSEL_KEY = /^[a-z0-9][a-z0-9-]{1,31}$/;

function levels(topic: string): string[] {
  return topic.split('/');
}

function startsWithRoot(parts: readonly string[], root: readonly string[]): boolean {
  return root.length <= parts.length && root.every((level, i) => parts[i] === level);
}

/** A concrete topic level: not empty, no wildcard. */
function isPlainLevel(level: string): boolean {
  return level.length > 0 && !level.includes('+') && !level.includes('#');
}

export function mayPublish(role: BrokerRole, topic: string, topicRoot: string): boolean {
  if (role.kind === 'ingest') return false;
  const parts = levels(topic);
  const root = levels(topicRoot);
  if (!startsWithRoot(parts, root) || parts.length !== root.length + 2) return false;
  const [vessel, stream] = parts.slice(root.length) as [string, string];
  if (!isPlainLevel(stream) || !VESSEL_KEY.test(vessel)) return false;
  return role.kind === 'publisher' || vessel === role.vesselKey;
}

export function maySubscribe(role: BrokerRole, filter: string, topicRoot: string): boolean {
  if (role.kind !== 'ingest') return false;
  let parts = levels(filter);
  // `$share/{group}/{filter}`: the group name is one level, then the real filter.
  if (parts[0] === '$share') {
    if (parts.length < 3 || !isPlainLevel(parts[1]!)) return false;
    parts = parts.slice(2);
  }
  const root = levels(topicRoot);
  // The root levels themselves must be written out: "+/v1/#" would reach other roots.
  return startsWithRoot(parts, root) && parts.length > root.length;
}
