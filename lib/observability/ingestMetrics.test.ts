import { describe, expect, it } from 'vitest';
import { IngestMetrics, type IngestSources, type IngestTotals } from './ingestMetrics';

function fakeWorker(processMetrics = false) {
  const totals: IngestTotals = { messages: 0, byReason: {}, byStream: {} };
  const state = { bufferRows: 0, unacknowledged: 0, connected: true };
  const sources: IngestSources = {
    totals: () => totals,
    bufferRows: () => state.bufferRows,
    unacknowledged: () => state.unacknowledged,
    brokerConnected: () => state.connected,
  };
  return { totals, state, metrics: new IngestMetrics(sources, { processMetrics }) };
}

/** Value of one series, read through the registry as a scrape reads it. */
async function value(metrics: IngestMetrics, name: string, labels: Record<string, string> = {}): Promise<number | undefined> {
  const metric = metrics.registry.getSingleMetric(name);
  if (!metric) throw new Error(`no metric ${name}`);
  const { values } = await metric.get();
  const same = (got: object) => JSON.stringify(Object.entries(got).sort()) === JSON.stringify(Object.entries(labels).sort());
  return values.find((v) => same(v.labels))?.value;
}

describe('IngestMetrics', () => {
  it('counts what the handler totals gained, per stream and reason, however often it is read', async () => {
    const { totals, metrics } = fakeWorker();
    totals.messages = 3;
    totals.byStream.station = { inserted: 5, duplicates: 1 };
    totals.byReason.invalid_json = 1;
    await metrics.text();
    await metrics.text(); // a second scrape adds nothing
    expect(await value(metrics, 'holdfast_ingest_messages_total')).toBe(3);
    expect(await value(metrics, 'holdfast_ingest_rows_stored_total', { stream: 'station' })).toBe(5);
    expect(await value(metrics, 'holdfast_ingest_duplicates_total', { stream: 'station' })).toBe(1);
    expect(await value(metrics, 'holdfast_ingest_rejected_total', { reason: 'invalid_json' })).toBe(1);

    totals.messages = 4;
    totals.byStream.station = { inserted: 7, duplicates: 1 };
    totals.byStream.thrusters = { inserted: 2, duplicates: 0 };
    totals.byReason.store_rejected = 2; // stored outside a reported flush: still counted
    metrics.observeFlush({ rows: 4, commitSeconds: 0.01, lagSeconds: [] });
    expect(await value(metrics, 'holdfast_ingest_messages_total')).toBe(4);
    expect(await value(metrics, 'holdfast_ingest_rows_stored_total', { stream: 'station' })).toBe(7);
    expect(await value(metrics, 'holdfast_ingest_rows_stored_total', { stream: 'thrusters' })).toBe(2);
    expect(await value(metrics, 'holdfast_ingest_rejected_total', { reason: 'store_rejected' })).toBe(2);
  });

  it('shows every stream and reason at 0 before anything arrives', async () => {
    const { metrics } = fakeWorker();
    const text = await metrics.text();
    for (const stream of ['station', 'thrusters', 'power', 'refs', 'track']) {
      expect(text).toContain(`holdfast_ingest_rows_stored_total{stream="${stream}"} 0`);
      expect(text).toContain(`holdfast_ingest_duplicates_total{stream="${stream}"} 0`);
    }
    expect(text).toContain('holdfast_ingest_rejected_total{reason="future_timestamp"} 0');
    expect(text).toContain('holdfast_ingest_rejected_total{reason="store_rejected"} 0');
  });

  it('observes batch size, commit time and lag per flush; a lag below 0 (clock skew) counts as 0', async () => {
    const { metrics } = fakeWorker();
    metrics.observeFlush({ rows: 120, commitSeconds: 0.02, lagSeconds: [2 * 86_400, -3] });
    metrics.observeFlush({ rows: 1, commitSeconds: 0.004, lagSeconds: [30] });
    const text = await metrics.text();
    expect(text).toContain('holdfast_ingest_batch_rows_count 2');
    expect(text).toContain('holdfast_ingest_batch_rows_sum 121');
    expect(text).toContain('holdfast_ingest_commit_seconds_count 2');
    expect(text).toContain('holdfast_ingest_lag_seconds_count 3');
    expect(text).toContain(`holdfast_ingest_lag_seconds_sum ${2 * 86_400 + 30}`);
    expect(text).toContain('holdfast_ingest_lag_seconds_bucket{le="1"} 1'); // the skewed one
    expect(text).toContain(`holdfast_ingest_lag_seconds_bucket{le="${3 * 86_400}"} 3`); // a two-day backlog has a bucket
  });

  it('reads buffer depth, unacknowledged messages and the broker connection at scrape time', async () => {
    const { state, metrics } = fakeWorker();
    state.bufferRows = 250;
    state.unacknowledged = 7;
    state.connected = false;
    const text = await metrics.text();
    expect(text).toMatch(/^holdfast_ingest_buffer_rows 250$/m);
    expect(text).toMatch(/^holdfast_ingest_unacknowledged_messages 7$/m);
    expect(text).toMatch(/^holdfast_ingest_broker_connected 0$/m);
  });

  it('keeps a registry per instance, process metrics included', async () => {
    const a = fakeWorker(true).metrics;
    const b = fakeWorker(true).metrics; // a second registry: no "already registered" clash
    expect(a.registry).not.toBe(b.registry);
    expect(await a.text()).toMatch(/^process_resident_memory_bytes \d+/m);
    expect(b.contentType).toMatch(/^text\/plain/);
  });
});
