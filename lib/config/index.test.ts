import { describe, expect, it } from 'vitest';
import { ConfigError, loadConfig } from './index';

describe('loadConfig', () => {
  it('applies the documented defaults to an empty environment', () => {
    const c = loadConfig({});
    expect(c.DATABASE_URL).toBeUndefined();
    expect(c.MQTT_URL).toBeUndefined();
    expect(c).toMatchObject({
      MQTT_TOPIC_ROOT: 'fleet/v1',
      PORT: 3000,
      HOLDFAST_DATA_DIR: './.holdfast',
      FLEET_TIME_ZONE: 'UTC',
      HOLDFAST_STORE: 'auto',
      HOLDFAST_EMBEDDED_MQTT_PORT: 1884,
      HOLDFAST_DEMO: true,
      HOLDFAST_TRUST_PROXY: false,
      HOLDFAST_METRICS_PORT: 9464,
      LOG_FORMAT: 'auto',
    });
    expect(c.MQTT_SHARED_GROUP).toBeUndefined();
  });

  it('reads the demo settings: 60 days of history and seed 1 by default', () => {
    expect(loadConfig({})).toMatchObject({ HOLDFAST_DEMO_HISTORY_DAYS: 60, HOLDFAST_DEMO_SEED: 1, HOLDFAST_DEMO_INTERVAL_S: 10 });
    expect(loadConfig({ HOLDFAST_DEMO_HISTORY_DAYS: '3', HOLDFAST_DEMO_SEED: '42' })).toMatchObject({ HOLDFAST_DEMO_HISTORY_DAYS: 3, HOLDFAST_DEMO_SEED: 42 });
    expect(() => loadConfig({ HOLDFAST_DEMO_SEED: '-1' })).toThrow('Setting HOLDFAST_DEMO_SEED: must be a whole number from 0 to 4294967295 (got "-1")');
  });

  it('reads the observability and shared-subscription settings', () => {
    const c = loadConfig({ HOLDFAST_METRICS_PORT: '0', LOG_FORMAT: 'json', MQTT_SHARED_GROUP: 'ingest-north' });
    expect(c.HOLDFAST_METRICS_PORT).toBe(0); // 0 turns the status server off
    expect(c.LOG_FORMAT).toBe('json');
    expect(c.MQTT_SHARED_GROUP).toBe('ingest-north');
  });

  it('treats an empty string as unset', () => {
    expect(loadConfig({ DATABASE_URL: '', PORT: '' }).DATABASE_URL).toBeUndefined();
    expect(loadConfig({ PORT: '' }).PORT).toBe(3000);
  });

  it('coerces numbers and accepts real URLs and zones', () => {
    const c = loadConfig({
      PORT: '8080',
      DATABASE_URL: 'postgres://postgres@127.0.0.1:5432/test',
      MQTT_URL: 'mqtt://127.0.0.1:1883',
      FLEET_TIME_ZONE: 'Europe/Oslo',
      HOLDFAST_DEMO: 'off',
    });
    expect(c.PORT).toBe(8080);
    expect(c.FLEET_TIME_ZONE).toBe('Europe/Oslo');
    expect(c.HOLDFAST_DEMO).toBe(false);
  });

  it.each([
    [{ PORT: 'abc' }, 'Setting PORT: must be a whole number from 1 to 65535 (got "abc")'],
    [{ PORT: '70000' }, 'Setting PORT: must be a whole number from 1 to 65535 (got "70000")'],
    [{ FLEET_TIME_ZONE: 'Mars/Olympus' }, 'Setting FLEET_TIME_ZONE: must be an IANA time zone name'],
    [{ DATABASE_URL: 'mysql://x' }, 'Setting DATABASE_URL: must be a postgres:// or postgresql:// URL'],
    [{ MQTT_URL: 'http://x' }, 'Setting MQTT_URL: must be an mqtt://'],
    [{ MQTT_TOPIC_ROOT: 'fleet/#' }, 'Setting MQTT_TOPIC_ROOT: must be a topic prefix without wildcards'],
    [{ HOLDFAST_STORE: 'mongo' }, 'Setting HOLDFAST_STORE: must be auto, timescale or partitions'],
    [{ HOLDFAST_METRICS_PORT: '-1' }, 'Setting HOLDFAST_METRICS_PORT: must be a whole number from 0 (off) to 65535 (got "-1")'],
    [{ LOG_FORMAT: 'xml' }, 'Setting LOG_FORMAT: must be auto, json or text (got "xml")'],
    [{ MQTT_SHARED_GROUP: 'a/b' }, 'Setting MQTT_SHARED_GROUP: must be a group name of 1 to 64 characters without "/", "+" or "#"'],
    [{ MQTT_SHARED_GROUP: 'all+' }, 'Setting MQTT_SHARED_GROUP: must be a group name'],
    [{ MQTT_SHARED_GROUP: '#' }, 'Setting MQTT_SHARED_GROUP: must be a group name'],
  ])('rejects %o with one line naming the setting', (env, message) => {
    let error: unknown;
    try {
      loadConfig(env);
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(ConfigError);
    expect((error as Error).message).toContain(message);
    expect((error as Error).message).not.toContain('\n');
  });
});
