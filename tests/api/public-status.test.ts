import request from 'supertest';
import { describe, expect, it, vi } from 'vitest';
import { NEIGHBOURHOODS, PEOPLE, SITES } from '../../server/db/demoScenario';
import { seedDemo } from '../../server/db/seedDemo';
import { Neighbourhood, Node, Outage, Radio, Site, User } from '../../server/models';
import { useApi } from '../helpers/api';
import { manualClock } from '../helpers/clock';
import { buildNeighbourhood, buildNode } from '../helpers/factories';

// 15:00 UTC on 1 June 2026 is 15:00 in Atlantic/Azores (summer time, UTC+0), the demo's zone.
const clock = manualClock('2026-06-01T15:00:00Z');
const DAY_S = 86_400;
const ago = (s: number) => new Date(clock.now().getTime() - s * 1000);

describe('public status API', () => {
  const ctx = useApi({ now: clock.now });
  /** The page after the cache period has passed, so it reflects the data as it is now. */
  async function freshStatus() {
    clock.advance(31);
    const res = await request(ctx.app).get('/api/v1/public/status');
    expect(res.status).toBe(200);
    return res;
  }
  const hood = (body: { data: { neighbourhoods: { name: string }[] } }, name: string) =>
    body.data.neighbourhoods.find((h) => h.name === name) as never as {
      name: string;
      sentence: string;
      counts: Record<string, number>;
      availability: { h24Pct: number | null; d30Pct: number | null };
      openOutages: { state: string; since: string; sentence: string }[];
    };

  it('answers signed out, sets no cookie and says how long it may be cached', async () => {
    const res = await freshStatus();
    expect(res.headers['set-cookie']).toBeUndefined();
    expect(res.headers['cache-control']).toBe('public, max-age=30');
    expect(res.body.data).toEqual({
      network: { name: expect.any(String), timeZone: expect.any(String) },
      generatedAt: clock.now().toISOString(),
      neighbourhoods: [],
    });
  });

  it('counts nodes per neighbourhood, says since when they are down, and leaves retired neighbourhoods out', async () => {
    await seedDemo('demo-password-long');
    const oldQuay = await Neighbourhood.findOne({ where: { name: 'Old Quay' } });
    const quayNodes = await Node.findAll({ where: { neighbourhoodId: oldQuay!.id }, order: [['id', 'ASC']] });
    await Node.update({ state: 'online', firstSeenAt: ago(40 * DAY_S) }, { where: {} });
    // Two Old Quay nodes went silent at 14:20 and 14:45 local time; the earliest is the one the sentence names.
    await quayNodes[1].update({ state: 'offline' });
    await quayNodes[2].update({ state: 'offline' });
    await Outage.create({ nodeId: quayNodes[1].id, startedAt: new Date('2026-06-01T14:20:00Z') });
    await Outage.create({ nodeId: quayNodes[2].id, startedAt: new Date('2026-06-01T14:45:00Z') });
    const millbrook = await Neighbourhood.findOne({ where: { name: 'Millbrook' } });
    const millNode = await Node.findOne({ where: { neighbourhoodId: millbrook!.id, isUplink: false }, order: [['id', 'DESC']] });
    await millNode!.update({ state: 'stranded' });
    await Outage.create({ nodeId: millNode!.id, startedAt: new Date('2026-05-31T22:05:00Z') });
    await Node.update(
      { state: 'unknown', firstSeenAt: null },
      { where: { neighbourhoodId: (await Neighbourhood.findOne({ where: { name: 'Chapel Hill' } }))!.id } },
    );
    await buildNeighbourhood({ name: 'Closed Estate' }).then((h) => h.update({ retiredAt: ago(DAY_S) }));

    const { body } = await freshStatus();
    expect(body.data.network).toEqual({ name: 'Lindenfall Community Network', timeZone: 'Atlantic/Azores' });
    expect(body.data.neighbourhoods.map((h: { name: string }) => h.name)).toEqual(['Chapel Hill', 'Millbrook', 'Old Quay', 'Saltmarsh Row']);
    const quay = hood(body, 'Old Quay');
    expect(quay.counts).toEqual({ total: quayNodes.length, up: quayNodes.length - 2, down: 2, unknown: 0 });
    expect(quay.sentence).toBe(`2 of ${quayNodes.length} down since 14:20.`);
    expect(quay.openOutages.map((o) => o.sentence)).toEqual([
      'A rooftop node in Old Quay has been down since 14:20.',
      'A rooftop node in Old Quay has been down since 14:45.',
    ]);
    expect(quay.openOutages[0]).toMatchObject({ state: 'offline', since: '2026-06-01T14:20:00.000Z' });
    const mill = hood(body, 'Millbrook');
    expect(mill.openOutages.map((o) => o.sentence)).toEqual([
      'A rooftop node in Millbrook has been cut off since 31 May, 22:05, because a link further up the network is down.',
    ]);
    const marsh = hood(body, 'Saltmarsh Row');
    expect(marsh.sentence).toBe(`${marsh.counts.total} of ${marsh.counts.total} nodes up.`);
    expect(marsh.availability).toEqual({ h24Pct: 100, d30Pct: 100 });
    const chapel = hood(body, 'Chapel Hill');
    expect(chapel.sentence).toBe(`0 of ${chapel.counts.total} nodes up; ${chapel.counts.total} not heard from yet.`);
    expect(chapel.availability).toEqual({ h24Pct: null, d30Pct: null }); // never heard from: nothing observed
  });

  it('gives availability over 24 hours and 30 days from the outages, measured from when a node was first seen', async () => {
    const solo = await buildNeighbourhood({ name: 'Availability Test' });
    const node = await buildNode({ neighbourhoodId: solo.id });
    await node.update({ state: 'online', firstSeenAt: ago(60 * DAY_S) });
    // Google SRE book, "Availability Table": 99.9 % over 30 days allows 43.2 minutes down.
    await Outage.create({ nodeId: node.id, startedAt: ago(10 * DAY_S), endedAt: new Date(ago(10 * DAY_S).getTime() + 43.2 * 60_000) });
    let { body } = await freshStatus();
    expect(hood(body, 'Availability Test').availability.d30Pct).toBeCloseTo(99.9, 6);
    expect(hood(body, 'Availability Test').availability.h24Pct).toBe(100);

    // Same table, per day: 99 % allows 14.4 minutes down in 24 hours.
    await Outage.create({ nodeId: node.id, startedAt: ago(3 * 3600), endedAt: new Date(ago(3 * 3600).getTime() + 14.4 * 60_000) });
    ({ body } = await freshStatus());
    expect(hood(body, 'Availability Test').availability.h24Pct).toBeCloseTo(99, 6);

    // A node first seen 12 hours ago with one hour down is 11/12 available over both windows, not 29.5/30.
    const young = await buildNeighbourhood({ name: 'Young Node Test' });
    const fresh = await buildNode({ neighbourhoodId: young.id });
    await fresh.update({ state: 'online', firstSeenAt: ago(12 * 3600) });
    await Outage.create({ nodeId: fresh.id, startedAt: ago(6 * 3600), endedAt: ago(5 * 3600) });
    ({ body } = await freshStatus());
    expect(hood(body, 'Young Node Test').availability.h24Pct).toBeCloseTo((100 * 11) / 12, 1);
    expect(hood(body, 'Young Node Test').availability.d30Pct).toBeCloseTo((100 * 11) / 12, 1);
  });

  it('carries no personal or secret data: no e-mails, phones, people, sites, nodes, coordinates, addresses or keys', async () => {
    const res = await freshStatus();
    const text = JSON.stringify(res.body);
    expect(res.body.data.neighbourhoods.length).toBeGreaterThan(3); // the check below runs on a full page
    const users = await User.findAll();
    const sites = await Site.findAll();
    const nodes = await Node.findAll();
    const radios = await Radio.findAll();
    const forbidden = [
      ...PEOPLE.flatMap((p) => [p.email, p.name, ...(p.phone ? [p.phone] : [])]),
      ...users.flatMap((u) => [u.email, u.name]),
      ...SITES.flatMap((s) => [s.name, s.accessNotes, s.node.name]),
      ...sites.flatMap((s) => [s.name, s.latitude.toFixed(4), s.longitude.toFixed(4)]),
      ...nodes.flatMap((n) => [n.name, ...(n.managementAddress ? [n.managementAddress] : [])]),
      ...radios.flatMap((r) => [...(r.preSharedKey ? [r.preSharedKey] : []), ...(r.ssid ? [r.ssid] : [])]),
      ...NEIGHBOURHOODS.map((n) => n.description),
    ];
    expect(forbidden.length).toBeGreaterThan(50);
    for (const value of forbidden) expect(text, `the public page must not contain "${value}"`).not.toContain(value);
    expect(text).not.toMatch(/@/);
    expect(text).not.toMatch(/\+\d{3} \d{3}/);
    expect(text).not.toMatch(/"(latitude|longitude|email|phone|host|site|preSharedKey|ssid|managementAddress)"/);
  });

  it('serves a crowd of 50 requests from one computation, and computes again once the cache period has passed', async () => {
    clock.advance(31);
    const query = vi.spyOn(ctx.sequelize, 'query');
    const computations = () => query.mock.calls.filter(([sql]) => String(sql).includes('FROM network_settings')).length;
    const responses = await Promise.all(Array.from({ length: 50 }, () => request(ctx.app).get('/api/v1/public/status')));
    expect(responses.every((r) => r.status === 200)).toBe(true);
    expect(new Set(responses.map((r) => r.body.data.generatedAt)).size).toBe(1);
    expect(computations()).toBe(1);
    const queriesPerComputation = query.mock.calls.length;
    expect(queriesPerComputation).toBeGreaterThan(0);

    clock.advance(29); // still inside the 30 s period
    for (let i = 0; i < 5; i++) expect((await request(ctx.app).get('/api/v1/public/status')).status).toBe(200);
    expect(query.mock.calls.length).toBe(queriesPerComputation);

    clock.advance(2); // past it
    await request(ctx.app).get('/api/v1/public/status');
    expect(computations()).toBe(2);
    query.mockRestore();
  });
});
