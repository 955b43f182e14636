import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { Radio, Site } from '../../server/models';
import { call, useApi } from '../helpers/api';
import { buildRadio } from '../helpers/factories';
import { planningCast } from '../helpers/planningActors';

const KEY = 'quay-lamp-harbour-8812';

describe('provisioning sheet API', () => {
  const ctx = useApi();

  it('answers 401 signed out, 400 for a bad id, and 404 for a node the caller cannot read', async () => {
    const { outsider, node } = await planningCast(ctx);
    expect((await request(ctx.app).get(`/api/v1/nodes/${node.id}/provisioning`)).status).toBe(401);
    expect((await call(outsider, 'get', '/api/v1/nodes/abc/provisioning')).status).toBe(400);
    expect((await call(outsider, 'get', `/api/v1/nodes/${node.id}/provisioning`)).status).toBe(404);
  });

  it('gives the neighbourhood’s operator and admins the key, with every setting for the router', async () => {
    const { op, admin, node } = await planningCast(ctx);
    const r = await buildRadio({ nodeId: node.id });
    await Radio.update({ preSharedKey: KEY, ssid: 'quay-ap' }, { where: { id: r.id } });
    await call(admin, 'put', `/api/v1/address-plans/${node.id}`, {
      cidr: '10.64.7.0/24',
      gateway: '10.64.7.1',
      dhcpStart: '10.64.7.11',
      dhcpEnd: '10.64.7.254',
    });
    for (const who of [op, admin]) {
      const res = await call(who, 'get', `/api/v1/nodes/${node.id}/provisioning`);
      expect(res.status).toBe(200);
      expect(res.headers['cache-control']).toBe('no-store');
      expect(res.body.data.radios[0]).toMatchObject({
        iface: 'wlan0',
        band: '5',
        channel: 36,
        centerMHz: 5180,
        channelWidthMHz: 40,
        ssid: 'quay-ap',
        encryption: 'wpa2-ccmp',
        preSharedKey: KEY,
      });
      // EIRP = Ptx + G − L (REFERENCES.md "Link budget"): 18 + 23 − 0
      expect(res.body.data.radios[0].eirpDbm).toBe(41);
      expect(res.body.data.addresses).toMatchObject({
        cidr: '10.64.7.0/24',
        netmask: '255.255.255.0',
        gateway: '10.64.7.1',
        broadcast: '10.64.7.255',
        dhcpStart: '10.64.7.11',
        dhcpEnd: '10.64.7.254',
      });
      expect(res.body.data.node.reportIntervalS).toBe(60);
      expect(res.body.data.agent.scriptPath).toBe('/agent/parapet-agent.sh');
    }
  });

  it('never sends the key to the node’s host, who still gets the sheet', async () => {
    const { host, node } = await planningCast(ctx);
    await Site.update({ hostUserId: host.userId }, { where: { id: node.siteId } });
    const r = await buildRadio({ nodeId: node.id });
    await Radio.update({ preSharedKey: KEY }, { where: { id: r.id } });
    const res = await call(host, 'get', `/api/v1/nodes/${node.id}/provisioning`);
    expect(res.status).toBe(200);
    expect(JSON.stringify(res.body)).not.toContain(KEY);
    expect(res.body.data.radios[0]).not.toHaveProperty('preSharedKey');
    expect(res.body.data.radios[0].hasPreSharedKey).toBe(true);
    expect(res.body.data.abilities.readKeys).toBe(false);
  });

  it('never sends a key through the radios, links or topology answers either', async () => {
    const { op, node } = await planningCast(ctx);
    const r = await buildRadio({ nodeId: node.id });
    await Radio.update({ preSharedKey: KEY }, { where: { id: r.id } });
    for (const url of ['/api/v1/radios', `/api/v1/radios/${r.id}`, '/api/v1/topology', '/api/v1/security-review']) {
      const res = await call(op, 'get', url);
      expect(res.status).toBe(200);
      expect(JSON.stringify(res.body)).not.toContain(KEY);
    }
  });
});
