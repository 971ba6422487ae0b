import { describe, expect, it } from 'vitest';
import { mayPublish, maySubscribe, type BrokerRole } from './topicAccess';

const ROOT = 'fleet/v1';
const vessel: BrokerRole = { kind: 'vessel', vesselKey: 'vardel-tern' };
const ingest: BrokerRole = { kind: 'ingest' };
const publisher: BrokerRole = { kind: 'publisher' };

describe('mayPublish', () => {
  it('lets a vessel publish every stream under its own key only', () => {
    for (const stream of ['station', 'thrusters', 'power', 'refs', 'track', 'unknown-stream']) {
      expect(mayPublish(vessel, `fleet/v1/vardel-tern/${stream}`, ROOT)).toBe(true);
    }
  });

  it.each([
    ['another vessel', 'fleet/v1/osk-meridian/station'],
    ['a key that only starts like its own', 'fleet/v1/vardel-tern2/station'],
    ['a key its own starts with', 'fleet/v1/vardel/station'],
    ['its own key one level deeper', 'fleet/v1/vardel-tern/station/extra'],
    ['its own key without a stream', 'fleet/v1/vardel-tern'],
    ['an empty stream', 'fleet/v1/vardel-tern/'],
    ['another root', 'fleet/v2/vardel-tern/station'],
    ['a root that only starts like the root', 'fleet/v1x/vardel-tern/station'],
    ['its key in the root position', 'vardel-tern/v1/vardel-tern/station'],
    ['$SYS', '$SYS/broker/clients'],
    ['a leading slash', '/fleet/v1/vardel-tern/station'],
  ])('refuses a vessel publishing to %s', (_, topic) => {
    expect(mayPublish(vessel, topic, ROOT)).toBe(false);
  });

  it('lets the demo publisher play any vessel of the fleet, under the root only', () => {
    expect(mayPublish(publisher, 'fleet/v1/osk-meridian/station', ROOT)).toBe(true);
    expect(mayPublish(publisher, 'fleet/v1/Not_A_Key/station', ROOT)).toBe(false);
    expect(mayPublish(publisher, 'elsewhere/osk-meridian/station', ROOT)).toBe(false);
  });

  it('lets the ingest worker publish nothing', () => {
    expect(mayPublish(ingest, 'fleet/v1/vardel-tern/station', ROOT)).toBe(false);
  });

  it('works with a one-level and a three-level root', () => {
    expect(mayPublish(vessel, 'hf/vardel-tern/station', 'hf')).toBe(true);
    expect(mayPublish(vessel, 'a/b/c/vardel-tern/station', 'a/b/c')).toBe(true);
    expect(mayPublish(vessel, 'a/b/vardel-tern/station', 'a/b/c')).toBe(false);
  });
});

describe('maySubscribe', () => {
  it('lets the ingest worker read under the root, directly or through a shared subscription', () => {
    for (const filter of ['fleet/v1/+/+', 'fleet/v1/#', 'fleet/v1/vardel-tern/station', '$share/workers/fleet/v1/+/+']) {
      expect(maySubscribe(ingest, filter, ROOT), filter).toBe(true);
    }
  });

  it.each(['#', '+/v1/+/+', 'fleet/+/+/+', 'fleet/#', 'fleet/v1', '$share/workers/#', '$share//fleet/v1/+/+', '$share/+/fleet/v1/+/+', '$share/g', '$SYS/#'])(
    'refuses the ingest worker %s',
    (filter) => {
      expect(maySubscribe(ingest, filter, ROOT)).toBe(false);
    },
  );

  it('lets vessels and the demo publisher read nothing, not even their own topic', () => {
    for (const role of [vessel, publisher]) {
      for (const filter of ['fleet/v1/vardel-tern/station', 'fleet/v1/+/+', '#']) expect(maySubscribe(role, filter, ROOT)).toBe(false);
    }
  });
});
