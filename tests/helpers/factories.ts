import { Link, Neighbourhood, Node, OperatorAssignment, Radio, Site, type User } from '../../server/models';
import { buildUser, signIn, unique, type TestContext } from './api';

export async function buildNeighbourhood(overrides: Partial<{ name: string; operators: User[] }> = {}) {
  const n = await Neighbourhood.create({ name: overrides.name ?? unique('Hood') });
  for (const op of overrides.operators ?? []) await OperatorAssignment.create({ userId: op.id, neighbourhoodId: n.id });
  return n;
}

export async function buildSite(
  overrides: Partial<{ neighbourhoodId: number; hostUserId: number | null; name: string; latitude: number; longitude: number }> = {},
) {
  const neighbourhoodId = overrides.neighbourhoodId ?? (await buildNeighbourhood()).id;
  return Site.create({
    name: overrides.name ?? unique('Site'),
    neighbourhoodId,
    latitude: overrides.latitude ?? 47.6,
    longitude: overrides.longitude ?? -38.4,
    groundElevationM: 10,
    antennaHeightM: 8,
    hostUserId: overrides.hostUserId ?? null,
  });
}

export async function buildNode(overrides: Partial<{ siteId: number; neighbourhoodId: number; name: string; isUplink: boolean }> = {}) {
  const site = overrides.siteId ? (await Site.findByPk(overrides.siteId))! : await buildSite({ neighbourhoodId: overrides.neighbourhoodId });
  return Node.create({
    name: overrides.name ?? unique('node'),
    siteId: site.id,
    neighbourhoodId: overrides.neighbourhoodId ?? site.neighbourhoodId,
    isUplink: overrides.isUplink ?? false,
  });
}

export async function buildRadio(overrides: Partial<{ nodeId: number; iface: string; neighbourhoodId: number }> = {}) {
  const nodeId = overrides.nodeId ?? (await buildNode({ neighbourhoodId: overrides.neighbourhoodId })).id;
  return Radio.create({
    nodeId,
    iface: overrides.iface ?? 'wlan0',
    band: '5',
    channel: 36,
    channelWidthMHz: 40,
    txPowerDbm: 18,
    antennaGainDbi: 23,
    role: 'backhaul-ap',
    ssid: 'test-backhaul',
    encryption: 'wpa2-ccmp',
    preSharedKey: 'a-long-enough-test-key',
  });
}

export async function buildLink(overrides: Partial<{ radioAId: number; radioBId: number; neighbourhoodId: number }> = {}) {
  const a = overrides.radioAId ?? (await buildRadio({ neighbourhoodId: overrides.neighbourhoodId })).id;
  const b = overrides.radioBId ?? (await buildRadio({ neighbourhoodId: overrides.neighbourhoodId })).id;
  return Link.create({ radioAId: a, radioBId: b, status: 'planned' });
}

/** An operator assigned to a fresh neighbourhood, signed in. */
export async function buildOperatorWithHood(ctx: TestContext) {
  const user = await buildUser({ role: 'operator' });
  const hood = await buildNeighbourhood({ operators: [user] });
  return { user, hood, agent: await signIn(ctx, user) };
}
