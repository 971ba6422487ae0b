import { spawn } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { createInterface } from 'node:readline';
import { createReadStream } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFleetFile } from '../lib/register/fleetFile';
import { parsePayload } from '../lib/telemetry/parsePayload';
import { parseTopic } from '../lib/telemetry/topic';
import type { GroundTruthFile } from '../seed/scenarios/groundTruth';
import { buildPlan } from '../seed/scenarios/plan';

/**
 * `npm run demo -- backfill --out FILE.ndjson` end to end: a small fleet
 * (six demo vessels, one per seeded fault) over three days. The ground-truth
 * file beside the data lists every fault the plan seeded, and every message
 * passes the ingest worker's own topic and payload parsing: nothing would be
 * quarantined.
 */
const VESSELS = ['vardel-tern', 'osk-meridian', 'corvath-pioneer', 'brisen-aurora', 'mirrick-swift', 'saltery-venture'];
const DAYS = 3;
const FROM = '2026-10-20';
const SEED = 5;

describe('demo backfill to NDJSON', () => {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'holdfast-demo-'));
  const out = path.join(dir, 'fleet.ndjson');
  let stderr = '';
  let code: number | null = null;

  beforeAll(async () => {
    const child = spawn(
      process.execPath,
      ['--import', 'tsx', 'seed/cli.ts', 'backfill', '--days', String(DAYS), '--from', FROM, '--seed', String(SEED), '--vessels', VESSELS.join(','), '--out', out, '--workers', '2', '--root', 'demo-test/v1'],
      { env: { ...process.env, LOG_LEVEL: 'warn' } },
    );
    child.stderr.on('data', (d) => (stderr += d));
    code = await new Promise((resolve) => child.once('exit', resolve));
  }, 240_000);
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('finishes, with a progress bar on stderr', () => {
    expect(code, stderr).toBe(0);
    expect(stderr).toMatch(/backfill █+ 100%  18\/18 vessel-days/);
  });

  it('writes a ground-truth file beside the data that lists every seeded fault', () => {
    const truth = JSON.parse(readFileSync(path.join(dir, 'fleet.ground-truth.json'), 'utf8')) as GroundTruthFile;
    const fleet = readFleetFile(readFileSync('seed/fleet.json', 'utf8'));
    const plan = buildPlan({ vessels: fleet.vessels.filter((v) => VESSELS.includes(v.key)) }, SEED, Date.parse(`${FROM}T00:00:00Z`), DAYS);
    expect(plan.faults.map((f) => f.kind).sort()).toEqual(['controller_detune', 'generator_derate', 'link_outage', 'reference_noise', 'thruster_fouling', 'weather_only']);
    expect(truth).toMatchObject({ v: 1, seed: SEED, history: { from: `${FROM}T00:00:00.000Z`, days: DAYS } });
    for (const f of plan.faults) {
      const listed = truth.entries.filter((e) => e.scenario === f.kind && e.vessel === f.vessel);
      expect(listed.length, `${f.kind} on ${f.vessel}`).toBeGreaterThan(0);
      for (const e of listed) {
        expect(e.subject).toBe(
          f.kind === 'thruster_fouling' ? `thruster:${f.thruster}` : f.kind === 'reference_noise' ? `ref:${f.ref}` : 'vessel',
        );
        if (f.kind !== 'link_outage') expect(e.onset_day).toBe(f.onsetDay);
      }
    }
    expect(truth.entries.map((e) => `${e.scenario}:${e.metric}:${e.direction}`).sort()).toEqual([
      'controller_detune:hdg_rms:rising',
      'controller_detune:p95_norm:rising',
      'generator_derate:hdg_rms:rising',
      'generator_derate:limit_events_per_dp_day:rising',
      'generator_derate:p95_norm:rising',
      'link_outage:null:none',
      'reference_noise:sd_m_median:rising',
      'thruster_fouling:efficiency_index:falling',
      'weather_only:p95_norm:none',
    ]);
  });

  it('every message passes the ingest worker’s parsing: nothing quarantined, every interval there once, the outage sent late', async () => {
    const truth = JSON.parse(readFileSync(path.join(dir, 'fleet.ground-truth.json'), 'utf8')) as GroundTruthFile;
    const outage = truth.entries.find((e) => e.scenario === 'link_outage')!;
    const now = new Date();
    const seen = new Map<string, Set<number>>();
    let messages = 0;
    let latest = -Infinity;
    let lateBatches = 0;
    const lines = createInterface({ input: createReadStream(out), crlfDelay: Infinity });
    for await (const line of lines) {
      messages++;
      const { topic, payload } = JSON.parse(line) as { topic: string; payload: unknown };
      const where = parseTopic('demo-test/v1', topic);
      expect(where.ok, topic).toBe(true);
      if (!where.ok) continue;
      expect(VESSELS).toContain(where.vessel);
      const parsed = parsePayload(where.stream, Buffer.from(JSON.stringify(payload)), now);
      expect(parsed.rejected, `${topic}: ${parsed.rejected[0]?.detail}`).toEqual([]);
      expect(payload).toHaveProperty('records');
      const times = parsed.records.map((r) => Date.parse(r.t));
      if (where.stream === 'station') {
        const key = where.vessel;
        const set = seen.get(key) ?? new Set<number>();
        for (const t of times) {
          expect(set.has(t), `${key} ${new Date(t).toISOString()} twice`).toBe(false);
          set.add(t);
        }
        seen.set(key, set);
        // Backlog: older than data of the same vessel already sent.
        if (key === outage.vessel && Math.max(...times) < latest) lateBatches++;
        if (key === outage.vessel) latest = Math.max(latest, ...times);
      }
    }
    expect(messages).toBeGreaterThan(VESSELS.length * DAYS * 4 - 1);
    for (const key of VESSELS) expect(seen.get(key)?.size, key).toBe(DAYS * 1440);
    expect(lateBatches).toBeGreaterThan(0);
  }, 120_000);
});
