import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { SURVEY_MAX_BYTES } from '../../shared/radio/surveyCsv';
import { useApi, type Agent } from '../helpers/api';
import { planningCast } from '../helpers/planningActors';

const GOOD = 'ssid,channel,channelWidthMHz,signalDbm\nCafe Guest,6,20,-71\nHarbour Free,11,20,-64\n';
const upload = (agent: Agent, nodeId: number, content: string | Buffer, fileName = 'survey.csv') =>
  agent
    .post(`/api/v1/nodes/${nodeId}/site-surveys`)
    .set('X-CSRF-Token', agent.csrf)
    .attach('file', Buffer.isBuffer(content) ? content : Buffer.from(content), fileName);

describe('site surveys API', () => {
  const ctx = useApi();

  it('answers 401 signed out and 404 for a node the caller cannot read', async () => {
    const { outsider, node } = await planningCast(ctx);
    expect((await request(ctx.app).post(`/api/v1/nodes/${node.id}/site-surveys`).attach('file', Buffer.from(GOOD), 'a.csv')).status).toBe(401);
    const res = await upload(outsider, node.id, GOOD);
    expect(res.status).toBe(404);
    expect(res.body.error.message).toBe(`Node ${node.id} was not found.`);
  });

  it('refuses a host of the node (403)', async () => {
    const { host, node } = await planningCast(ctx);
    const { Site } = await import('../../server/models');
    await Site.update({ hostUserId: host.userId }, { where: { id: node.siteId } });
    const res = await upload(host, node.id, GOOD);
    expect(res.status).toBe(403);
    expect((await host.get(`/api/v1/nodes/${node.id}/site-surveys`)).status).toBe(403);
  });

  it('stores a good survey and lists it back, keeping only the base of the file name', async () => {
    const { op, node } = await planningCast(ctx);
    const res = await upload(op, node.id, GOOD, '../../etc/passwd.csv');
    expect(res.status).toBe(201);
    expect(res.body.data.rowCount).toBe(2);
    expect(res.body.data.fileName).toBe('passwd.csv');
    expect(res.body.rejectedRows).toEqual([]);
    const win = await upload(op, node.id, GOOD, 'C:\\Users\\x\\..\\scan.csv');
    expect(win.body.data.fileName).toBe('scan.csv');
    const list = await op.get(`/api/v1/nodes/${node.id}/site-surveys`);
    expect(list.status).toBe(200);
    expect(list.body.data[0].rows[0]).toEqual({ ssid: 'Cafe Guest', band: '2.4', channel: 6, channelWidthMHz: 20, signalDbm: -71 });
  });

  it('keeps the good rows and names each bad one with its line number', async () => {
    const { op, node } = await planningCast(ctx);
    const csv = 'ssid,channel,channelWidthMHz,signalDbm\nOk,1,20,-80\nBad channel,15,20,-70\nLoud,6,20,12\nShort,6\n';
    const res = await upload(op, node.id, csv);
    expect(res.status).toBe(201);
    expect(res.body.data.rowCount).toBe(1);
    expect(res.body.rejectedRows).toEqual([
      { line: 3, message: 'channel 15 is not a Wi-Fi channel (2.4 GHz: 1–14, 5 GHz: 32–196)' },
      { line: 4, message: 'signalDbm 12 must be between -120 and 0' },
      { line: 5, message: 'expected 4 fields, found 2' },
    ]);
  });

  it('refuses a survey with no usable row (400) and lists the lines', async () => {
    const { op, node } = await planningCast(ctx);
    const res = await upload(op, node.id, 'ssid,channel,channelWidthMHz,signalDbm\nA,abc,20,-70\n');
    expect(res.status).toBe(400);
    expect(res.body.error.details).toEqual([{ path: 'line.2', message: 'line 2: channel "abc" must be a whole number' }]);
    const header = await upload(op, node.id, 'name,freq\nx,2412\n');
    expect(header.status).toBe(400);
    expect(header.body.error.message).toMatch(/line 1: the header must name ssid, channel, channelWidthMHz, signalDbm/);
  });

  it('refuses content that is not CSV text (400)', async () => {
    const { op, node } = await planningCast(ctx);
    const png = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0x00, 0x00, 0x00, 0x0d]);
    const res = await upload(op, node.id, png, 'survey.csv');
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/^The file is not text; export the survey as a CSV/);
    const latin1 = await upload(op, node.id, Buffer.from([0x73, 0x73, 0x69, 0x64, 0xe9, 0x0a]));
    expect(latin1.status).toBe(400);
    expect(latin1.body.error.message).toMatch(/not UTF-8 text/);
  });

  it('refuses a request without a file, or with the file under another field name (400)', async () => {
    const { op, node } = await planningCast(ctx);
    const none = await op.post(`/api/v1/nodes/${node.id}/site-surveys`).set('X-CSRF-Token', op.csrf).send({ csv: GOOD });
    expect(none.status).toBe(400);
    expect(none.body.error.message).toMatch(/Attach the survey file in the form field "file"/);
    const other = await op.post(`/api/v1/nodes/${node.id}/site-surveys`).set('X-CSRF-Token', op.csrf).attach('upload', Buffer.from(GOOD), 'a.csv');
    expect(other.status).toBe(400);
    expect(other.body.error.message).toMatch(/form field "file"/);
  });

  it('refuses a file over the size limit (413)', async () => {
    const { op, node } = await planningCast(ctx);
    const row = 'Filler,6,20,-80\n';
    const big = 'ssid,channel,channelWidthMHz,signalDbm\n' + row.repeat(Math.ceil(SURVEY_MAX_BYTES / row.length) + 10);
    const res = await upload(op, node.id, big);
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('too_large');
  });

  it('needs the CSRF token', async () => {
    const { op, node } = await planningCast(ctx);
    const res = await op.post(`/api/v1/nodes/${node.id}/site-surveys`).attach('file', Buffer.from(GOOD), 'a.csv');
    expect(res.status).toBe(403);
  });
});
