import request from 'supertest';
import { beforeEach, describe, expect, it } from 'vitest';
import { Link, Neighbourhood, Node, Radio, Site, User } from '../../server/models';
import { buildUser, call, signIn, useApi } from '../helpers/api';
import { buildLink, buildNeighbourhood, buildNode, buildRadio, buildSite } from '../helpers/factories';

/*
 * Who may do what, cell by cell: every role against every inventory resource and every action,
 * on a record in neighbourhood A. Each case builds its own small world on an emptied database,
 * so a list shows exactly the records the role may read.
 */

type Role = 'admin' | 'operatorA' | 'operatorB' | 'hostA' | 'hostOfNothing' | 'signedOut';
type Resource = 'neighbourhoods' | 'sites' | 'nodes' | 'radios' | 'links' | 'users';
type Action = 'list' | 'read' | 'create' | 'update' | 'delete';

const ROLES: Role[] = ['admin', 'operatorA', 'operatorB', 'hostA', 'hostOfNothing', 'signedOut'];
const WHO: Record<Role, string> = {
  admin: 'an admin',
  operatorA: 'an operator of hood A',
  operatorB: 'an operator of hood B',
  hostA: 'the host of a site in hood A',
  hostOfNothing: 'a host of nothing',
  signedOut: 'a signed-out caller',
};
const DOING: Record<Action, string> = { list: 'listing', read: 'reading', create: 'creating', update: 'updating', delete: 'deleting' };
const WHAT: Record<Resource, Record<Action, string>> = {
  neighbourhoods: { list: 'neighbourhoods', read: 'hood A', create: 'a neighbourhood', update: 'hood A', delete: 'hood A (which still has sites)' },
  sites: { list: 'sites', read: 'a site in hood A', create: 'a site in hood A', update: 'a site in hood A', delete: 'an empty site in hood A' },
  nodes: { list: 'nodes', read: 'a node in hood A', create: 'a node on a site in hood A', update: 'a node in hood A', delete: 'a node in hood A' },
  radios: { list: 'radios', read: 'a radio in hood A', create: 'a radio on a node in hood A', update: 'a radio in hood A', delete: 'a radio in hood A' },
  links: { list: 'links', read: 'a link inside hood A', create: 'a link inside hood A', update: 'a link inside hood A', delete: 'a link inside hood A' },
  users: {
    list: 'people',
    read: 'the host of a site in hood A',
    create: 'a person',
    update: 'the host of a site in hood A',
    delete: 'the host of a site in hood A',
  },
};

/** Records every list may return, by name; lists below name the ones each role reads. */
type Named =
  | 'hoodA'
  | 'hoodB'
  | 'siteA'
  | 'siteA2'
  | 'siteB'
  | 'nodeA1'
  | 'nodeA2'
  | 'nodeB'
  | 'radioA1'
  | 'radioA2'
  | 'radioA3'
  | 'radioB1'
  | 'radioB2'
  | 'linkA'
  | 'linkB'
  | 'linkAB'
  | Role;

