import { hashPassword } from '../auth/passwords';
import { loadConfig } from '../config';
import { Link, Neighbourhood, NetworkSettings, Node, OperatorAssignment, Radio, Site, User, initModels } from '../models';
import { LINKS, NEIGHBOURHOODS, PEOPLE, SITES, TOWN, offsetToLatLon } from './demoScenario';
import { createSequelize } from './sequelize';

/** Loads the Lindenfall demo once; a second run finds the admin and leaves everything as it is. */
export async function seedDemo(password: string): Promise<'loaded' | 'already-loaded'> {
  if (await User.findOne({ where: { email: PEOPLE[0].email } })) return 'already-loaded';
  await User.sequelize!.transaction(async (transaction) => {
    const t = { transaction };
    await NetworkSettings.update({ name: TOWN.name, region: TOWN.region, timeZone: TOWN.timeZone, addressPool: TOWN.pool }, { where: { id: 1 }, ...t });
    const people = new Map<string, User>();
    // Each person gets a hash of their own (argon2 draws a fresh salt every time), so one cracked hash opens one account.
    for (const p of PEOPLE) people.set(p.key, await User.create({ email: p.email, name: p.name, role: p.role, phone: p.phone ?? null, passwordHash: await hashPassword(password) }, t));
    const hoods = new Map<string, Neighbourhood>();
    for (const n of NEIGHBOURHOODS) {
      const hood = await Neighbourhood.create({ name: n.name, description: n.description }, t);
      hoods.set(n.name, hood);
      for (const key of n.operators) await OperatorAssignment.create({ userId: people.get(key)!.id, neighbourhoodId: hood.id }, t);
    }
    const radios = new Map<string, Radio>();
    for (const [i, s] of SITES.entries()) {
      const hood = hoods.get(s.neighbourhood)!;
      const site = await Site.create(
        { name: s.name, neighbourhoodId: hood.id, ...offsetToLatLon(s.northM, s.eastM), groundElevationM: s.groundElevationM,
          antennaHeightM: s.antennaHeightM, accessNotes: s.accessNotes, hostUserId: s.host ? people.get(s.host)!.id : null }, t);
      const node = await Node.create(
        { name: s.node.name, siteId: site.id, neighbourhoodId: hood.id, hardware: s.node.hardware, firmware: s.node.firmware,
          isUplink: s.node.isUplink, managementAddress: `10.64.${i + 1}.1`, reportIntervalS: 60 }, t);
      for (const r of s.node.radios) radios.set(`${s.key}/${r.iface}`, await Radio.create({ ...r, nodeId: node.id }, t));
    }
    for (const l of LINKS) {
      await Link.create({ name: l.name, status: l.status, radioAId: radios.get(l.from.join('/'))!.id, radioBId: radios.get(l.to.join('/'))!.id }, t);
    }
  });
  return 'loaded';
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const config = loadConfig();
  const sequelize = createSequelize(config.databaseUrl, 2);
  initModels(sequelize);
  try {
    const result = await seedDemo(config.demoPassword);
    console.log(result === 'loaded' ? `demo scenario loaded: ${SITES.length} sites, ${LINKS.length} links, ${PEOPLE.length} people` : 'demo scenario already loaded; nothing changed');
  } catch (err) {
    console.error('loading the demo failed:', err instanceof Error ? err.message : err);
    process.exitCode = 1;
  } finally {
    await sequelize.close();
  }
}
