import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { Radio } from '../../server/models';
import { buildUser, call, ids, SIGNED_OUT, signIn, useApi } from '../helpers/api';
import { buildLink, buildNeighbourhood, buildNode, buildRadio, buildSite } from '../helpers/factories';

const MANAGE = 'Only admins and the operators of its neighbourhood change this radio.';
const BAND_CHANNEL = 'channel must be 1–14 on 2.4 GHz or 32 and above on 5 GHz';
const PSK = 'harbour-lights-7731-secret';
const validRadio = (nodeId: number, overrides: Record<string, unknown> = {}) => ({
  nodeId,
  iface: 'wlan1',
  band: '5',
  channel: 44,
  channelWidthMHz: 40,
  txPowerDbm: 17,
  antennaGainDbi: 19,
  role: 'backhaul-client',
  ssid: 'quayside-backhaul',
  encryption: 'wpa2-ccmp',
  preSharedKey: PSK,
  ...overrides,
});

describe('radios API', () => {
  const ctx = useApi();
  const admin = async () => signIn(ctx, await buildUser({ role: 'admin' }));
  /** An operator with a node in their own neighbourhood. */
  async function operatorWithNode() {
    const user = await buildUser({ role: 'operator' });
    const hood = await buildNeighbourhood({ operators: [user] });
    const node = await buildNode({ neighbourhoodId: hood.id });
    return { user, hood, node, agent: await signIn(ctx, user) };
  }

  describe('signed out', () => {
    it.each([
      ['lists', 'get', '/api/v1/radios'],
      ['reads', 'get', '/api/v1/radios/1'],
      ['creates', 'post', '/api/v1/radios'],
      ['updates', 'patch', '/api/v1/radios/1'],
      ['deletes', 'delete', '/api/v1/radios/1'],
    ] as const)('a signed-out caller who %s radios gets 401', async (_what, method, url) => {
      const res = await call(request(ctx.app), method, url, method === 'post' || method === 'patch' ? validRadio(1) : undefined);
      expect(res.status).toBe(401);
      expect(res.body).toEqual({ error: SIGNED_OUT });
    });
  });

  describe('invalid input', () => {
    it.each([
      ['channelWidthMHz', 30, 'channelWidthMHz must be one of 20, 40, 80'],
      ['channelWidthMHz', '40', 'channelWidthMHz must be one of 20, 40, 80'],
      ['band', '6', 'band must be one of 2.4, 5'],
      ['channel', 197, 'channel must be at most 196'],
      ['channel', 6, BAND_CHANNEL],
      ['txPowerDbm', 37, 'txPowerDbm must be at most 36 dBm'],
      ['antennaGainDbi', 46, 'antennaGainDbi must be at most 45 dBi'],
      ['cableLossDb', -0.5, 'cableLossDb must be 0 dB or more'],
      ['iface', 'wlan 0', 'iface must be an interface name like wlan0'],
      ['role', 'router', 'role must be one of access-point, backhaul-client, backhaul-ap, mesh'],
      ['encryption', 'wpa4', 'encryption must be one of none, wep, wpa-tkip, wpa2-ccmp, wpa3-sae'],
      ['polarisation', 'diagonal', 'polarisation must be one of vertical, horizontal, dual, circular'],
      ['ssid', 'é'.repeat(17), 'ssid must be at most 32 bytes'],
      ['preSharedKey', 'short', 'preSharedKey must be 8–63 printable characters or 64 hex digits'],
      ['preSharedKey', 'k'.repeat(64), 'preSharedKey must be 8–63 printable characters or 64 hex digits'],
      ['groupRekeyS', 1.5, 'groupRekeyS must be a whole number of seconds'],
    ])('creating a radio with %s = %j answers 400 "%s"', async (field, value, message) => {
      const node = await buildNode();
      const res = await call(await admin(), 'post', '/api/v1/radios', validRadio(node.id, { [field]: value }));
      expect(res.status).toBe(400);
      expect(res.body.error).toEqual({ code: 'invalid_input', message: `The request body is invalid: ${message}.`, details: [{ path: field, message }] });
      expect(await Radio.count({ where: { nodeId: node.id } })).toBe(0);
    });

    it('refuses channel 36 on 2.4 GHz at the path "channel"', async () => {
      const node = await buildNode();
      const res = await call(await admin(), 'post', '/api/v1/radios', validRadio(node.id, { band: '2.4', channel: 36 }));
      expect(res.status).toBe(400);
      expect(res.body.error.details).toEqual([{ path: 'channel', message: BAND_CHANNEL }]);
    });

    it('refuses an update that moves only the band so the stored channel no longer fits', async () => {
      const radio = await buildRadio(); // 5 GHz, channel 36
      const res = await call(await admin(), 'patch', `/api/v1/radios/${radio.id}`, { band: '2.4' });
      expect(res.status).toBe(400);
      expect(res.body.error).toEqual({
        code: 'invalid_input',
        message: 'The channel does not fit the band.',
        details: [{ path: 'channel', message: BAND_CHANNEL }],
      });
      expect((await Radio.findByPk(radio.id))!.band).toBe('5');
    });

    it.each([33, 70, 196])('refuses 5 GHz channel %i, off the IEEE 802.11 raster, and stores nothing', async (channel) => {
      const node = await buildNode();
      const res = await call(await admin(), 'post', '/api/v1/radios', validRadio(node.id, { channel, channelWidthMHz: 20 }));
      expect(res.status).toBe(400);
      expect(res.body.error.details).toEqual([
        { path: 'channel', message: 'channel must be a 5 GHz channel on the IEEE 802.11 raster: 36–64, 100–144, 149–165 in steps of 4' },
      ]);
      expect(await Radio.count({ where: { nodeId: node.id } })).toBe(0);
    });

    it('refuses 80 MHz on 2.4 GHz, naming channelWidthMHz, on create and on an update that changes only the band', async () => {
      const node = await buildNode();
      const agent = await admin();
      const res = await call(agent, 'post', '/api/v1/radios', validRadio(node.id, { band: '2.4', channel: 6, channelWidthMHz: 80 }));
      expect(res.status).toBe(400);
      expect(res.body.error.details).toEqual([
        { path: 'channelWidthMHz', message: 'channelWidthMHz must be 20 or 40 on 2.4 GHz: the band has no 80 MHz channel' },
      ]);
      const wide = await call(agent, 'post', '/api/v1/radios', validRadio(node.id, { channel: 36, channelWidthMHz: 80 }));
      expect(wide.status).toBe(201);
      const moved = await call(agent, 'patch', `/api/v1/radios/${wide.body.data.id}`, { band: '2.4', channel: 6 });
      expect(moved.status).toBe(400);
      expect(moved.body.error.details).toEqual([
        { path: 'channelWidthMHz', message: 'channelWidthMHz must be 20 or 40 on 2.4 GHz: the band has no 80 MHz channel' },
      ]);
      expect((await Radio.findByPk(wide.body.data.id))!.band).toBe('5');
    });

    it('refuses a 40 MHz radio on channel 165, whose bonding partner 169 is not a channel here', async () => {
      const node = await buildNode();
      const res = await call(await admin(), 'post', '/api/v1/radios', validRadio(node.id, { channel: 165, channelWidthMHz: 40 }));
      expect(res.status).toBe(400);
      expect(res.body.error.details[0]).toEqual({ path: 'channel', message: expect.stringMatching(/^channel cannot be used at 40 MHz/) });
    });

    it.each(['get', 'patch', 'delete'] as const)('answers 400 to %s with a non-numeric id in the path', async (method) => {
      const res = await call(await admin(), method, '/api/v1/radios/wlan0', method === 'patch' ? { channel: 40 } : undefined);
      expect(res.status).toBe(400);
      expect(res.body.error.details).toEqual([{ path: 'id', message: 'id must be a number' }]);
    });

    it.each([
      ['sort=ssid', 'Cannot sort by "ssid". Sort by one of: iface, nodeId, band, channel, role, encryption, txPowerDbm, createdAt, id.'],
      ['pageSize=501', 'The query is invalid: pageSize must be at most 500.'],
      ['band=6', 'The query is invalid: band must be one of 2.4, 5.'],
    ])('refuses the list query %s with 400', async (query, message) => {
      const res = await (await admin()).get(`/api/v1/radios?${query}`);
      expect(res.status).toBe(400);
      expect(res.body.error.message).toBe(message);
    });
  });

  describe('who may do what', () => {
    it('hides a radio from an operator of another neighbourhood (404 to read, change or remove)', async () => {
      const { agent } = await operatorWithNode();
      const radio = await buildRadio();
      for (const method of ['get', 'patch', 'delete'] as const) {
        const res = await call(agent, method, `/api/v1/radios/${radio.id}`, method === 'patch' ? { channel: 40 } : undefined);
        expect(res.status).toBe(404);
        expect(res.body.error).toEqual({ code: 'not_found', message: `Radio ${radio.id} was not found.` });
      }
    });

    it('lets the host of its site read a radio but not change or remove it (403)', async () => {
      const host = await buildUser({ role: 'host' });
      const node = await buildNode({ siteId: (await buildSite({ hostUserId: host.id })).id });
      const radio = await buildRadio({ nodeId: node.id });
      const agent = await signIn(ctx, host);
      const read = await agent.get(`/api/v1/radios/${radio.id}`);
      expect(read.status).toBe(200);
      expect(read.body.data.abilities).toEqual({ update: false, delete: false });
      for (const method of ['patch', 'delete'] as const) {
        const res = await call(agent, method, `/api/v1/radios/${radio.id}`, method === 'patch' ? { channel: 40 } : undefined);
        expect(res.status).toBe(403);
        expect(res.body.error).toEqual({ code: 'forbidden', message: MANAGE });
      }
      const add = await call(agent, 'post', '/api/v1/radios', validRadio(node.id));
      expect(add.status).toBe(403);
      expect(add.body.error.message).toBe('Only admins and the operators of its neighbourhood add radios to this node.');
    });

    it('answers 404 when an operator adds a radio to a node they cannot see, or moves one there', async () => {
      const { node, agent } = await operatorWithNode();
      const hidden = await buildNode();
      const add = await call(agent, 'post', '/api/v1/radios', validRadio(hidden.id));
      expect(add.status).toBe(404);
      expect(add.body.error).toEqual({ code: 'not_found', message: `Node ${hidden.id} was not found.` });
      const radio = await buildRadio({ nodeId: node.id });
      const move = await call(agent, 'patch', `/api/v1/radios/${radio.id}`, { nodeId: hidden.id });
      expect(move.status).toBe(404);
      expect((await Radio.findByPk(radio.id))!.nodeId).toBe(node.id);
    });

    it('hides every radio from a host who hosts nothing', async () => {
      await buildRadio();
      const res = await (await signIn(ctx, await buildUser({ role: 'host' }))).get('/api/v1/radios');
      expect(res.body).toEqual({ data: [], pagination: { page: 1, pageSize: 50, total: 0 }, abilities: { create: false } });
    });
  });

  describe('happy paths', () => {
    it('adds a radio: 201 with the whole record and hasPreSharedKey instead of the key', async () => {
      const { node, agent } = await operatorWithNode();
      const res = await call(agent, 'post', '/api/v1/radios', validRadio(node.id));
      expect(res.status).toBe(201);
      expect(res.body).toEqual({
        data: {
          id: expect.any(Number),
          nodeId: node.id,
          iface: 'wlan1',
          band: '5',
          channel: 44,
          channelWidthMHz: 40,
          txPowerDbm: 17,
          antennaGainDbi: 19,
          polarisation: 'vertical',
          cableLossDb: 0,
          role: 'backhaul-client',
          ssid: 'quayside-backhaul',
          encryption: 'wpa2-ccmp',
          hasPreSharedKey: true,
          groupRekeyS: 600,
          mac: null, // learned from the node's reports, never typed in
          macReportedAt: null,
          createdAt: expect.stringMatching(/Z$/),
          updatedAt: expect.stringMatching(/Z$/),
          abilities: { update: true, delete: true },
        },
      });
      expect((await Radio.findByPk(res.body.data.id))!.preSharedKey).toBe(PSK);
    });

    it('accepts a 2.4 GHz radio on channel 11 at 20 MHz', async () => {
      const node = await buildNode();
      const res = await call(
        await admin(),
        'post',
        '/api/v1/radios',
        validRadio(node.id, { band: '2.4', channel: 11, channelWidthMHz: 20, role: 'access-point' }),
      );
      expect(res.status).toBe(201);
      expect(res.body.data).toMatchObject({ band: '2.4', channel: 11, channelWidthMHz: 20 });
    });

    it('changes only what is sent: a new channel keeps the interface, cable loss and rekey interval', async () => {
      const node = await buildNode();
      const agent = await admin();
      const made = await call(
        agent,
        'post',
        '/api/v1/radios',
        validRadio(node.id, { iface: 'wlan2', cableLossDb: 1.5, groupRekeyS: 3600, polarisation: 'dual' }),
      );
      const res = await call(agent, 'patch', `/api/v1/radios/${made.body.data.id}`, { channel: 149 });
      expect(res.status).toBe(200);
      expect(res.body.data).toMatchObject({ channel: 149, iface: 'wlan2', cableLossDb: 1.5, groupRekeyS: 3600, polarisation: 'dual', hasPreSharedKey: true });
    });

    it('clears the key with preSharedKey: null', async () => {
      const radio = await buildRadio();
      const res = await call(await admin(), 'patch', `/api/v1/radios/${radio.id}`, { preSharedKey: null, encryption: 'none' });
      expect(res.status).toBe(200);
      expect(res.body.data).toMatchObject({ hasPreSharedKey: false, encryption: 'none' });
    });

    it('removes a radio with 204, taking its links with it', async () => {
      const link = await buildLink();
      const agent = await admin();
      const res = await call(agent, 'delete', `/api/v1/radios/${link.radioAId}`);
      expect(res.status).toBe(204);
      expect((await agent.get(`/api/v1/links/${link.id}`)).status).toBe(404);
    });

    it('refuses a second radio on the same interface of one node (409)', async () => {
      const radio = await buildRadio(); // wlan0
      const res = await call(await admin(), 'post', '/api/v1/radios', validRadio(radio.nodeId, { iface: 'wlan0' }));
      expect(res.status).toBe(409);
      expect(res.body.error).toEqual({ code: 'duplicate', message: 'That node already has a radio on interface wlan0. Choose another interface name.' });
    });
  });

  describe('the pre-shared key never leaves the server', () => {
    it('is absent from every answer, for every role that can see the radio', async () => {
      const operator = await buildUser({ role: 'operator' });
      const host = await buildUser({ role: 'host' });
      const hood = await buildNeighbourhood({ operators: [operator] });
      const node = await buildNode({ siteId: (await buildSite({ neighbourhoodId: hood.id, hostUserId: host.id })).id });
      const adminAgent = await admin();
      const made = await call(adminAgent, 'post', '/api/v1/radios', validRadio(node.id));
      const other = await buildRadio({ nodeId: node.id });
      const changed = await call(adminAgent, 'patch', `/api/v1/radios/${made.body.data.id}`, { preSharedKey: `${PSK}-2` });
      const texts = [made.text, changed.text];
      for (const agent of [adminAgent, await signIn(ctx, operator), await signIn(ctx, host)]) {
        texts.push((await agent.get(`/api/v1/radios/${made.body.data.id}`)).text);
        texts.push((await agent.get(`/api/v1/radios?nodeId=${node.id}&pageSize=500`)).text);
        texts.push((await agent.get(`/api/v1/nodes/${node.id}`)).text);
      }
      texts.push((await call(adminAgent, 'post', '/api/v1/links', { radioAId: made.body.data.id, radioBId: other.id })).text);
      texts.push((await adminAgent.get('/api/v1/links')).text);
      expect(texts).toHaveLength(13);
      for (const text of texts) {
        expect(text).not.toContain(PSK);
        expect(text).not.toContain('a-long-enough-test-key'); // the factory's key
        expect(text).not.toMatch(/preSharedKey|pre_shared_key/);
      }
      expect(JSON.parse(texts[2]).data.hasPreSharedKey).toBe(true);
    });
  });

  describe('pagination, sorting and filters on the server', () => {
    it('pageSize=2&sort=-channel on one node gives the right two and a total of 3; band and q filter', async () => {
      const node = await buildNode();
      const agent = await admin();
      const made: Record<number, number> = {};
      for (const [iface, band, channel, ssid] of [
        ['wlan0', '2.4', 6, 'porch-ap'],
        ['wlan1', '5', 100, 'ridge-link'],
        ['wlan2', '5', 36, 'ridge-mesh'],
      ] as const) {
        const res = await call(agent, 'post', '/api/v1/radios', validRadio(node.id, { iface, band, channel, ssid, channelWidthMHz: 20 }));
        expect(res.status).toBe(201);
        made[channel] = res.body.data.id;
      }
      const page = await agent.get(`/api/v1/radios?nodeId=${node.id}&pageSize=2&sort=-channel`);
      expect(ids(page.body)).toEqual([made[100], made[36]]);
      expect(page.body.pagination).toEqual({ page: 1, pageSize: 2, total: 3 });
      expect(ids((await agent.get(`/api/v1/radios?nodeId=${node.id}&band=2.4`)).body)).toEqual([made[6]]);
      expect(ids((await agent.get(`/api/v1/radios?nodeId=${node.id}&q=RIDGE&sort=channel`)).body)).toEqual([made[36], made[100]]);
    });

    it('an operator’s list holds only radios on their neighbourhood’s nodes', async () => {
      const { node, agent } = await operatorWithNode();
      const mine = await buildRadio({ nodeId: node.id });
      await buildRadio();
      const res = await agent.get('/api/v1/radios');
      expect(ids(res.body)).toEqual([mine.id]);
      expect(res.body.abilities).toEqual({ create: true });
    });
  });
});
