import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';
import type { NextServer } from './helpers/nextServer';
import { sharedBuild, startWeb } from './e2e/harness';
import { signInAs } from './e2e/signIn';
import { parseCsv } from './apiHelpers';
import {
  ALPHA_LAST_SEEN,
  buildProbeWorld,
  CAMPAIGNS,
  FIRST_DAY,
  FLAGS,
  forbiddenText,
  LAST_DAY,
  probeCallers,
  probeToken,
  seesCampaign,
  seesFlag,
  VESSELS,
  visibleDays,
  visibleVessels,
  type FlagName,
  type ProbeCaller,
  type ProbeVessel,
} from './probeFixture';

/**
 * Issue 8, must-show 1: every page and API route — CSV and PDF exports and
 * the flag actions included — called over HTTP against the real web app, as
 * each role (a signed-in user and an API token of each), as a charterer of
 * one campaign and as a charterer of another, and without credentials. Each
 * answer is compared with the answer key of test/probeFixture.ts, written
 * out by hand: no vessel, campaign or flag of another tenant, and no day
 * outside the campaign dates, in any answer.
 */

const RANGE = `from=${FIRST_DAY}&to=${LAST_DAY}`;
const LIVE: FlagName[] = (Object.keys(FLAGS) as FlagName[]).filter((f) => FLAGS[f].status !== 'closed');
const isStaff = (c: ProbeCaller) => c.role !== 'charterer';

interface Credentials {
  caller: ProbeCaller;
  headers: Record<string, string>;
  /** A user's address (what the audit log names). */
  email?: string;
}

