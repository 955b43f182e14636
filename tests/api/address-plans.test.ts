import { Netmask } from 'netmask';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { call, useApi } from '../helpers/api';
import { buildNode } from '../helpers/factories';
import { planningCast, setNetwork } from '../helpers/planningActors';

describe('address plans API', () => {
  const ctx = useApi();

  it('answers 401 signed out and 403 to hosts', async () => {
    expect((await request(ctx.app).get('/api/v1/address-plans')).status).toBe(401);
    const { host } = await planningCast(ctx);
    const res = await call(host, 'get', '/api/v1/address-plans');
    expect(res.status).toBe(403);
    expect(res.body.error.message).toBe('Address plans are for operators and admins.');
  });

  it('says 409 when no pool is set', async () => {
    await setNetwork({ addressPool: null });
    const { op, node } = await planningCast(ctx);
    const res = await call(op, 'post', '/api/v1/address-plans/allocate', { nodeIds: [node.id] });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('pool_not_set');
  });

  it('allocates the first free /24s of the pool with gateway and DHCP range, checked against netmask', async () => {
    await setNetwork({ addressPool: '10.64.0.0/16' });
    const { op, hood, node } = await planningCast(ctx);
    const second = await buildNode({ neighbourhoodId: hood.id });
    const res = await call(op, 'post', '/api/v1/address-plans/allocate', { nodeIds: [node.id, second.id], prefixLength: 24 });
    expect(res.status).toBe(201);
    const [p1, p2] = res.body.data;
    expect(p1).toMatchObject({
      nodeId: node.id,
      cidr: '10.64.0.0/24',
      gateway: '10.64.0.1',
      dhcpStart: '10.64.0.11',
      dhcpEnd: '10.64.0.254',
      staticAddresses: [],
    });
    expect(p2.cidr).toBe('10.64.1.0/24');
    // Reference library: netmask's first host is the gateway, its last host the end of the DHCP range (RFC 4632).
    const block = new Netmask(p2.cidr);
    expect(p2.gateway).toBe(block.first);
    expect(p2.dhcpEnd).toBe(block.last);
    const again = await call(op, 'post', '/api/v1/address-plans/allocate', { nodeIds: [node.id] });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('already_planned');
  });

  it('refuses another neighbourhood’s node (404), bad prefixes and addresses (400)', async () => {
    await setNetwork({ addressPool: '10.64.0.0/16' });
    const { op, node, otherNode } = await planningCast(ctx);
    expect((await call(op, 'post', '/api/v1/address-plans/allocate', { nodeIds: [otherNode.id] })).status).toBe(404);
    expect((await call(op, 'put', `/api/v1/address-plans/${otherNode.id}`, { cidr: '10.9.0.0/24', gateway: '10.9.0.1' })).status).toBe(404);
    const prefix = await call(op, 'post', '/api/v1/address-plans/allocate', { nodeIds: [node.id], prefixLength: 8 });
    expect(prefix.status).toBe(400);
    expect(prefix.body.error.details[0]).toEqual({ path: 'prefixLength', message: 'prefixLength must be /16 to /30' });
    const gateway = await call(op, 'put', `/api/v1/address-plans/${node.id}`, { cidr: '10.64.9.0/24', gateway: '10.64.9.300' });
    expect(gateway.status).toBe(400);
    expect(gateway.body.error.details[0].path).toBe('gateway');
    const half = await call(op, 'put', `/api/v1/address-plans/${node.id}`, { cidr: '10.64.9.0/24', gateway: '10.64.9.1', dhcpStart: '10.64.9.20' });
    expect(half.status).toBe(400);
    expect(half.body.error.details[0]).toEqual({ path: 'dhcpEnd', message: 'dhcpEnd give both dhcpStart and dhcpEnd, or neither' });
  });

  it('flags overlapping subnets, a gateway outside, a DHCP range over the edge or over static addresses, and a block outside the pool', async () => {
    await setNetwork({ addressPool: '10.64.0.0/16' });
    const { op, hood, node } = await planningCast(ctx);
    const second = await buildNode({ neighbourhoodId: hood.id });
    const third = await buildNode({ neighbourhoodId: hood.id });
    const put = (id: number, body: object) => call(op, 'put', `/api/v1/address-plans/${id}`, body);
    expect(
      (
        await put(node.id, {
          cidr: '10.64.20.0/24',
          gateway: '10.64.21.1',
          dhcpStart: '10.64.20.100',
          dhcpEnd: '10.64.20.200',
          staticAddresses: ['10.64.20.150'],
        })
      ).status,
    ).toBe(201);
    expect((await put(second.id, { cidr: '10.64.20.128/25', gateway: '10.64.20.129', dhcpStart: '10.64.20.200', dhcpEnd: '10.64.21.10' })).status).toBe(201);
    expect((await put(third.id, { cidr: '192.168.5.0/24', gateway: '192.168.5.1' })).status).toBe(201);
    const res = await call(op, 'get', '/api/v1/address-plans');
    expect(res.status).toBe(200);
    const codes = res.body.data.findings.map((f: { code: string; label: string }) => `${f.code}:${f.label}`).sort();
    expect(codes).toEqual(
      [
        `dhcp_collides_static:${node.name}`,
        `dhcp_outside_subnet:${second.name}`,
        `gateway_outside_subnet:${node.name}`,
        `outside_pool:${third.name}`,
        `subnet_overlap:${node.name}`,
      ].sort(),
    );
    const update = await put(third.id, { cidr: '10.64.30.0/24', gateway: '10.64.30.1' });
    expect(update.status).toBe(200);
    expect(update.body.findings).toEqual([]);
    expect((await call(op, 'delete', `/api/v1/address-plans/${third.id}`)).status).toBe(204);
    expect((await call(op, 'delete', `/api/v1/address-plans/${third.id}`)).status).toBe(404);
  });

  it('never names a node the caller cannot read in an overlap', async () => {
    await setNetwork({ addressPool: '10.64.0.0/16' });
    const { op, admin, node, otherNode } = await planningCast(ctx);
    await call(admin, 'put', `/api/v1/address-plans/${otherNode.id}`, { cidr: '10.64.40.0/24', gateway: '10.64.40.1' });
    await call(op, 'put', `/api/v1/address-plans/${node.id}`, { cidr: '10.64.40.0/25', gateway: '10.64.40.1' });
    const res = await call(op, 'get', '/api/v1/address-plans');
    const text = JSON.stringify(res.body);
    expect(text).not.toContain(otherNode.name);
    expect(res.body.data.findings.some((f: { message: string }) => f.message.includes('a node outside your neighbourhoods'))).toBe(true);
  });
});
