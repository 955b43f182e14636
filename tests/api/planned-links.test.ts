import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { Radio } from '../../server/models';
import { call, useApi } from '../helpers/api';
import { buildNode, buildRadio } from '../helpers/factories';
import { planningCast } from '../helpers/planningActors';

const newRadio = (nodeId: number) => ({ nodeId, band: '5', channel: 149, channelWidthMHz: 20, txPowerDbm: 20, antennaGainDbi: 23, cableLossDb: 1 });

describe('planned links API', () => {
  const ctx = useApi();

  it('answers 401 signed out and 403 to hosts', async () => {
    const { host, node, otherNode } = await planningCast(ctx);
    const body = { a: newRadio(node.id), b: newRadio(otherNode.id) };
    expect((await request(ctx.app).post('/api/v1/planning/planned-links').send(body)).status).toBe(401);
    expect((await call(host, 'post', '/api/v1/planning/planned-links', body)).status).toBe(403);
  });

  it('refuses bad ends (400), another neighbourhood’s node (404) and the same node twice (400)', async () => {
    const { op, node, otherNode } = await planningCast(ctx);
    const missing = await call(op, 'post', '/api/v1/planning/planned-links', { a: newRadio(node.id) });
    expect(missing.status).toBe(400);
    expect(missing.body.error.details[0].path).toBe('b');
    const band = await call(op, 'post', '/api/v1/planning/planned-links', { a: newRadio(node.id), b: { ...newRadio(node.id), band: '2.4', channel: 149 } });
    expect(band.status).toBe(400);
    expect((await call(op, 'post', '/api/v1/planning/planned-links', { a: newRadio(node.id), b: newRadio(otherNode.id) })).status).toBe(404);
    const same = await call(op, 'post', '/api/v1/planning/planned-links', { a: newRadio(node.id), b: newRadio(node.id) });
    expect(same.status).toBe(400);
    expect(same.body.error.message).toBe('Both ends are on the same node; a link joins two different nodes.');
    expect(await Radio.count({ where: { nodeId: node.id } })).toBe(0); // nothing half-made
  });

  it('creates the missing radios and a planned link in one go, records them, and shows the link on the topology', async () => {
    const { op, hood, node } = await planningCast(ctx);
    const far = await buildNode({ neighbourhoodId: hood.id });
    const existing = await buildRadio({ nodeId: far.id, iface: 'wlan0' });
    const res = await call(op, 'post', '/api/v1/planning/planned-links', { a: newRadio(node.id), b: { radioId: existing.id } });
    expect(res.status).toBe(201);
    expect(res.body.data).toMatchObject({ status: 'planned', nodeAId: node.id, nodeBId: far.id, radioBId: existing.id });
    const made = await Radio.findByPk(res.body.data.radioAId);
    expect(made).toMatchObject({ nodeId: node.id, iface: 'wlan0', channel: 149, role: 'backhaul-ap' });
    // A second plan on the same node gets the next free interface.
    const again = await call(op, 'post', '/api/v1/planning/planned-links', { a: newRadio(node.id), b: newRadio(far.id) });
    expect(again.status).toBe(201);
    expect((await Radio.findByPk(again.body.data.radioAId))!.iface).toBe('wlan1');
    expect((await Radio.findByPk(again.body.data.radioBId))!.iface).toBe('wlan1');
    const topo = await call(op, 'get', '/api/v1/topology');
    const edge = topo.body.data.links.find((l: { id: number }) => l.id === res.body.data.id);
    expect(edge).toMatchObject({ status: 'planned', nodeAId: node.id, nodeBId: far.id });
    const [rows] = await ctx.sequelize.query(`SELECT table_name FROM change_history WHERE changed_by = $1 ORDER BY id`, { bind: [op.userId] });
    expect((rows as { table_name: string }[]).map((r) => r.table_name)).toEqual(['radios', 'links', 'radios', 'radios', 'links']);
    const dup = await call(op, 'post', '/api/v1/planning/planned-links', { a: { radioId: res.body.data.radioAId }, b: { radioId: existing.id } });
    expect(dup.status).toBe(409);
  });
});
