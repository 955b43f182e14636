import { hashPassword } from '../auth/passwords';
import { type Config, loadConfig } from '../config';
import { loadDemoExtras } from './demoExtras';
import { loadDemoHistory } from './demoHistory';
import { dropDemo } from './demoReset';
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
    for (const p of PEOPLE)
      people.set(
        p.key,
        await User.create({ email: p.email, name: p.name, role: p.role, phone: p.phone ?? null, passwordHash: await hashPassword(password) }, t),
      );
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
        {
          name: s.name,
          neighbourhoodId: hood.id,
          ...offsetToLatLon(s.northM, s.eastM),
          groundElevationM: s.groundElevationM,
          antennaHeightM: s.antennaHeightM,
          accessNotes: s.accessNotes,
          hostUserId: s.host ? people.get(s.host)!.id : null,
        },
        t,
      );
      const node = await Node.create(
        {
          name: s.node.name,
          siteId: site.id,
          neighbourhoodId: hood.id,
          hardware: s.node.hardware,
          firmware: s.node.firmware,
          isUplink: s.node.isUplink,
          managementAddress: `10.64.${i + 1}.1`,
          reportIntervalS: s.node.reportIntervalS,
        },
        t,
      );
      for (const r of s.node.radios) radios.set(`${s.key}/${r.iface}`, await Radio.create({ ...r, nodeId: node.id }, t));
    }
    for (const l of LINKS) {
      await Link.create({ name: l.name, status: l.status, radioAId: radios.get(l.from.join('/'))!.id, radioBId: radios.get(l.to.join('/'))!.id }, t);
    }
  });
  return 'loaded';
}

/** The demo's people by their scenario key, as stored. */
async function demoPeople(): Promise<Map<string, number>> {
  const users = await User.findAll({ where: { email: PEOPLE.map((p) => p.email) } });
  const byEmail = new Map(users.map((u) => [u.email, u.id]));
  return new Map(PEOPLE.filter((p) => byEmail.has(p.email)).map((p) => [p.key, byEmail.get(p.email)!]));
}

/** The inventory, then (only when it was loaded just now) its past and what each page shows. */
export async function loadDemo(config: Config, progress: (line: string) => void = () => {}, options: { reset?: boolean; history?: boolean } = {}) {
  const started = Date.now();
  if (options.reset) {
    const dropped = await dropDemo(User.sequelize!, config);
    progress(
      `reset: dropped the demo's ${dropped.neighbourhoods} neighbourhoods, ${dropped.nodes} nodes, ` +
        `${dropped.people} people and ${dropped.photos} photos; loading it again`,
    );
  }
  const result = await seedDemo(config.demoPassword);
  if (result === 'already-loaded') return { result, seconds: 0 };
  progress(`inventory loaded: ${SITES.length} sites, ${LINKS.length} links, ${PEOPLE.length} people`);
  const people = await demoPeople();
  if (options.history === false) return { result, seconds: (Date.now() - started) / 1000 };
  await loadDemoExtras(User.sequelize!, config, people, config.now());
  progress('site surveys, drawn install photos, address plans and an upcoming maintenance window loaded');
  const history = await loadDemoHistory(User.sequelize!, config, people, progress);
  progress(`history loaded: ${history.days} days, ${history.reportRows} report rows, ${history.outages} outages, ${history.mails} mails in the outbox`);
  return { result, seconds: (Date.now() - started) / 1000 };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const config = loadConfig();
  const sequelize = createSequelize(config.databaseUrl, 2);
  initModels(sequelize);
  const t0 = Date.now();
  const say = (line: string) => console.log(`[${((Date.now() - t0) / 1000).toFixed(1)} s] ${line}`);
  try {
    // `npm run seed -- --reset` (or PARAPET_RESET_DEMO=1) drops the demo's data first and loads it fresh.
    const reset = process.argv.includes('--reset') || ['1', 'true', 'yes'].includes(process.env.PARAPET_RESET_DEMO ?? '');
    // PARAPET_DEMO_HISTORY=0 loads the inventory alone (the browser tests' fixed starting point).
    const history = !['0', 'false', 'no'].includes(process.env.PARAPET_DEMO_HISTORY ?? '');
    const { result, seconds } = await loadDemo(config, say, { reset, history });
    console.log(result === 'loaded' ? `demo scenario loaded in ${seconds.toFixed(1)} s` : 'demo scenario already loaded; nothing changed');
  } catch (err) {
    console.error('loading the demo failed:', err instanceof Error ? `${err.message} ${(err as { parent?: Error }).parent?.message ?? ''}\n${err.stack}` : err);
    process.exitCode = 1;
  } finally {
    await sequelize.close();
  }
}
