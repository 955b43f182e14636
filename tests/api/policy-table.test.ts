import { Op, QueryTypes } from 'sequelize';
import { beforeAll, describe, expect, it } from 'vitest';
import { Link, Node, User } from '../../server/models';
import { type Actor, loadActor } from '../../server/policies/actor';
import { mayReadPlan, planAbilities, planScopeSql } from '../../server/policies/addressPlan';
import { linkAbilities, linkScope, linkScopeSql, mayReadLink } from '../../server/policies/link';
import { mayReadNode, nodeAbilities, nodeRooms, nodeScope, nodeScopeSql, roomsOf } from '../../server/policies/node';
import { mayReadRadio, radioAbilities } from '../../server/policies/radio';
import { linkEnds } from '../../server/services/references';
import { type Agent, buildUser, call, signIn, useApi } from '../helpers/api';
import { buildLink, buildNeighbourhood, buildNode, buildRadio, buildSite } from '../helpers/factories';

/*
 * Each access rule once, as a table: who (admin, the operator of the neighbourhood, an operator of
 * another, the host of the site, the host of another site, a deactivated person) × what (a node, its
 * radio, a link inside its neighbourhood, its address plan) × action (read, manage). Every cell is
 * checked in every shape the rule takes: the predicate, the Sequelize scope, the raw-SQL scope, the
 * live-update rooms (nodes) and the HTTP answer, so no copy of a rule can drift from the others.
 */

type Who = 'admin' | 'operatorOfHood' | 'operatorOfOther' | 'hostOfSite' | 'hostOfOther' | 'deactivated';
type What = 'node' | 'radio' | 'link' | 'plan';
/** [read, manage]; manage is only asked of what the caller reads. */
type Cell = [boolean, boolean];

const TABLE: Record<What, Record<Who, Cell>> = {
  node: {
    admin: [true, true],
    operatorOfHood: [true, true],
    operatorOfOther: [false, false],
    hostOfSite: [true, false],
    hostOfOther: [false, false],
    deactivated: [false, false],
  },
  radio: {
    admin: [true, true],
    operatorOfHood: [true, true],
    operatorOfOther: [false, false],
    hostOfSite: [true, false],
    hostOfOther: [false, false],
    deactivated: [false, false],
  },
  // Links are infrastructure: a host reads none, not even the one on their roof.
  link: {
    admin: [true, true],
    operatorOfHood: [true, true],
    operatorOfOther: [false, false],
    hostOfSite: [false, false],
    hostOfOther: [false, false],
    deactivated: [false, false],
  },
  plan: {
    admin: [true, true],
    operatorOfHood: [true, true],
    operatorOfOther: [false, false],
    hostOfSite: [false, false],
    hostOfOther: [false, false],
    deactivated: [false, false],
  },
};
const WHO: Who[] = ['admin', 'operatorOfHood', 'operatorOfOther', 'hostOfSite', 'hostOfOther', 'deactivated'];