// [list (ids or a status), read, create, update, delete] per role; lists name what comes back with 200.
type Row = [Named[] | number, number, number, number, number];
const MATRIX: Record<Resource, Record<Role, Row>> = {
  neighbourhoods: {
    admin: [['hoodA', 'hoodB'], 200, 201, 200, 409],
    operatorA: [['hoodA'], 200, 403, 403, 403],
    operatorB: [['hoodB'], 404, 403, 404, 404],
    hostA: [['hoodA'], 200, 403, 403, 403],
    hostOfNothing: [[], 404, 403, 404, 404],
    signedOut: [401, 401, 401, 401, 401],
  },
  sites: {
    admin: [['siteA', 'siteA2', 'siteB'], 200, 201, 200, 204],
    operatorA: [['siteA', 'siteA2'], 200, 201, 200, 204],
    operatorB: [['siteB'], 404, 404, 404, 404],
    hostA: [['siteA', 'siteA2'], 200, 403, 403, 403],
    hostOfNothing: [[], 404, 404, 404, 404],
    signedOut: [401, 401, 401, 401, 401],
  },
  nodes: {
    admin: [['nodeA1', 'nodeA2', 'nodeB'], 200, 201, 200, 204],
    operatorA: [['nodeA1', 'nodeA2'], 200, 201, 200, 204],
    operatorB: [['nodeB'], 404, 404, 404, 404],
    hostA: [['nodeA1', 'nodeA2'], 200, 403, 403, 403],
    hostOfNothing: [[], 404, 404, 404, 404],
    signedOut: [401, 401, 401, 401, 401],
  },
  radios: {
    admin: [['radioA1', 'radioA2', 'radioA3', 'radioB1', 'radioB2'], 200, 201, 200, 204],
    operatorA: [['radioA1', 'radioA2', 'radioA3'], 200, 201, 200, 204],
    operatorB: [['radioB1', 'radioB2'], 404, 404, 404, 404],
    hostA: [['radioA1', 'radioA2', 'radioA3'], 200, 403, 403, 403],
    hostOfNothing: [[], 404, 404, 404, 404],
    signedOut: [401, 401, 401, 401, 401],
  },
  links: {
    admin: [['linkA', 'linkB', 'linkAB'], 200, 201, 200, 204],
    operatorA: [['linkA', 'linkAB'], 200, 201, 200, 204],
    operatorB: [['linkB', 'linkAB'], 404, 404, 404, 404],
    // Hosts read no links, but may read both radios, so adding one is refused rather than hidden.
    hostA: [[], 404, 403, 404, 404],
    hostOfNothing: [[], 404, 404, 404, 404],
    signedOut: [401, 401, 401, 401, 401],
  },
  users: {
    admin: [['admin', 'operatorA', 'operatorB', 'hostA', 'hostOfNothing'], 200, 201, 200, 204],
    operatorA: [403, 403, 403, 403, 403],
    operatorB: [403, 403, 403, 403, 403],
    hostA: [403, 403, 403, 403, 403],
    hostOfNothing: [403, 403, 403, 403, 403],
    signedOut: [401, 401, 401, 401, 401],
  },
};

const ACTIONS: Action[] = ['list', 'read', 'create', 'update', 'delete'];
const CREATED: Record<Action, number> = { list: 200, read: 200, create: 201, update: 200, delete: 204 };

interface Case {
  role: Role;
  resource: Resource;
  action: Action;
  status: number;
  listed?: Named[];
}
const cases: [string, Case][] = [];
for (const resource of Object.keys(MATRIX) as Resource[]) {
  for (const role of ROLES) {
    MATRIX[resource][role].forEach((cell, i) => {
      const action = ACTIONS[i];
      const listed = Array.isArray(cell) ? cell : undefined;
      const status = listed ? 200 : (cell as number);
      const outcome = listed ? `200 with ${listed.length ? listed.join(', ') : 'nothing'}` : String(status);
      cases.push([`${WHO[role]} ${DOING[action]} ${WHAT[resource][action]} gets ${outcome}`, { role, resource, action, status, listed }]);
    });
  }
}

