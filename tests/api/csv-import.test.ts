import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { Node, Site } from '../../server/models';
import { buildUser, call, signIn, useApi, type Agent } from '../helpers/api';
import { buildNeighbourhood, buildNode, buildSite } from '../helpers/factories';

process.env.CSV_IMPORT_MAX_BYTES = '4096';

const SITE_HEADER = 'name,neighbourhood,latitude,longitude,groundElevationM,antennaHeightM,accessNotes';

describe('CSV import API', () => {
  const ctx = useApi();
  let operator: Agent;
  let admin: Agent;
  let host: Agent;
  let hoodId: number;

  beforeAll(async () => {
    const op = await buildUser({ role: 'operator' });
    hoodId = (await buildNeighbourhood({ name: 'Ferry Lane', operators: [op] })).id;
    await buildNeighbourhood({ name: 'Gull Point' }); // not the operator's
    operator = await signIn(ctx, op);
    admin = await signIn(ctx, await buildUser({ role: 'admin' }));
    host = await signIn(ctx, await buildUser({ role: 'host' }));
  });

  const send = (agent: Agent, kind: string, csv: string | Buffer, query = '', filename = 'import.csv') =>
    agent
      .post(`/api/v1/imports/${kind}${query}`)
      .set('X-CSRF-Token', agent.csrf)
      .attach('file', Buffer.isBuffer(csv) ? csv : Buffer.from(csv), { filename, contentType: 'text/csv' });

  it('refuses signed-out callers (401) and hosts (403)', async () => {
    const out = await request(ctx.app).post('/api/v1/imports/sites').attach('file', Buffer.from(SITE_HEADER), 'a.csv');
    expect(out.status).toBe(401);
    const res = await send(host, 'sites', `${SITE_HEADER}\nA,Ferry Lane,47.6,-38.4,,,`);
    expect(res.status).toBe(403);
    expect(res.body.error.message).toBe('Only admins and operators import sites and nodes.');
  });

  it.each([
    ['an unknown table', 'radios', SITE_HEADER, '', 'kind must be one of sites, nodes'],
    ['a dryRun that is not true or false', 'sites', SITE_HEADER, '?dryRun=maybe', 'dryRun must be true or false'],
    ['a header without latitude', 'sites', 'name,neighbourhood,longitude\nA,Ferry Lane,-38.4', '', 'The header row lacks the column latitude'],
    ['an unknown column', 'sites', `${SITE_HEADER},owner\nA,Ferry Lane,47.6,-38.4,,,,Bob`, '', 'columns Parapet does not know: owner'],
    ['a header with no rows', 'sites', `${SITE_HEADER}\n`, '', 'has a header but no rows'],
  ])('answers 400 for %s', async (_what, kind, csv, query, message) => {
    const res = await send(operator, kind, csv, query);
    expect(res.status).toBe(400);
    expect(res.body.error.message).toContain(message);
  });

  it('answers 400 without a file, 415 for a binary file and 413 for one over the limit', async () => {
    const none = await call(operator, 'post', '/api/v1/imports/sites', {});
    expect(none.status).toBe(400);
    expect(none.body.error.message).toMatch(/No CSV file was sent/);
    const binary = await send(operator, 'sites', Buffer.from([0x50, 0x4b, 0x03, 0x04, 0x00, 0x00, 0x08]), '', 'sheet.csv');
    expect(binary.status).toBe(415);
    expect(binary.body.error.message).toMatch(/Save the sheet as CSV/);
    const big = await send(operator, 'sites', `${SITE_HEADER}\n${'A,Ferry Lane,47.6,-38.4,,,x\n'.repeat(200)}`);
    expect(big.status).toBe(413);
    expect(big.body.error.message).toMatch(/larger than 4 KiB/);
  });

  const mixed = [
    SITE_HEADER,
    'Lantern Roof,Ferry Lane,47.61,-38.41,12,9,Key with the neighbour',
    'Kite Loft,ferry lane,47.62,-38.42,,,', // neighbourhood matched whatever its case
    'Bell Attic,Ferry Lane,97.5,-38.4,,,', // latitude out of range
    'Dune Shed,Gull Point,47.6,-38.4,,,', // a neighbourhood the operator does not run
    'Lantern Roof,Ferry Lane,47.6,-38.4,,,', // the same name twice in one neighbourhood
    'Spar Yard,Ferry Lane,north,-38.4,,-2,', // two errors on one row
  ].join('\r\n');

  it('previews every row with its own errors on a dry run, and writes nothing', async () => {
    const before = await Site.count();
    const res = await send(operator, 'sites', mixed, '?dryRun=true');
    expect(res.status).toBe(200);
    const { rows, validCount, errorCount, columns } = res.body.data;
    expect(columns).toEqual(SITE_HEADER.split(','));
    expect(validCount).toBe(2);
    expect(errorCount).toBe(4);
    expect(rows.map((r: { row: number; errors: unknown[] }) => [r.row, r.errors])).toEqual([
      [1, []],
      [2, []],
      [3, [{ path: 'rows.3.latitude', message: 'rows.3.latitude must be between -90 and 90' }]],
      [4, [{ path: 'rows.4.neighbourhood', message: 'rows.4.neighbourhood "Gull Point" is not a neighbourhood you can see; check the spelling' }]],
      [5, [{ path: 'rows.5.name', message: 'rows.5.name "Lantern Roof" is already a site in Ferry Lane (or earlier in this file); choose another name' }]],
      [
        6,
        [
          { path: 'rows.6.latitude', message: 'rows.6.latitude must be a number' },
          { path: 'rows.6.antennaHeightM', message: 'rows.6.antennaHeightM must be 0 m or more' },
        ],
      ],
    ]);
    expect(rows[0].values).toMatchObject({ name: 'Lantern Roof', neighbourhood: 'Ferry Lane', latitude: '47.61' });
    expect(await Site.count()).toBe(before);
  });

  it('imports nothing when one row is bad, and says which row and field', async () => {
    const before = await Site.count();
    const oneBad = [
      SITE_HEADER,
      'Lantern Roof,Ferry Lane,47.61,-38.41,12,9,',
      'Kite Loft,Ferry Lane,47.62,-38.42,,,',
      'Bell Attic,Ferry Lane,97.5,-38.4,,,',
    ].join('\n');
    const res = await send(operator, 'sites', oneBad);
    expect(res.status).toBe(400);
    expect(res.body.error.message).toBe(
      'Nothing was imported: 1 of 3 rows has an error. First: rows.3.latitude must be between -90 and 90. Fix the file and send it again.',
    );
    expect(res.body.error.details).toEqual([{ path: 'rows.3.latitude', message: 'rows.3.latitude must be between -90 and 90' }]);
    expect(await Site.count()).toBe(before);
    expect(await Site.findOne({ where: { name: 'Lantern Roof' } })).toBeNull();
  });

  it('imports every row of a clean file in one go', async () => {
    const clean = [SITE_HEADER, 'Lantern Roof,Ferry Lane,47.61,-38.41,12,9,"Key with the neighbour, ring twice"', 'Kite Loft,Ferry Lane,47.62,-38.42,,,'].join(
      '\n',
    );
    const res = await send(operator, 'sites', clean);
    expect(res.status).toBe(201);
    expect(res.body.data).toMatchObject({ kind: 'sites', created: 2 });
    const lantern = await Site.findOne({ where: { name: 'Lantern Roof' } });
    expect(lantern).toMatchObject({
      neighbourhoodId: hoodId,
      latitude: 47.61,
      longitude: -38.41,
      groundElevationM: 12,
      antennaHeightM: 9,
      accessNotes: 'Key with the neighbour, ring twice',
    });
    expect((await Site.findOne({ where: { name: 'Kite Loft' } }))!.antennaHeightM).toBe(0); // the schema's default
    const again = await send(operator, 'sites', clean);
    expect(again.status).toBe(400);
    expect(again.body.error.details.map((d: { path: string }) => d.path)).toEqual(['rows.1.name', 'rows.2.name']);
  });

  it('imports nodes onto named sites, in the site’s neighbourhood, all or nothing', async () => {
    await buildNode({ name: 'lf-taken' });
    const otherSite = await buildSite({ name: 'Far Tower' }); // in a neighbourhood the operator does not run
    const header = 'name,site,hardware,firmware,managementAddress,reportIntervalS';
    const bad = [
      header,
      'lf-lantern,Lantern Roof,CPE,Tilecrest 5.1.2,10.9.0.1,60',
      'lf-taken,Kite Loft,,,,',
      'lf-kite,Kite Loft,,,10.9.0.300,abc',
      `lf-far,${otherSite.name},,,,`,
    ].join('\n');
    const res = await send(operator, 'nodes', bad);
    expect(res.status).toBe(400);
    expect(res.body.error.details).toEqual([
      {
        path: 'rows.2.name',
        message: 'rows.2.name "lf-taken" is already a node name (or appears earlier in this file); node names are unique across the network',
      },
      { path: 'rows.3.managementAddress', message: 'rows.3.managementAddress must be an IPv4 address like 10.20.1.1' },
      { path: 'rows.3.reportIntervalS', message: 'rows.3.reportIntervalS must be a number' },
      { path: 'rows.4.site', message: 'rows.4.site "Far Tower" is not a site you can see; check the spelling' },
    ]);
    expect(await Node.count({ where: { name: 'lf-lantern' } })).toBe(0);

    const good = await send(operator, 'nodes', [header, 'lf-lantern,Lantern Roof,CPE,Tilecrest 5.1.2,10.9.0.1,30', 'lf-kite,kite loft,,,,'].join('\n'));
    expect(good.status).toBe(201);
    const lantern = await Node.findOne({ where: { name: 'lf-lantern' } });
    expect(lantern).toMatchObject({ neighbourhoodId: hoodId, hardware: 'CPE', reportIntervalS: 30, managementAddress: '10.9.0.1' });
    expect((await Node.findOne({ where: { name: 'lf-kite' } }))!.reportIntervalS).toBe(60);
  });

  it('lets an admin import into any neighbourhood', async () => {
    const res = await send(admin, 'sites', `${SITE_HEADER}\nDune Shed,Gull Point,47.6,-38.4,,,`);
    expect(res.status).toBe(201);
    expect(res.body.data.created).toBe(1);
  });
});