describe('policy table: role × resource × action', () => {
  const ctx = useApi();
  const people = {} as Record<Who, User>;
  const agents = {} as Record<Who, Agent>;
  const actors = {} as Record<Who, Actor | null>;
  let node: Node;
  let radioId: number;
  let link: Link;

  beforeAll(async () => {
    people.admin = await buildUser({ role: 'admin' });
    people.operatorOfHood = await buildUser({ role: 'operator' });
    people.operatorOfOther = await buildUser({ role: 'operator' });
    people.hostOfSite = await buildUser({ role: 'host' });
    people.hostOfOther = await buildUser({ role: 'host' });
    // Was an operator of the neighbourhood and hosts the site: deactivation must take both away.
    people.deactivated = await buildUser({ role: 'operator' });
    const hood = await buildNeighbourhood({ operators: [people.operatorOfHood, people.deactivated] });
    const other = await buildNeighbourhood({ operators: [people.operatorOfOther] });
    const site = await buildSite({ neighbourhoodId: hood.id, hostUserId: people.hostOfSite.id });
    await buildSite({ neighbourhoodId: other.id, hostUserId: people.hostOfOther.id });
    await buildSite({ neighbourhoodId: hood.id, hostUserId: people.deactivated.id });
    node = await buildNode({ siteId: site.id });
    const otherNode = await buildNode({ neighbourhoodId: other.id });
    radioId = (await buildRadio({ nodeId: node.id, iface: 'wlan0' })).id;
    const peer = await buildRadio({ nodeId: (await buildNode({ neighbourhoodId: hood.id })).id });
    link = (await Link.findByPk((await buildLink({ radioAId: radioId, radioBId: peer.id })).id, { include: linkEnds() }))!;
    await buildLink({ neighbourhoodId: other.id });
    for (const n of [node, otherNode]) {
      await ctx.sequelize.query(`INSERT INTO node_address_plans (node_id, cidr, gateway) VALUES ($1, $2::cidr, $3::inet)`, {
        bind: [n.id, `10.77.${n.id}.0/24`, `10.77.${n.id}.1`],
      });
    }
    for (const who of WHO) agents[who] = await signIn(ctx, people[who]);
    await people.deactivated.update({ active: false });
    for (const who of WHO) actors[who] = await loadActor(people[who].id);
  });

  it('a deactivated person has no actor, and every call of theirs is refused as signed out', async () => {
    expect(actors.deactivated).toBeNull();
    for (const url of [`/api/v1/nodes/${node.id}`, `/api/v1/radios/${radioId}`, `/api/v1/links/${link.id}`, '/api/v1/address-plans', '/api/v1/topology']) {
      expect((await call(agents.deactivated, 'get', url)).status, url).toBe(401);
    }
  });

  const live = WHO.filter((w) => w !== 'deactivated');
  const ends = () => ({ neighbourhoodAId: link.radioA!.node!.neighbourhoodId, neighbourhoodBId: link.radioB!.node!.neighbourhoodId });
  const sqlCount = async (sql: string, bind: unknown[]) => Number((await ctx.sequelize.query<{ c: string }>(sql, { bind, type: QueryTypes.SELECT }))[0].c);

  describe.each(live)('%s', (who) => {
    const actor = () => actors[who]!;

    it(`node: read ${TABLE.node[who][0]}, manage ${TABLE.node[who][1]}`, async () => {
      const [read, manage] = TABLE.node[who];
      expect(mayReadNode(actor(), node)).toBe(read);
      expect((await Node.count({ where: { [Op.and]: [{ id: node.id }, nodeScope(actor())] } })) > 0).toBe(read);
      expect((await sqlCount(`SELECT count(*) AS c FROM nodes n WHERE n.id = $1 AND ${nodeScopeSql(actor(), 'n')}`, [node.id])) > 0).toBe(read);
      const hostSql = 'SELECT host_user_id AS h FROM sites WHERE id = $1';
      const hosted = (await ctx.sequelize.query<{ h: number | null }>(hostSql, { bind: [node.siteId], type: QueryTypes.SELECT }))[0].h;
      const rooms = nodeRooms({ neighbourhoodId: node.neighbourhoodId, hostUserId: hosted });
      expect(roomsOf(actor()).some((r) => rooms.includes(r))).toBe(read);
      const res = await call(agents[who], 'get', `/api/v1/nodes/${node.id}`);
      expect(res.status).toBe(read ? 200 : 404);
      const topo = await call(agents[who], 'get', '/api/v1/topology');
      expect(topo.status).toBe(200);
      expect(topo.body.data.nodes.some((n: { id: number }) => n.id === node.id)).toBe(read);
      expect(nodeAbilities(actor(), node).update).toBe(manage);
      if (read) expect(res.body.data.abilities.update).toBe(manage);
    });

    it(`radio: read ${TABLE.radio[who][0]}, manage ${TABLE.radio[who][1]}`, async () => {
      const [read, manage] = TABLE.radio[who];
      expect(mayReadRadio(actor(), node)).toBe(read);
      const res = await call(agents[who], 'get', `/api/v1/radios/${radioId}`);
      expect(res.status).toBe(read ? 200 : 404);
      const list = await call(agents[who], 'get', '/api/v1/radios');
      expect(list.body.data.some((r: { id: number }) => r.id === radioId)).toBe(read);
      expect(radioAbilities(actor(), node).update).toBe(manage);
      if (read) expect(res.body.data.abilities.update).toBe(manage);
    });

    it(`link: read ${TABLE.link[who][0]}, manage ${TABLE.link[who][1]}`, async () => {
      const [read, manage] = TABLE.link[who];
      expect(mayReadLink(actor(), ends())).toBe(read);
      expect((await Link.count({ where: { [Op.and]: [{ id: link.id }, linkScope(actor())] }, include: linkEnds() })) > 0).toBe(read);
      const sql = `SELECT count(*) AS c FROM links l JOIN radios ra ON ra.id = l.radio_a_id JOIN nodes na ON na.id = ra.node_id
                     JOIN radios rb ON rb.id = l.radio_b_id JOIN nodes nb ON nb.id = rb.node_id WHERE l.id = $1 AND ${linkScopeSql(actor())}`;
      expect((await sqlCount(sql, [link.id])) > 0).toBe(read);
      const res = await call(agents[who], 'get', `/api/v1/links/${link.id}`);
      expect(res.status).toBe(read ? 200 : 404);
      const list = await call(agents[who], 'get', '/api/v1/links');
      expect(list.body.data.some((l: { id: number }) => l.id === link.id)).toBe(read);
      expect(linkAbilities(actor(), ends()).update).toBe(manage);
      if (read) expect(res.body.data.abilities.update).toBe(manage);
    });

    it(`address plan: read ${TABLE.plan[who][0]}, manage ${TABLE.plan[who][1]}`, async () => {
      const [read, manage] = TABLE.plan[who];
      expect(mayReadPlan(actor(), node)).toBe(read);
      expect((await sqlCount(`SELECT count(*) AS c FROM nodes n WHERE n.id = $1 AND ${planScopeSql(actor(), 'n')}`, [node.id])) > 0).toBe(read);
      expect(planAbilities(actor(), node).update).toBe(manage);
      const res = await call(agents[who], 'get', '/api/v1/address-plans');
      if (actor().role === 'host') {
        // Planning pages refuse hosts as a whole before any record is looked at.
        expect(res.status).toBe(403);
        return;
      }
      expect(res.status).toBe(200);
      const plan = res.body.data.plans.find((p: { nodeId: number }) => p.nodeId === node.id);
      expect(Boolean(plan)).toBe(read);
      if (read) expect(plan.abilities.update).toBe(manage);
    });
  });
});