describe('role-based access matrix', () => {
  const ctx = useApi();
  // Deleting a few small tables is much quicker than TRUNCATE, which 180 cases would feel.
  beforeEach(async () => {
    await ctx.sequelize.query(
      'DELETE FROM links; DELETE FROM radios; DELETE FROM nodes; DELETE FROM sites; ' +
        'DELETE FROM operator_assignments; DELETE FROM neighbourhoods; DELETE FROM users;',
    );
  });

  /** Two neighbourhoods with sites, nodes, radios and links, and one person per role. */
  async function buildWorld() {
    const people = {
      admin: await buildUser({ role: 'admin' }),
      operatorA: await buildUser({ role: 'operator' }),
      operatorB: await buildUser({ role: 'operator' }),
      hostA: await buildUser({ role: 'host', phone: '+00 555 0142' }),
      hostOfNothing: await buildUser({ role: 'host' }),
    };
    const hoodA = await buildNeighbourhood({ name: 'Hood A', operators: [people.operatorA] });
    const hoodB = await buildNeighbourhood({ name: 'Hood B', operators: [people.operatorB] });
    const siteA = await buildSite({ neighbourhoodId: hoodA.id, hostUserId: people.hostA.id });
    const siteA2 = await buildSite({ neighbourhoodId: hoodA.id, hostUserId: people.hostA.id });
    const siteB = await buildSite({ neighbourhoodId: hoodB.id });
    const nodeA1 = await buildNode({ siteId: siteA.id });
    const nodeA2 = await buildNode({ siteId: siteA.id });
    const nodeB = await buildNode({ siteId: siteB.id });
    const radioA1 = await buildRadio({ nodeId: nodeA1.id });
    const radioA2 = await buildRadio({ nodeId: nodeA2.id });
    const radioA3 = await buildRadio({ nodeId: nodeA2.id, iface: 'wlan1' });
    const radioB1 = await buildRadio({ nodeId: nodeB.id });
    const radioB2 = await buildRadio({ nodeId: nodeB.id, iface: 'wlan1' });
    const linkA = await buildLink({ radioAId: radioA1.id, radioBId: radioA2.id });
    const linkB = await buildLink({ radioAId: radioB1.id, radioBId: radioB2.id });
    const linkAB = await buildLink({ radioAId: radioA2.id, radioBId: radioB1.id });
    const records = { hoodA, hoodB, siteA, siteA2, siteB, nodeA1, nodeA2, nodeB, radioA1, radioA2, radioA3, radioB1, radioB2, linkA, linkB, linkAB };
    const idOf = (name: Named): number => (name in people ? people[name as keyof typeof people] : records[name as keyof typeof records]).id;
    return { people, records, idOf };
  }

  type World = Awaited<ReturnType<typeof buildWorld>>;

  /** The record each action aims at, and what a create sends. */
  function target(world: World, resource: Resource, action: Action) {
    const { records: r, people } = world;
    const spec = {
      neighbourhoods: { model: Neighbourhood, id: r.hoodA.id, create: { name: 'Fresh Hood' }, update: { description: 'Changed' } },
      sites: {
        model: Site,
        id: action === 'delete' ? r.siteA2.id : r.siteA.id,
        create: { name: 'Fresh Site', neighbourhoodId: r.hoodA.id, latitude: 47.6, longitude: -38.4 },
        update: { accessNotes: 'Changed' },
      },
      nodes: { model: Node, id: r.nodeA1.id, create: { name: 'fresh-node', siteId: r.siteA.id }, update: { firmware: 'changed' } },
      radios: {
        model: Radio,
        id: action === 'delete' ? r.radioA3.id : r.radioA1.id,
        create: {
          nodeId: r.nodeA1.id,
          iface: 'wlan5',
          band: '5',
          channel: 36,
          channelWidthMHz: 20,
          txPowerDbm: 10,
          antennaGainDbi: 5,
          role: 'mesh',
          encryption: 'none',
        },
        update: { txPowerDbm: 12 },
      },
      links: { model: Link, id: r.linkA.id, create: { radioAId: r.radioA1.id, radioBId: r.radioA3.id }, update: { status: 'live' } },
      users: {
        model: User,
        id: people.hostA.id,
        create: { email: 'fresh.person@example.test', name: 'Fresh Person', role: 'host', password: 'a-long-fresh-password' },
        update: { phone: '+00 555 0999' },
      },
    }[resource];
    return spec as { model: { findByPk(id: number): Promise<unknown> }; id: number; create: object; update: object };
  }

  it.each(cases)('%s', async (_title, { role, resource, action, status, listed }) => {
    const world = await buildWorld();
    const agent = role === 'signedOut' ? request(ctx.app) : await signIn(ctx, world.people[role]);
    const { model, id, create, update } = target(world, resource, action);
    const base = `/api/v1/${resource}`;
    const res =
      action === 'list'
        ? await call(agent, 'get', `${base}?pageSize=500`)
        : action === 'read'
          ? await call(agent, 'get', `${base}/${id}`)
          : action === 'create'
            ? await call(agent, 'post', base, create)
            : action === 'update'
              ? await call(agent, 'patch', `${base}/${id}`, update)
              : await call(agent, 'delete', `${base}/${id}`);

    expect(res.status, JSON.stringify(res.body)).toBe(status);
    const code = { 401: 'not_signed_in', 403: 'forbidden', 404: 'not_found', 409: 'in_use' }[status];
    if (code) expect(res.body.error.code).toBe(code);
    if (listed) {
      expect(res.body.data.map((row: { id: number }) => row.id).sort((a: number, b: number) => a - b)).toEqual(listed.map(world.idOf).sort((a, b) => a - b));
      expect(res.body.pagination.total).toBe(listed.length);
    }
    if (action === 'delete') {
      // A refused delete leaves the record; an allowed one removes it.
      expect(Boolean(await model.findByPk(id))).toBe(status !== CREATED.delete);
    }
    if (res.status === 404) expect(res.body.error.message).toMatch(/^(Neighbourhood|Site|Node|Radio|Link) \d+ was not found\.$/);
  });
});