describe('access-control probe: every route, every role', () => {
  let db: TestDatabase;
  let server: NextServer;
  let flagIds: Record<FlagName, number>;
  const callers: Credentials[] = [];

  const get = (path: string, headers: Record<string, string> = {}) => fetch(`${server.url}${path}`, { redirect: 'manual', headers });
  /**
   * Every answer body to a charterer is searched for what it must never
   * contain — except what the caller itself put in the path (a 404 names the
   * key it was asked for, as it does for a key that does not exist).
   */
  const expectNoLeak = (caller: ProbeCaller, path: string, body: string) => {
    for (const text of forbiddenText(caller).filter((t) => !path.includes(t))) {
      expect(body.includes(text), `${caller.name}: ${path} mentions ${text}`).toBe(false);
    }
  };

  beforeAll(async () => {
    db = await createMigratedDatabase();
    ({ flagIds } = await buildProbeWorld(db.url, db.pool));
    await sharedBuild();
    server = await startWeb(db.url);
    for (const caller of probeCallers()) {
      if (caller.kind === 'token') {
        callers.push({ caller, headers: { authorization: `Bearer ${await probeToken(db.pool, caller)}` } });
      } else {
        const organisation = caller.tenant ? `probe-org-${caller.tenant}` : undefined;
        const user = await signInAs(server, db.pool, caller.role, organisation);
        callers.push({ caller, headers: { cookie: user.cookie }, email: user.email });
      }
    }
  }, 600_000);
  afterAll(async () => {
    await server?.stop();
    await db?.drop();
  });

  const users = () => callers.filter((c) => c.caller.kind === 'user');

  describe('pages, as each signed-in user', () => {
    /** Pages every role may open; `expect` checks the answer of one caller. */
    it('fleet ranking and reception: the whole fleet for shore roles; a charterer is sent to its campaigns', async () => {
      for (const { caller, headers } of users()) {
        for (const path of ['/', '/reception']) {
          const response = await get(path, headers);
          if (isStaff(caller)) {
            expect(response.status, `${caller.name} ${path}`).toBe(200);
            const html = await response.text();
            for (const v of VESSELS) expect(html, `${caller.name} ${path}`).toContain(v);
          } else {
            expect(response.status, `${caller.name} ${path}`).toBe(307);
            expect(new URL(response.headers.get('location')!, server.url).pathname).toBe('/campaigns');
          }
        }
      }
    });

    it('vessel pages: 404 for a vessel out of scope, and only the visible days of the others', async () => {
      for (const { caller, headers } of users()) {
        for (const vessel of VESSELS) {
          const path = `/vessels/${vessel}?${RANGE}`;
          const response = await get(path, headers);
          const html = await response.text();
          if (!visibleVessels(caller).includes(vessel)) {
            expect(response.status, `${caller.name} ${path}`).toBe(404);
          } else {
            expect(response.status, `${caller.name} ${path}`).toBe(200);
            const days = [...html.matchAll(/data-testid="daily-row" data-day="(\d{4}-\d{2}-\d{2})"/g)].map((m) => m[1]).sort();
            expect(days, `${caller.name} ${path}`).toEqual(visibleDays(caller, vessel));
            const shownFlags = [...html.matchAll(/data-testid="vessel-flag" data-flag-id="(\d+)"/g)].map((m) => Number(m[1])).sort();
            const expected = (Object.keys(FLAGS) as FlagName[]).filter((f) => FLAGS[f].vessel === vessel && seesFlag(caller, f)).map((f) => flagIds[f]);
            expect(shownFlags, `${caller.name} ${path} flags`).toEqual(expected.sort());
          }
          expectNoLeak(caller, path, html);
        }
      }
    });

    it('watchlist: the live flags each may see; action forms only for roles that may act', async () => {
      for (const { caller, headers } of users()) {
        const response = await get('/watchlist', headers);
        expect(response.status, caller.name).toBe(200);
        const html = await response.text();
        const ids = [...html.matchAll(/data-testid="flag-card" data-flag-id="(\d+)"/g)].map((m) => Number(m[1])).sort();
        expect(ids, caller.name).toEqual(LIVE.filter((f) => seesFlag(caller, f)).map((f) => flagIds[f]).sort());
        expect(html.includes('data-testid="acknowledge-form"'), caller.name).toBe(isStaff(caller));
        expectNoLeak(caller, '/watchlist', html);
      }
    });

    it('campaigns, campaign reports, and their CSV and PDF downloads: only the caller’s campaigns', async () => {
      for (const { caller, headers } of users()) {
        const list = await get('/campaigns', headers);
        expect(list.status).toBe(200);
        const listed = [...(await list.text()).matchAll(/data-testid="campaign-row" data-campaign-key="([^"]+)"/g)].map((m) => m[1]).sort();
        expect(listed, caller.name).toEqual(Object.values(CAMPAIGNS).filter((k) => seesCampaign(caller, k)).sort());
        for (const key of Object.values(CAMPAIGNS)) {
          for (const suffix of ['', '/report.csv', '/report.pdf']) {
            const path = `/campaigns/${key}${suffix}`;
            const response = await get(path, headers);
            expect(response.status, `${caller.name} ${path}`).toBe(seesCampaign(caller, key) ? 200 : 404);
            const body = Buffer.from(await response.arrayBuffer()).toString('latin1');
            if (response.status === 200 && suffix === '/report.pdf') expect(body.startsWith('%PDF-')).toBe(true);
            if (response.status === 200 && suffix === '/report.csv') {
              const vessels = parseCsv(body).slice(1).map((r) => r[0]).sort();
              expect(vessels, `${caller.name} ${path}`).toEqual(key === CAMPAIGNS.own ? ['probe-alpha', 'probe-bravo'] : ['probe-bravo', 'probe-charlie']);
            }
            expectNoLeak(caller, path, body);
          }
        }
      }
    });

    it('admin pages: fleet managers and admins; webhooks and access for admins only; 404 for the rest', async () => {
      const allowed: Record<string, string[]> = {
        '/admin': ['admin', 'fleet_manager'],
        '/admin/register': ['admin', 'fleet_manager'],
        '/admin/campaigns': ['admin', 'fleet_manager'],
        '/admin/webhooks': ['admin'],
        '/admin/access': ['admin'],
      };
      for (const { caller, headers } of users()) {
        for (const [path, roles] of Object.entries(allowed)) {
          const response = await get(path, headers);
          expect(response.status, `${caller.name} ${path}`).toBe(roles.includes(caller.role) ? 200 : 404);
          expectNoLeak(caller, path, await response.text());
        }
      }
    });
  });

  describe('the JSON API, as each user (session cookie) and each token (bearer)', () => {
    const json = async (path: string, headers: Record<string, string>, status = 200) => {
      const response = await get(`/api/v1${path}`, headers);
      const text = await response.text();
      expect(response.status, `${path}: ${text.slice(0, 200)}`).toBe(status);
      return JSON.parse(text);
    };

    it('GET /vessels (JSON and CSV): the visible vessels, last_seen and open_flags as each may see them', async () => {
      for (const { caller, headers } of callers) {
        const body = await json('/vessels', headers);
        expect(body.vessels.map((v: { key: string }) => v.key), caller.name).toEqual(visibleVessels(caller));
        for (const v of body.vessels as { key: ProbeVessel; last_seen: string | null; open_flags: number }[]) {
          expect(v.last_seen, `${caller.name} ${v.key}`).toBe(v.key === 'probe-alpha' ? ALPHA_LAST_SEEN : null);
          const open = LIVE.filter((f) => FLAGS[f].vessel === v.key && seesFlag(caller, f)).length;
          expect(v.open_flags, `${caller.name} ${v.key}`).toBe(open);
        }
        const csv = await get('/api/v1/vessels?format=csv', headers);
        const text = await csv.text();
        expect(parseCsv(text).slice(1).map((r) => r[0]), caller.name).toEqual(visibleVessels(caller));
        expectNoLeak(caller, '/api/v1/vessels', JSON.stringify(body) + text);
      }
    });

    it('daily, thruster and reference-system days (JSON and CSV): 404 out of scope, else only the visible days', async () => {
      for (const { caller, headers } of callers) {
        for (const vessel of VESSELS) {
          for (const kind of ['daily', 'thrusters/daily', 'refs/daily']) {
            const path = `/vessels/${vessel}/${kind}?${RANGE}`;
            const sees = visibleVessels(caller).includes(vessel);
            const body = await json(path, headers, sees ? 200 : 404);
            if (!sees) {
              // The same answer as for a key that does not exist: nothing tells the vessel is there.
              const unknown = await json(path.replace(vessel, 'probe-nowhere'), headers, 404);
              expect(JSON.stringify(body)).toBe(JSON.stringify(unknown).replaceAll('probe-nowhere', vessel));
              continue;
            }
            const days = [...new Set((body.days as { day: string }[]).map((d) => d.day))].sort();
            expect(days, `${caller.name} ${path}`).toEqual(visibleDays(caller, vessel));
            const csv = parseCsv(await (await get(`/api/v1${path}&format=csv`, headers)).text());
            const dayColumn = csv[0]!.indexOf('day');
            expect([...new Set(csv.slice(1).map((r) => r[dayColumn]!))].sort(), `${caller.name} ${path} csv`).toEqual(visibleDays(caller, vessel));
          }
        }
      }
    });

    it('thruster wear totals: shore roles only (403 for a charterer’s own vessel, 404 for another’s)', async () => {
      for (const { caller, headers } of callers) {
        for (const vessel of VESSELS) {
          const status = isStaff(caller) ? 200 : visibleVessels(caller).includes(vessel) ? 403 : 404;
          await json(`/vessels/${vessel}/thrusters`, headers, status);
        }
      }
    });

    it('GET /flags (JSON and CSV, every status, per vessel): the flags each may see; 404 for a vessel out of scope', async () => {
      for (const { caller, headers } of callers) {
        const body = await json('/flags?status=all', headers);
        const ids = (body.flags as { id: number }[]).map((f) => f.id).sort();
        const expected = (Object.keys(FLAGS) as FlagName[]).filter((f) => seesFlag(caller, f)).map((f) => flagIds[f]).sort();
        expect(ids, caller.name).toEqual(expected);
        const csv = parseCsv(await (await get('/api/v1/flags?status=all&format=csv', headers)).text());
        expect(csv.slice(1).map((r) => Number(r[0])).sort(), `${caller.name} csv`).toEqual(expected);
        for (const vessel of VESSELS) {
          const sees = visibleVessels(caller).includes(vessel);
          const one = await json(`/flags?status=all&vessel=${vessel}`, headers, sees ? 200 : 404);
          if (sees) {
            const mine = (Object.keys(FLAGS) as FlagName[]).filter((f) => FLAGS[f].vessel === vessel && seesFlag(caller, f)).map((f) => flagIds[f]).sort();
            expect((one.flags as { id: number }[]).map((f) => f.id).sort(), `${caller.name} ${vessel}`).toEqual(mine);
          }
        }
        expectNoLeak(caller, '/api/v1/flags', JSON.stringify(body));
      }
    });

    it('campaign reports (JSON and CSV): 404 for another tenant’s campaign', async () => {
      for (const { caller, headers } of callers) {
        for (const key of Object.values(CAMPAIGNS)) {
          const sees = seesCampaign(caller, key);
          const body = await json(`/campaigns/${key}/report`, headers, sees ? 200 : 404);
          if (sees) expect(body.campaign.key).toBe(key);
          expect((await get(`/api/v1/campaigns/${key}/report?format=csv`, headers)).status).toBe(sees ? 200 : 404);
          expectNoLeak(caller, `/api/v1/campaigns/${key}/report`, JSON.stringify(body));
        }
      }
    });
  });

  describe('without credentials', () => {
    it('every page redirects to /signin; every API route answers 401; downloads are not served', async () => {
      const pages = ['/', '/reception', '/watchlist', '/campaigns', `/campaigns/${CAMPAIGNS.own}`, `/campaigns/${CAMPAIGNS.own}/report.csv`,
        `/campaigns/${CAMPAIGNS.own}/report.pdf`, `/vessels/probe-alpha`, '/admin', '/admin/register', '/admin/campaigns', '/admin/webhooks', '/admin/access'];
      for (const path of pages) {
        const response = await get(path);
        expect(response.status, path).toBe(307);
        expect(new URL(response.headers.get('location')!, server.url).pathname, path).toBe('/signin');
      }
      const api = ['/vessels', '/vessels/probe-alpha/daily', '/vessels/probe-alpha/thrusters/daily', '/vessels/probe-alpha/refs/daily',
        '/vessels/probe-alpha/thrusters', '/flags', `/campaigns/${CAMPAIGNS.own}/report`, '/vessels?format=csv'];
      for (const path of api) {
        const response = await get(`/api/v1${path}`);
        expect(response.status, path).toBe(401);
        expect(await response.json()).toMatchObject({ error: { code: 'unauthorized' } });
      }
      // A bearer token is for the API only: a page does not take it.
      const token = callers.find((c) => c.caller.kind === 'token' && c.caller.role === 'admin')!;
      expect((await get('/watchlist', token.headers)).status).toBe(307);
      // The sign-in page itself is open, and sends a signed-in user on.
      expect((await get('/signin')).status).toBe(200);
      expect((await get('/signin', users()[0]!.headers)).status).toBe(307);
    });
  });

  describe('flag actions (the watchlist forms, posted as the browser posts them without scripts)', () => {
    /** The hidden fields of a form on a page: Next.js' action reference and the CSRF token. */
    const hiddenFields = (formHtml: string): [string, string][] =>
      [...formHtml.matchAll(/<input type="hidden" name="([^"]+)"(?: value="([^"]*)")?\s*\/?>/g)].map((m) => [decode(m[1]!), decode(m[2] ?? '')]);
    const decode = (s: string) => s.replaceAll('&quot;', '"').replaceAll('&#x27;', "'").replaceAll('&lt;', '<').replaceAll('&gt;', '>').replaceAll('&amp;', '&');
    const csrfOf = async (headers: Record<string, string>) => /name="csrf_token" value="([^"]+)"/.exec(await (await get('/campaigns', headers)).text())![1]!;

    /** A form (by test id) as `role`'s page renders it; with `flagId`, the one of that flag. */
    const actionForm = async (path: string, testId: string, role: string, flagId?: number) => {
      const viewer = users().find((c) => c.caller.role === role)!;
      const html = await (await get(path, viewer.headers)).text();
      // Forms may stream in after their cards (React fills placeholders), so each is found by the flag id it carries.
      const forms = [...html.matchAll(new RegExp(`<form[^>]*data-testid="${testId}"[^>]*>([\\s\\S]*?)</form>`, 'g'))].map((m) => m[1]!);
      const form = flagId === undefined ? forms[0] : forms.find((f) => f.includes(`name="id" value="${flagId}"`));
      expect(form, `${testId} on ${path}`).toBeDefined();
      expect(form).toContain('name="csrf_token"');
      return hiddenFields(form!);
    };
    const acknowledgeForm = (flagId: number) => actionForm('/watchlist', 'acknowledge-form', 'shore_engineer', flagId);
    /** The form's fields with the caller's own CSRF token in place of the viewer's. */
    const asCaller = (form: [string, string][], csrf: string) => form.map(([k, v]): [string, string] => [k, k === 'csrf_token' ? csrf : v]);

    const post = async (path: string, fields: [string, string][], headers: Record<string, string>) => {
      const form = new FormData();
      for (const [k, v] of fields) form.append(k, v);
      return fetch(`${server.url}${path}`, { method: 'POST', body: form, redirect: 'manual', headers: { origin: server.url, 'sec-fetch-site': 'same-origin', ...headers } });
    };
    const status = async (id: number) => (await db.pool.query<{ status: string }>('SELECT status FROM flag WHERE id = $1', [id])).rows[0]!.status;
    const reopen = (id: number) => db.pool.query(`UPDATE flag SET status = 'open', acknowledged_by = NULL, acknowledged_at = NULL, acknowledge_note = NULL WHERE id = $1`, [id]);

    it('acknowledging: shore engineers, fleet managers and admins may; charterers may not, even a flag they see', async () => {
      const id = flagIds.inside; // seen by the own charterer too
      const form = await acknowledgeForm(id);
      for (const { caller, headers } of users()) {
        const fields = asCaller(form, await csrfOf(headers));
        const response = await post('/watchlist', [...fields, ['note', `checked by ${caller.name}`]], headers);
        expect(response.status, caller.name).toBeLessThan(500);
        expect(await status(id), caller.name).toBe(isStaff(caller) ? 'acknowledged' : 'open');
        const { rows } = await db.pool.query(`SELECT count(*)::int AS n FROM audit_log WHERE action = 'flag.acknowledge' AND subject = $1 AND detail->>'note' = $2`, [
          `flag ${id}`,
          `checked by ${caller.name}`,
        ]);
        expect(rows[0].n, `${caller.name} audit`).toBe(isStaff(caller) ? 1 : 0);
        await reopen(id);
      }
    });

    it('closing: the same roles may; each close is audited under the user who made it', async () => {
      const id = flagIds.otherCharlie; // acknowledged: only the close form is shown
      const form = await actionForm('/watchlist', 'close-form', 'shore_engineer', id);
      for (const { caller, headers } of users()) {
        const note = `closed by ${caller.name}`;
        await post('/watchlist', [...asCaller(form, await csrfOf(headers)), ['reason', 'dismissed'], ['note', note]], headers);
        const { rows } = await db.pool.query('SELECT status, closed_by FROM flag WHERE id = $1', [id]);
        const { rows: audit } = await db.pool.query(`SELECT actor FROM audit_log WHERE action = 'flag.close' AND detail->>'note' = $1`, [note]);
        if (isStaff(caller)) {
          expect(rows[0].status, caller.name).toBe('closed');
          expect(audit.map((r) => r.actor), caller.name).toEqual([rows[0].closed_by]);
        } else {
          expect(rows[0].status, caller.name).toBe('acknowledged');
          expect(audit, caller.name).toEqual([]);
        }
        await db.pool.query(`UPDATE flag SET status = 'acknowledged', closed_by = NULL, closed_at = NULL, close_reason = NULL, close_note = NULL WHERE id = $1`, [id]);
      }
    });

    it('register import: fleet managers and admins only, audited', async () => {
      const form = await actionForm('/admin/register', 'register-upload', 'admin');
      for (const { caller, headers, email } of users()) {
        const key = `probe-new-${caller.role.replace('_', '-')}-${caller.tenant ?? 'x'}`;
        const file = JSON.stringify({ v: 1, vessels: [{ key, name: `New ${key}`, type: 'supply', dp_class: 2, watch_circles_m: [3], heading_limits_deg: [3], thrusters: [], buses: [], refs: [] }], campaigns: [] });
        await post('/admin/register', [...asCaller(form, await csrfOf(headers)), ['fileText', file], ['fileName', 'probe.json'], ['intent', 'import']], headers);
        const allowed = caller.role === 'admin' || caller.role === 'fleet_manager';
        const { rows } = await db.pool.query('SELECT count(*)::int AS n FROM vessel WHERE key = $1', [key]);
        expect(rows[0].n, caller.name).toBe(allowed ? 1 : 0);
        const { rows: audit } = await db.pool.query(`SELECT count(*)::int AS n FROM audit_log WHERE action = 'register.import' AND actor = $1`, [email]);
        expect(audit[0].n, `${caller.name} audit`).toBe(allowed ? 1 : 0);
        await db.pool.query('DELETE FROM vessel WHERE key = $1', [key]);
      }
    });

    it('refuses the form without the session’s CSRF token, with another user’s token, and from another site', async () => {
      const id = flagIds.otherBravo;
      const form = await acknowledgeForm(id);
      const [engineer, admin] = [users().find((c) => c.caller.role === 'shore_engineer')!, users().find((c) => c.caller.role === 'admin')!];
      const own = await csrfOf(engineer.headers);
      const others = await csrfOf(admin.headers);
      const withToken = (token: string | null) => [
        ...form.filter(([k]) => k !== 'csrf_token').concat(token === null ? [] : [['csrf_token', token]]),
        ['note', 'an attempt'] as [string, string],
      ];
      await post('/watchlist', withToken(null), engineer.headers);
      expect(await status(id)).toBe('open');
      await post('/watchlist', withToken(others), engineer.headers);
      expect(await status(id)).toBe('open');
      await post('/watchlist', withToken(own), { ...engineer.headers, origin: 'https://elsewhere.example', 'sec-fetch-site': 'cross-site' });
      expect(await status(id)).toBe('open');
      // The same form with the right token from the app's own page goes through: the refusals above were the checks.
      await post('/watchlist', withToken(own), engineer.headers);
      expect(await status(id)).toBe('acknowledged');
      await reopen(id);
    });
  });
});
