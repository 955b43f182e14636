import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { PASSWORD, call, signIn, useApi, type Agent } from '../helpers/api';
import { manualClock } from '../helpers/clock';
import { buildNeighbourhood } from '../helpers/factories';
import { loadDemo } from '../../server/db/seedDemo';
import { PEOPLE } from '../../server/db/demoScenario';
import { User } from '../../server/models';

// The load runs at 10:00 UTC on 15 June 2026; "last month" is May in the demo's zone (Atlantic/Azores).
const clock = manualClock('2026-06-15T10:00:00Z');
const LOAD_TIMEOUT_MS = 600_000; // a shared, busy machine: the load writes about a million report rows

interface ReportBody {
  overall: { availabilityPct: number; outageCount: number };
  nodes: { name: string; availabilityPct: number | null; outageCount: number }[];
  outages: { node: string; acknowledgedAt: string | null }[];
  days: { availabilityPct: number | null }[];
}

describe('the demo town with a past', () => {
  const ctx = useApi({ now: clock.now });
  let admin: Agent;
  let operator: Agent;

  beforeAll(async () => {
    const loaded = await loadDemo({ ...ctx.config, demoPassword: PASSWORD });
    expect(loaded.result).toBe('loaded');
    admin = await signIn(ctx, (await User.findOne({ where: { email: PEOPLE.find((p) => p.key === 'admin')!.email } }))!);
    operator = await signIn(ctx, (await User.findOne({ where: { email: PEOPLE.find((p) => p.key === 'operator')!.email } }))!);
  }, LOAD_TIMEOUT_MS);

  it('gives last month a real report: outages, acknowledgements, and availability below 100 % for some nodes', async () => {
    const res = await call(admin, 'get', '/api/v1/reports/availability?month=2026-05');
    expect(res.status).toBe(200);
    const body = res.body.data as ReportBody;
    expect(body.overall.outageCount).toBeGreaterThanOrEqual(8);
    expect(body.overall.availabilityPct).toBeLessThan(100);
    expect(body.overall.availabilityPct).toBeGreaterThan(95);
    const hurt = body.nodes.filter((n) => n.availabilityPct !== null && n.availabilityPct < 100);
    expect(hurt.length).toBeGreaterThanOrEqual(5);
    expect(body.nodes.filter((n) => n.availabilityPct === 100).length).toBeGreaterThan(0);
    expect(body.outages.some((o) => o.acknowledgedAt !== null) && body.outages.some((o) => o.acknowledgedAt === null)).toBe(true);
    expect(body.days.some((d) => d.availabilityPct !== null && d.availabilityPct < 100)).toBe(true);
  });

  it('records the backhaul failure as one outage with its neighbourhood stranded behind it, acknowledged and annotated', async () => {
    const res = await call(admin, 'get', '/api/v1/outages?sort=-blastNodeCount&pageSize=5');
    expect(res.status).toBe(200);
    const [widest] = res.body.data;
    expect(widest.blastRadius.nodeCount).toBe(6);
    expect(widest.blastRadius.clients).toBeGreaterThan(0);
    expect(widest.acknowledgedAt).not.toBeNull();
    expect(widest.notes).toMatch(/surge arrester/);
    expect(widest.endedAt).not.toBeNull();
  });

  it('leaves the mail the history caused in the outbox: offline, back online, a reminder, an upstream notice and one flap summary', async () => {
    const res = await call(admin, 'get', '/api/v1/outbox?pageSize=500');
    expect(res.status).toBe(200);
    const mails = res.body.data as { kind: string; status: string; subject: string; recipient: { address: string } }[];
    const kinds = new Set(mails.map((m) => m.kind));
    for (const k of ['node-offline', 'node-online', 'node-reminder', 'upstream-notice']) expect(kinds.has(k), k).toBe(true);
    expect(mails.every((m) => m.status === 'sent')).toBe(true);
    // Six flaps would be twelve mails to the operator; the cap (4 an hour) lets four through, then one summary.
    const weir = mails.filter((m) => m.subject.includes('lf-weir') && m.recipient.address === 'operator@parapet.example');
    expect(weir).toHaveLength(5);
    expect(weir.filter((m) => /keeps dropping/.test(m.subject))).toHaveLength(1);
  });

  it('fills the charts from the roll-ups: 30 days of hourly points with a daily rhythm in throughput', async () => {
    const nodes = (await call(operator, 'get', '/api/v1/nodes?q=lf-rope')).body.data as { id: number; name: string }[];
    const rope = nodes.find((n) => n.name === 'lf-rope')!;
    const res = await call(operator, 'get', `/api/v1/nodes/${rope.id}/series?range=30d`);
    expect(res.status).toBe(200);
    const points = res.body.data.points as { t: string; availabilityPct: number; throughputAvgMbps: number | null }[];
    expect(points.length).toBeGreaterThan(700);
    expect(points.some((p) => p.availabilityPct < 100)).toBe(true);
    const at = (hourUtc: number) =>
      points.filter((p) => new Date(p.t).getUTCHours() === hourUtc && p.throughputAvgMbps !== null).map((p) => p.throughputAvgMbps!);
    const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;
    expect(mean(at(10))).toBeGreaterThan(mean(at(22)) + 10); // quiet mid-morning against the busy evening (21:00 local = 22:00 UTC in winter, 21:00 in summer)
  });

  it('shows the drifting link, the configuration drift and the weakest links on the overview and link health', async () => {
    const overview = (await call(admin, 'get', '/api/v1/overview')).body.data;
    expect(overview.driftNodes.map((n: { name: string }) => n.name)).toEqual(expect.arrayContaining(['lf-dyke', 'lf-weir']));
    expect(overview.weakestLinks).toHaveLength(5);
    const links = (await call(admin, 'get', '/api/v1/links?pageSize=100')).body.data as { id: number; name: string }[];
    const heronLink = links.find((l) => l.name === 'marsh – heron')!;
    const health = await call(admin, 'get', `/api/v1/links/${heronLink.id}/health`);
    expect(health.status).toBe(200);
    expect(health.body.data.flagged).toBe(true);
  });

  it('has something to plan: a survey per neighbourhood, a channel worth changing, an address clash, security findings, two drawn photos', async () => {
    const plan = (await call(admin, 'get', '/api/v1/planning/channel-plan')).body.data;
    expect((plan.radios as { changed: boolean }[]).some((r) => r.changed)).toBe(true);
    expect(plan.congestion).toHaveLength(4); // one survey per neighbourhood
    const addresses = (await call(admin, 'get', '/api/v1/address-plans')).body.data;
    expect(addresses.findings.map((f: { code: string }) => f.code)).toContain('subnet_overlap');
    expect(addresses.unplannedNodes).toEqual([]);
    const review = (await call(admin, 'get', '/api/v1/security-review')).body.data;
    expect(JSON.stringify(review)).toMatch(/wep/i);
    const sites = (await call(admin, 'get', '/api/v1/sites?pageSize=100')).body.data as { id: number; name: string }[];
    for (const name of ['Granary Tower', 'Saltmarsh Water Tower']) {
      const photos = await call(admin, 'get', `/api/v1/sites/${sites.find((s) => s.name === name)!.id}/photos`);
      expect(photos.body.data).toHaveLength(1);
    }
    const surveyed = await ctx.sequelize.query('SELECT DISTINCT n.neighbourhood_id FROM site_surveys s JOIN nodes n ON n.id = s.node_id');
    expect(surveyed[0]).toHaveLength(4);
  }, 180_000); // the whole network's channel plan on a busy shared machine

  it(
    'reloads fresh on reset without touching a neighbourhood of its own',
    async () => {
      const kept = await buildNeighbourhood({ name: 'Not Part Of The Demo' });
      const before = await ctx.sequelize.query<{ n: string }>('SELECT count(*) AS n FROM outages', { type: 'SELECT' as never });
      const again = await loadDemo({ ...ctx.config, demoPassword: PASSWORD });
      expect(again.result).toBe('already-loaded'); // without reset nothing changes
      const reset = await loadDemo({ ...ctx.config, demoPassword: PASSWORD }, () => {}, { reset: true });
      expect(reset.result).toBe('loaded');
      const after = await ctx.sequelize.query<{ n: string }>('SELECT count(*) AS n FROM outages', { type: 'SELECT' as never });
      expect(after[0].n).toBe(before[0].n);
      const hoods = await request(ctx.app).get('/api/v1/public/status');
      expect(hoods.body.data.neighbourhoods.map((h: { name: string }) => h.name)).toContain('Not Part Of The Demo');
      expect(await User.count({ where: { email: PEOPLE.map((p) => p.email) } })).toBe(PEOPLE.length);
      expect(kept.id).toBeGreaterThan(0);
    },
    LOAD_TIMEOUT_MS,
  );
});
