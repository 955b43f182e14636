import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { Link, Node } from '../../server/models';
import geographiclib from 'geographiclib-geodesic';
import { call, useApi } from '../helpers/api';
import { buildNode, buildRadio, buildSite } from '../helpers/factories';
import { planningCast } from '../helpers/planningActors';

const HOUR_MS = 3_600_000;

describe('link health API', () => {
  const ctx = useApi();

  /** A live link between two sites 0.02° of latitude apart, in the operator's neighbourhood. */
  async function liveLink(hoodId: number) {
    const siteA = await buildSite({ neighbourhoodId: hoodId, latitude: 47.6, longitude: -38.4 });
    const siteB = await buildSite({ neighbourhoodId: hoodId, latitude: 47.62, longitude: -38.4 });
    const [na, nb] = [await buildNode({ siteId: siteA.id }), await buildNode({ siteId: siteB.id })];
    const [ra, rb] = [await buildRadio({ nodeId: na.id }), await buildRadio({ nodeId: nb.id })];
    const link = await Link.create({ radioAId: ra.id, radioBId: rb.id, status: 'live' });
    // Same radios both ends (factory: 18 dBm, 23 dBi, no cable loss, channel 36 = 5180 MHz). Expected signal worked by hand:
    // distance from GeographicLib (Karney 2013, outside check) ≈ 2.224 km; ITU-R P.525 §2.2 L = 32.45 + 20·log10(5180) + 20·log10(d)
    // ≈ 113.68 dB; Prx = 18 + 23 − L + 23 ≈ −49.68 dBm (REFERENCES Link budget).
    const dKm = (geographiclib.Geodesic.WGS84.Inverse(47.6, -38.4, 47.62, -38.4).s12 ?? NaN) / 1000;
    expect(dKm).toBeCloseTo(2.224, 3);
    const predicted = 18 + 23 - (32.45 + 20 * Math.log10(5180) + 20 * Math.log10(dKm)) + 23;
    expect(predicted).toBeCloseTo(-49.68, 1);
    return { link, na, nb, predicted };
  }

  async function report(node: Node, signals: number[], nowSignal: number) {
    const now = Date.now();
    for (const [i, s] of signals.entries()) {
      await ctx.sequelize.query(
        `INSERT INTO heartbeats (node_id, seq, received_at, radios)
        VALUES ($1, $2, $3, jsonb_build_array(jsonb_build_object('iface', 'wlan0', 'signalDbm', $4::float8)))`,
        { bind: [node.id, i + 1, new Date(now - (i + 1) * 6 * HOUR_MS).toISOString(), s] },
      );
    }
    // A reading older than the 7-day window must not count.
    await ctx.sequelize.query(`INSERT INTO heartbeats (node_id, seq, received_at, radios) VALUES ($1, 999, $2, '[{"iface": "wlan0", "signalDbm": -20}]')`, {
      bind: [node.id, new Date(now - 8 * 24 * HOUR_MS).toISOString()],
    });
    await node.update({ lastReport: { receivedAt: new Date(now).toISOString(), radios: [{ iface: 'wlan0', signalDbm: nowSignal }] } });
  }

  it('answers 401 signed out, 400 for a bad id, 404 to hosts, other operators and for missing links', async () => {
    const { op, outsider, host, hood } = await planningCast(ctx);
    const { link } = await liveLink(hood.id);
    expect((await request(ctx.app).get(`/api/v1/links/${link.id}/health`)).status).toBe(401);
    expect((await call(op, 'get', '/api/v1/links/x/health')).status).toBe(400);
    expect((await call(outsider, 'get', `/api/v1/links/${link.id}/health`)).status).toBe(404);
    expect((await call(host, 'get', `/api/v1/links/${link.id}/health`)).status).toBe(404);
    expect((await call(op, 'get', '/api/v1/links/999999/health')).status).toBe(404);
  });

  it('flags a link measured > 10 dB below prediction and > 6 dB below its 7-day median', async () => {
    const { op, hood } = await planningCast(ctx);
    const { link, nb, predicted } = await liveLink(hood.id);
    await report(nb, [-50, -51, -52, -53, -54], -66);
    const res = await call(op, 'get', `/api/v1/links/${link.id}/health`);
    expect(res.status).toBe(200);
    const toB = res.body.data.directions.find((d: { toNodeId: number }) => d.toNodeId === nb.id);
    expect(Math.abs(toB.predictedSignalDbm - predicted)).toBeLessThan(0.1); // REFERENCES: 0.1 dB tolerance for losses
    expect(toB.measuredSignalDbm).toBe(-66);
    expect(toB.baselineSignalDbm).toBe(-52); // median of the five in-window readings
    expect(toB.baselineSamples).toBe(5);
    expect(Math.abs(toB.belowPredictionDb - (predicted + 66))).toBeLessThan(0.1);
    expect(toB.belowBaselineDb).toBe(14);
    expect(toB.flagged).toBe(true);
    expect(res.body.data.flagged).toBe(true);
  });

  it('does not flag a link that was always weak (near its own baseline)', async () => {
    const { admin, hood } = await planningCast(ctx);
    const { link, nb } = await liveLink(hood.id);
    await report(nb, [-64, -65, -66], -67);
    const res = await call(admin, 'get', `/api/v1/links/${link.id}/health`);
    const toB = res.body.data.directions.find((d: { toNodeId: number }) => d.toNodeId === nb.id);
    expect(toB.belowPredictionDb).toBeGreaterThan(10);
    expect(toB.belowBaselineDb).toBe(2);
    expect(toB.flagged).toBe(false);
  });

  it('reports no measurement for a planned link that has never reported', async () => {
    const { op, hood } = await planningCast(ctx);
    const { link } = await liveLink(hood.id);
    await link.update({ status: 'planned' });
    const res = await call(op, 'get', `/api/v1/links/${link.id}/health`);
    expect(res.body.data.status).toBe('planned');
    for (const d of res.body.data.directions) expect(d).toMatchObject({ measuredSignalDbm: null, baselineSignalDbm: null, flagged: false });
  });
});
