import request from 'supertest';
import Papa from 'papaparse';
import { beforeAll, describe, expect, it } from 'vitest';
import { Radio } from '../../server/models';
import { buildUser, call, signIn, useApi, type Agent } from '../helpers/api';
import { buildLink, buildNeighbourhood, buildNode, buildRadio, buildSite } from '../helpers/factories';

const rowsOf = (text: string) => Papa.parse<Record<string, string>>(text.replace(/^\uFEFF/, ''), { header: true, skipEmptyLines: true }).data;

describe('CSV export API', () => {
  const ctx = useApi();
  let operator: Agent;
  let admin: Agent;
  let host: Agent;

  beforeAll(async () => {
    const op = await buildUser({ role: 'operator' });
    const hood = await buildNeighbourhood({ name: 'Ferry Lane', operators: [op] });
    const hostUser = await buildUser({ role: 'host' });
    const site = await buildSite({ neighbourhoodId: hood.id, name: '=HYPERLINK("http://evil.example","click")', hostUserId: hostUser.id, longitude: -38.41 });
    await site.update({ accessNotes: '@SUM(1+1)' });
    await buildSite({ neighbourhoodId: hood.id, name: '+1 Roof' });
    await buildSite({ neighbourhoodId: hood.id, name: '-2+3 Roof' });
    await buildSite({ neighbourhoodId: hood.id, name: '\tTabbed Roof' });
    const node = await buildNode({ siteId: site.id, name: 'lf-export' });
    await node.update({ firmware: '=1+2\nsecond line' });
    const radio = await buildRadio({ nodeId: node.id });
    await buildLink({ radioAId: radio.id, neighbourhoodId: hood.id });
    await buildSite({ name: 'Elsewhere Roof' }); // another neighbourhood
    operator = await signIn(ctx, op);
    admin = await signIn(ctx, await buildUser({ role: 'admin' }));
    host = await signIn(ctx, hostUser);
  });

  it('refuses signed-out callers with 401 and unknown tables with 400', async () => {
    expect((await request(ctx.app).get('/api/v1/exports/sites.csv')).status).toBe(401);
    const res = await call(operator, 'get', '/api/v1/exports/users.csv');
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].message).toBe('file must be one of sites.csv, nodes.csv, radios.csv, links.csv');
  });

  it('neutralises every cell a spreadsheet would run as a formula, and leaves numbers alone', async () => {
    const res = await call(operator, 'get', '/api/v1/exports/sites.csv');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="parapet-sites-\d{4}-\d{2}-\d{2}\.csv"$/);
    const rows = rowsOf(res.text);
    const names = rows.map((r) => r.name);
    expect(names).toEqual(expect.arrayContaining(['\'=HYPERLINK("http://evil.example","click")', "'+1 Roof", "'-2+3 Roof", "'\tTabbed Roof"]));
    const evil = rows.find((r) => r.name.startsWith("'=HYPERLINK"))!;
    expect(evil.accessNotes).toBe("'@SUM(1+1)");
    expect(evil.longitude).toBe('-38.41');
    for (const r of rows) for (const cell of Object.values(r)) if (/^[=+@\t\r]/.test(cell)) throw new Error(`unsafe cell ${JSON.stringify(cell)}`);

    const nodes = rowsOf((await call(operator, 'get', '/api/v1/exports/nodes.csv')).text);
    expect(nodes.find((n) => n.name === 'lf-export')!.firmware).toBe("'=1+2\nsecond line");
  });

  it('never exports pre-shared keys', async () => {
    const psk = (await Radio.findOne())!.preSharedKey!;
    const res = await call(admin, 'get', '/api/v1/exports/radios.csv');
    expect(res.status).toBe(200);
    expect(rowsOf(res.text).length).toBeGreaterThan(0);
    expect(res.text).not.toContain(psk);
    expect(res.text.split('\r\n')[0]).not.toMatch(/preSharedKey|psk|passphrase/i);
  });

  it('exports only what the caller may read', async () => {
    const mineRows = rowsOf((await call(operator, 'get', '/api/v1/exports/sites.csv')).text);
    expect(mineRows.length).toBeGreaterThanOrEqual(4);
    expect(mineRows.every((r) => r.neighbourhood === 'Ferry Lane')).toBe(true);
    expect(mineRows.map((r) => r.name)).not.toContain('Elsewhere Roof');
    expect(rowsOf((await call(admin, 'get', '/api/v1/exports/sites.csv')).text).map((r) => r.name)).toContain('Elsewhere Roof');
    const hosted = rowsOf((await call(host, 'get', '/api/v1/exports/sites.csv')).text);
    expect(hosted.map((r) => r.name)).toEqual(['\'=HYPERLINK("http://evil.example","click")']);
    expect(rowsOf((await call(host, 'get', '/api/v1/exports/nodes.csv')).text).map((r) => r.name)).toEqual(['lf-export']);
    const hostLinks = await call(host, 'get', '/api/v1/exports/links.csv');
    expect(hostLinks.status).toBe(200);
    expect(rowsOf(hostLinks.text)).toEqual([]); // links are infrastructure: hosts see none
    expect(rowsOf((await call(operator, 'get', '/api/v1/exports/links.csv')).text)).toHaveLength(1);
  });
});
