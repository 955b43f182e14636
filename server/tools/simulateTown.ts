// A synthetic town of thousands of nodes: its plan, its inventory (seeded straight into the database) and its
// reports, which always go through the real HTTP API with each node's own bearer token.
import { randomUUID } from 'node:crypto';
import http from 'node:http';
import { QueryTypes, type Sequelize } from 'sequelize';
import { offsetToLatLon } from '../db/demoScenario';
import { forgetTokens, hashToken, newToken } from '../services/ingestTokens';

export type TownRole = 'hub' | 'relay' | 'leaf';
export interface TownNode {
  name: string;
  hood: number;
  role: TownRole;
  /** Index of the node this one hangs from over backhaul (null for a neighbourhood's hub, which is an uplink). */
  parent: number | null;
  northM: number;
  eastM: number;
}
export interface TownPlan {
  hoods: string[];
  nodes: TownNode[];
}

/** Nodes per neighbourhood: one hub with its own uplink, relays in two tiers, houses behind them. */
export const HOOD_SIZE = 250;
const FIRST_TIER = 4;
const LEAVES_PER_RELAY = 20;
const HOOD_SPACING_M = 3000;
export const TOWN_REPORT_INTERVAL_S = 30;

// Invented place names for the town's outer neighbourhoods; none is a real place or the demo's.
const FIRST = [
  'Kestrel',
  'Lantern',
  'Cobble',
  'Ropewalk',
  'Heron',
  'Tidewater',
  'Brine',
  'Gull',
  'Anchor',
  'Beacon',
  'Net Loft',
  'Oyster',
  'Sailcloth',
  'Pilot',
  'Ferry',
  'Mussel',
  'Capstan',
  'Driftwood',
  'Slipway',
  'Tarpot',
];
const SECOND = ['Steps', 'Row', 'Green', 'Yard', 'Reach', 'Hollow', 'Rise', 'Wharf', 'Lanes', 'End'];

/** A small seeded generator (mulberry32), so a town and its faults come out the same on every run. */
export function seededRandom(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export const hoodName = (i: number) => {
  const base = `${FIRST[i % FIRST.length]} ${SECOND[Math.floor(i / FIRST.length) % SECOND.length]}`;
  const round = Math.floor(i / (FIRST.length * SECOND.length));
  return round === 0 ? base : `${base} ${round + 1}`;
};
const slug = (s: string) => s.toLowerCase().replace(/[^a-z0-9]+/g, '-');

/**
 * The town's shape. Parents always come before their children in `nodes`, so the inventory can be
 * written in one pass and a subtree is every later node whose chain of parents reaches the root.
 */
export function planTown(nodeCount: number, seed = 1): TownPlan {
  if (!Number.isInteger(nodeCount) || nodeCount < 1) throw new Error('the town needs a whole number of nodes, 1 or more');
  const random = seededRandom(seed);
  const hoodCount = Math.ceil(nodeCount / HOOD_SIZE);
  const side = Math.ceil(Math.sqrt(hoodCount));
  const hoods = Array.from({ length: hoodCount }, (_, i) => hoodName(i));
  const nodes: TownNode[] = [];
  for (let h = 0; h < hoodCount; h++) {
    const size = Math.min(HOOD_SIZE, nodeCount - h * HOOD_SIZE);
    // The demo town sits near (0, 0); the outer neighbourhoods start 6 km north of it.
    const centreN = 6000 + Math.floor(h / side) * HOOD_SPACING_M;
    const centreE = ((h % side) - side / 2) * HOOD_SPACING_M;
    const s = slug(hoods[h]);
    const hub = nodes.push({ name: `${s}-hub`, hood: h, role: 'hub', parent: null, northM: centreN, eastM: centreE }) - 1;
    const relayCount = Math.min(size - 1, Math.max(size > 1 ? 1 : 0, Math.round((size - 1) / (LEAVES_PER_RELAY + 1))));
    const relays: number[] = [];
    for (let r = 0; r < relayCount; r++) {
      const tier1 = r < FIRST_TIER;
      const parent = tier1 ? hub : relays[(r - FIRST_TIER) % FIRST_TIER];
      const angle = random() * 2 * Math.PI;
      const dist = (tier1 ? 500 : 350) + random() * 250;
      const p = nodes[parent];
      relays.push(
        nodes.push({
          name: `${s}-r${String(r + 1).padStart(2, '0')}`,
          hood: h,
          role: 'relay',
          parent,
          northM: p.northM + dist * Math.cos(angle),
          eastM: p.eastM + dist * Math.sin(angle),
        }) - 1,
      );
    }
    for (let l = 0; l < size - 1 - relayCount; l++) {
      const parent = relays[l % relays.length];
      const angle = random() * 2 * Math.PI;
      const dist = 80 + random() * 300;
      const p = nodes[parent];
      nodes.push({
        name: `${s}-h${String(l + 1).padStart(3, '0')}`,
        hood: h,
        role: 'leaf',
        parent,
        northM: p.northM + dist * Math.cos(angle),
        eastM: p.eastM + dist * Math.sin(angle),
      });
    }
  }
  return { hoods, nodes };
}

/** Every node's descendants over backhaul (the nodes a power cut at it strands). */
export function subtrees(plan: TownPlan): number[][] {
  const children: number[][] = plan.nodes.map(() => []);
  plan.nodes.forEach((n, i) => n.parent !== null && children[n.parent].push(i));
  const below: number[][] = plan.nodes.map(() => []);
  for (let i = plan.nodes.length - 1; i >= 0; i--) for (const c of children[i]) below[i].push(c, ...below[c]);
  return below;
}

interface RadioPlan {
  iface: string;
  role: 'backhaul-ap' | 'backhaul-client' | 'access-point';
  band: '2.4' | '5';
  channel: number;
  widthMHz: number;
  gainDbi: number;
}
const DOWN_CHANNELS = [36, 52, 100, 116, 132, 149];
const AP_CHANNELS = [1, 6, 11];
/** The backhaul-ap radio a child links to, by the parent's role. */
const downlinkIface = (role: TownRole) => (role === 'hub' ? 'wlan0' : 'wlan1');

function radiosFor(plan: TownPlan, i: number): RadioPlan[] {
  const n = plan.nodes[i];
  const down = (j: number) => DOWN_CHANNELS[j % DOWN_CHANNELS.length];
  const ap: RadioPlan = { iface: '', role: 'access-point', band: '2.4', channel: AP_CHANNELS[i % 3], widthMHz: 20, gainDbi: 5 };
  if (n.role === 'hub')
    return [
      { iface: 'wlan0', role: 'backhaul-ap', band: '5', channel: down(i), widthMHz: 40, gainDbi: 16 },
      { ...ap, iface: 'wlan1' },
    ];
  const up: RadioPlan = { iface: 'wlan0', role: 'backhaul-client', band: '5', channel: down(n.parent!), widthMHz: 40, gainDbi: 23 };
  const downlink: RadioPlan = { iface: 'wlan1', role: 'backhaul-ap', band: '5', channel: down(i), widthMHz: 40, gainDbi: 16 };
  if (n.role === 'relay') return [up, downlink, { ...ap, iface: 'wlan2' }];
  return [up, { ...ap, iface: 'wlan1' }];
}

export interface SeededRadio {
  id: number;
  iface: string;
  role: string;
  band: string;
  channel: number;
  widthMHz: number;
  peerRadioId: number | null;
}
export interface SeededNode {
  id: number;
  index: number;
  token: string;
  radios: SeededRadio[];
}

const chunks = <T>(xs: T[], size: number) => Array.from({ length: Math.ceil(xs.length / size) }, (_, i) => xs.slice(i * size, (i + 1) * size));

/**
 * Writes the town's inventory straight into the database (not through the API: 10,000 nodes one
 * request at a time would take far longer than the run), reusing what an earlier run left by name,
 * and issues every node a fresh ingest token (earlier ones revoked), as the API's token route does.
 */
export async function seedTown(sequelize: Sequelize, plan: TownPlan, now = new Date()): Promise<SeededNode[]> {
  const q = <T extends object>(sql: string, bind: unknown[]) => sequelize.query<T>(sql, { bind, type: QueryTypes.SELECT });
  await sequelize.query(
    `INSERT INTO neighbourhoods (name, description) SELECT unnest($1::text[]), 'Synthetic neighbourhood of the load simulator'
     ON CONFLICT DO NOTHING`,
    { bind: [plan.hoods] },
  );
  const hoodRows = await q<{ id: number; name: string }>('SELECT id, name FROM neighbourhoods WHERE name = ANY($1::text[])', [plan.hoods]);
  const hoodId = new Map(hoodRows.map((r) => [r.name, r.id]));
  const names = plan.nodes.map((n) => n.name);
  const existing = await q<{ id: number; name: string }>('SELECT id, name FROM nodes WHERE name = ANY($1::text[])', [names]);
  const nodeId = new Map(existing.map((r) => [r.name, r.id]));
  const missing = plan.nodes.map((n, i) => ({ n, i })).filter(({ n }) => !nodeId.has(n.name));
  for (const part of chunks(missing, 1000)) {
    await sequelize.transaction(async (transaction) => {
      const cols = part.map(({ n, i }) => {
        const { latitude, longitude } = offsetToLatLon(n.northM, n.eastM);
        return { hood: hoodId.get(plan.hoods[n.hood])!, name: `${n.name} roof`, latitude, longitude, height: n.role === 'leaf' ? 8 : 16, i };
      });
      const sites = await sequelize.query<{ id: number; name: string }>(
        `INSERT INTO sites (neighbourhood_id, name, latitude, longitude, ground_elevation_m, antenna_height_m)
         SELECT * FROM unnest($1::int[], $2::text[], $3::float8[], $4::float8[], $5::float8[], $6::float8[])
         ON CONFLICT (neighbourhood_id, lower(name)) DO UPDATE SET updated_at = now() RETURNING id, name`,
        {
          bind: [
            cols.map((c) => c.hood),
            cols.map((c) => c.name),
            cols.map((c) => c.latitude),
            cols.map((c) => c.longitude),
            cols.map(() => 10),
            cols.map((c) => c.height),
          ],
          type: QueryTypes.SELECT,
          transaction,
        },
      );
      const siteId = new Map(sites.map((s) => [s.name, s.id]));
      const created = await sequelize.query<{ id: number; name: string }>(
        `INSERT INTO nodes (site_id, neighbourhood_id, name, hardware, firmware, report_interval_s, is_uplink)
         SELECT * FROM unnest($1::int[], $2::int[], $3::text[], $4::text[], $5::text[], $6::int[], $7::bool[]) RETURNING id, name`,
        {
          bind: [
            cols.map((c) => siteId.get(c.name)!),
            cols.map((c) => c.hood),
            part.map(({ n }) => n.name),
            part.map(({ n }) => (n.role === 'leaf' ? 'Tilecrest Roof Mini' : 'Tilecrest Relay Duo')),
            part.map(() => 'Tilecrest 5.1.2'),
            part.map(() => TOWN_REPORT_INTERVAL_S),
            part.map(({ n }) => n.role === 'hub'),
          ],
          type: QueryTypes.SELECT,
          transaction,
        },
      );
      created.forEach((c) => nodeId.set(c.name, c.id));
      const radios = part.flatMap(({ n, i }) => radiosFor(plan, i).map((r) => ({ ...r, nodeId: nodeId.get(n.name)! })));
      await sequelize.query(
        `INSERT INTO radios (node_id, iface, band, channel, channel_width_mhz, tx_power_dbm, antenna_gain_dbi, role, ssid, encryption, pre_shared_key)
         SELECT node_id, iface, band, channel, width, 20, gain, role, ssid, 'wpa2-ccmp', 'town-shares-the-sky'
           FROM unnest($1::int[], $2::text[], $3::text[], $4::int[], $5::int[], $6::float8[], $7::text[], $8::text[])
             AS r(node_id, iface, band, channel, width, gain, role, ssid)`,
        {
          bind: [
            radios.map((r) => r.nodeId),
            radios.map((r) => r.iface),
            radios.map((r) => r.band),
            radios.map((r) => r.channel),
            radios.map((r) => r.widthMHz),
            radios.map((r) => r.gainDbi),
            radios.map((r) => r.role),
            radios.map((r) => (r.role === 'access-point' ? 'Lindenfall-Town' : null)),
          ],
          transaction,
        },
      );
    });
  }
  const ids = plan.nodes.map((n) => nodeId.get(n.name)!);
  const radioRows = await q<{ id: number; nodeId: number; iface: string; role: string; band: string; channel: number; widthMHz: number }>(
    `SELECT id, node_id AS "nodeId", iface, role, band, channel, channel_width_mhz AS "widthMHz"
       FROM radios WHERE node_id = ANY($1::int[]) ORDER BY id`,
    [ids],
  );
  const radioOf = new Map(radioRows.map((r) => [`${r.nodeId}/${r.iface}`, r]));
  // Every child's backhaul client links live to its parent's backhaul AP (one AP serves many clients).
  const pairs = plan.nodes.flatMap((n, i) =>
    n.parent === null
      ? []
      : [
          {
            a: radioOf.get(`${ids[n.parent]}/${downlinkIface(plan.nodes[n.parent].role)}`)!.id,
            b: radioOf.get(`${ids[i]}/wlan0`)!.id,
            name: `${n.name} uplink`,
          },
        ],
  );
  for (const part of chunks(pairs, 5000)) {
    await sequelize.query(
      `INSERT INTO links (name, radio_a_id, radio_b_id, status) SELECT name, a, b, 'live' FROM unnest($1::text[], $2::int[], $3::int[]) AS l(name, a, b)
       ON CONFLICT DO NOTHING`,
      { bind: [part.map((p) => p.name), part.map((p) => p.a), part.map((p) => p.b)] },
    );
  }
  const peer = new Map<number, number>();
  for (const p of pairs) {
    peer.set(p.b, p.a);
    if (!peer.has(p.a)) peer.set(p.a, p.b);
  }
  const tokens = ids.map((id) => newToken(id));
  await sequelize.transaction(async (transaction) => {
    await sequelize.query('UPDATE node_tokens SET revoked_at = $2 WHERE node_id = ANY($1::int[]) AND revoked_at IS NULL', { bind: [ids, now], transaction });
    await sequelize.query('INSERT INTO node_tokens (node_id, token_hash, created_at) SELECT n, h, $3 FROM unnest($1::int[], $2::text[]) AS t(n, h)', {
      bind: [ids, tokens.map(hashToken), now],
      transaction,
    });
  });
  forgetTokens(); // this process's cached lookups; other instances see the rotation within their cache lifetime
  const byNode = new Map<number, SeededRadio[]>();
  for (const r of radioRows) {
    const list = byNode.get(r.nodeId) ?? [];
    list.push({ id: r.id, iface: r.iface, role: r.role, band: r.band, channel: r.channel, widthMHz: r.widthMHz, peerRadioId: peer.get(r.id) ?? null });
    byNode.set(r.nodeId, list);
  }
  return ids.map((id, index) => ({ id, index, token: tokens[index], radios: byNode.get(id) ?? [] }));
}

/** A made-up, locally administered MAC per radio (the 02: prefix), as the demo simulator uses. */
const macOf = (radioId: number) =>
  `02:50:61:${[(radioId >> 16) & 255, (radioId >> 8) & 255, radioId & 255].map((b) => b.toString(16).padStart(2, '0')).join(':')}`;

export interface TownFaults {
  /** Every this many seconds one relay (or now and then a hub) loses power... */
  powerCutEveryS: number;
  /** ...for this long; the nodes behind it cannot reach Parapet and keep their reports until it is back. */
  powerCutS: number;
  /** Share of nodes with a bad power supply or cable: now and then they drop out for a few intervals. */
  flakyShare: number;
}
export const DEFAULT_FAULTS: TownFaults = { powerCutEveryS: 180, powerCutS: 150, flakyShare: 0.01 };

export interface PostResult {
  nodeId: number;
  status: number;
  accepted: number;
  ms: number;
  instance: string | null;
  error?: string;
}

interface NodeState {
  seq: number;
  bootId: string;
  unsent: object[];
  busy: boolean;
  poweredOffUntil: number;
  flaky: boolean;
  fadeDb: number;
}
/** Like the agent: reports the server did not take are kept and sent again, at most this many. */
const BUFFER_MAX = 500;

const gauss = (random: () => number) => Math.sqrt(-2 * Math.log(random() || 1e-9)) * Math.cos(2 * Math.PI * random());
const round1 = (x: number) => Math.round(x * 10) / 10;

/**
 * The town reporting: each node every `intervalS` seconds, spread evenly over the interval. A
 * powered-off node sends nothing and boots afresh (new boot id, seq from 1); a node cut off
 * behind it keeps its reports and sends them as one batch once the way is clear again.
 */
const POST_TIMEOUT_MS = 30_000;

/**
 * One report POST with Node's own HTTP client (the global fetch costs several times its CPU per request, and the
 * town's load generator shares the machine with what it measures). Fails like fetch with a timeout: an Error.
 */
function postJson(agent: http.Agent, url: string, token: string, body: string): Promise<{ status: number; text: string; instance: string | null }> {
  return new Promise((resolve, reject) => {
    const req = http.request(
      url,
      {
        method: 'POST',
        agent,
        headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json', 'content-length': Buffer.byteLength(body) },
        timeout: POST_TIMEOUT_MS,
      },
      (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => {
          const instance = res.headers['x-parapet-instance'];
          resolve({ status: res.statusCode ?? 0, text: Buffer.concat(chunks).toString('utf8'), instance: typeof instance === 'string' ? instance : null });
        });
        res.on('error', reject);
      },
    );
    req.on('timeout', () => req.destroy(new Error('The operation was aborted due to timeout')));
    req.on('error', reject);
    req.end(body);
  });
}

export class TownReporter {
  private readonly state: NodeState[];
  private readonly below: number[][];
  private readonly random: () => number;
  private timers: NodeJS.Timeout[] = [];
  private inflight = new Set<Promise<void>>();
  private stopped = false;
  // Kept connections: a town of thousands posting every few seconds should not pay a handshake per report.
  private readonly agent = new http.Agent({ keepAlive: true, maxSockets: 512, timeout: 30_000 });
  /** What happened, for the caller's summary. */
  readonly counts = { posts: 0, accepted: 0, refused: 0, failed: 0, powerCuts: 0, flakyDrops: 0 };
  readonly log: string[] = [];
  /** Refusals and failures by kind (status and error code, or the network error), each with its first example. */
  readonly problems = new Map<string, { count: number; example: string }>();

  constructor(
    private readonly baseUrl: string,
    private readonly plan: TownPlan,
    private readonly nodes: SeededNode[],
    private readonly onResult: (r: PostResult) => void = () => {},
    private readonly faults: TownFaults = DEFAULT_FAULTS,
    private readonly intervalS = TOWN_REPORT_INTERVAL_S,
    seed = 7,
  ) {
    this.random = seededRandom(seed);
    this.below = subtrees(plan);
    this.state = nodes.map(() => ({
      seq: 0,
      bootId: randomUUID(),
      unsent: [],
      busy: false,
      poweredOffUntil: 0,
      flaky: this.random() < faults.flakyShare,
      fadeDb: 0,
    }));
  }

  get flakyCount() {
    return this.state.filter((s) => s.flaky).length;
  }

  start() {
    const intervalMs = this.intervalS * 1000;
    this.nodes.forEach((_, i) => {
      const first = setTimeout(
        () => {
          this.tick(i);
          this.timers.push(setInterval(() => this.tick(i), intervalMs));
        },
        (i * intervalMs) / this.nodes.length,
      );
      this.timers.push(first);
    });
    if (this.faults.powerCutEveryS > 0) this.timers.push(setInterval(() => this.powerCut(), this.faults.powerCutEveryS * 1000));
  }

  /** Stops sending and waits (at most `waitMs`) for the requests still in flight. */
  async stop(waitMs = 30_000) {
    this.stopped = true;
    this.timers.forEach((t) => clearTimeout(t));
    this.timers = [];
    await Promise.race([Promise.allSettled([...this.inflight]), new Promise((r) => setTimeout(r, waitMs))]);
    this.agent.destroy();
  }

  private powerCut() {
    const candidates = this.plan.nodes.map((n, i) => ({ n, i })).filter(({ n }) => n.role === 'relay' || (n.role === 'hub' && this.random() < 0.1));
    if (!candidates.length) return;
    const { n, i } = candidates[Math.floor(this.random() * candidates.length)];
    const until = Date.now() + this.faults.powerCutS * 1000;
    this.state[i].poweredOffUntil = until;
    this.counts.powerCuts++;
    this.log.push(`${new Date().toISOString()} power cut at ${n.name} for ${this.faults.powerCutS} s; ${this.below[i].length} nodes behind it cut off`);
  }

  /** True while a node between this one and its hub is powered off. */
  private cutOff(i: number, now: number) {
    for (let p = this.plan.nodes[i].parent; p !== null; p = this.plan.nodes[p].parent) if (this.state[p].poweredOffUntil > now) return true;
    return false;
  }

  private tick(i: number) {
    if (this.stopped) return;
    const s = this.state[i];
    const now = Date.now();
    if (s.flaky && s.poweredOffUntil <= now && this.random() < 0.05) {
      s.poweredOffUntil = now + (2 + Math.floor(this.random() * 4)) * this.intervalS * 1000;
      this.counts.flakyDrops++;
    }
    if (s.poweredOffUntil > now) {
      s.unsent = []; // no power: nothing measured, and what was kept in memory is gone
      s.seq = 0;
      s.bootId = '';
      return;
    }
    if (!s.bootId) s.bootId = randomUUID(); // back from a power cut: a fresh boot
    s.unsent.push(this.report(i, new Date(now)));
    s.unsent.splice(0, Math.max(0, s.unsent.length - BUFFER_MAX));
    if (s.busy || this.cutOff(i, now)) return;
    const p = this.send(i).finally(() => this.inflight.delete(p));
    this.inflight.add(p);
  }

  private report(i: number, now: Date) {
    const s = this.state[i];
    const node = this.nodes[i];
    const role = this.plan.nodes[i].role;
    s.fadeDb = Math.max(-6, Math.min(4, s.fadeDb * 0.95 + gauss(this.random) * 0.6)); // a bounded random walk (common practice, no source)
    const hour = now.getUTCHours() + now.getUTCMinutes() / 60;
    const evening = 0.5 + 0.5 * Math.cos(((hour - 21) / 24) * 2 * Math.PI);
    return {
      seq: ++s.seq,
      bootId: s.bootId,
      sentAt: now.toISOString(),
      uptimeS: s.seq * this.intervalS,
      load1: round1(0.1 + evening * 0.8),
      memFreeKb: 30_000 + Math.round(this.random() * 5000),
      firmware: 'Tilecrest 5.1.2',
      throughputMbps: round1(Math.max(1, (role === 'leaf' ? 40 : 120) * (1 - 0.5 * evening) + gauss(this.random) * 3)),
      latencyMs: round1(6 + 18 * evening + Math.abs(gauss(this.random)) * 4),
      radios: node.radios.map((r) => {
        const backhaul = r.role !== 'access-point';
        return {
          iface: r.iface,
          role: r.role,
          band: r.band,
          channel: r.channel,
          channelWidthMHz: r.widthMHz,
          signalDbm: round1(backhaul ? -58 + s.fadeDb : -55 - this.random() * 15),
          noiseDbm: round1(-95 + gauss(this.random) * 0.8),
          txRateMbps: backhaul ? 150 : 72,
          rxRateMbps: backhaul ? 135 : 65,
          clients: backhaul ? undefined : Math.round(2 + 10 * evening * this.random()),
          mac: macOf(r.id),
          peerMac: backhaul && r.peerRadioId !== null ? macOf(r.peerRadioId) : undefined,
        };
      }),
    };
  }

  private problem(kind: string, example: string) {
    const p = this.problems.get(kind);
    if (p) p.count++;
    else {
      this.problems.set(kind, { count: 1, example });
      this.log.push(`first "${kind}": ${example}`);
    }
  }

  private async send(i: number) {
    const s = this.state[i];
    const node = this.nodes[i];
    const batch = s.unsent.slice();
    s.busy = true;
    const started = performance.now();
    try {
      const res = await postJson(
        this.agent,
        `${this.baseUrl}/api/v1/heartbeats`,
        node.token,
        JSON.stringify(batch.length === 1 ? batch[0] : { reports: batch }),
      );
      const text = res.text;
      const ms = performance.now() - started;
      this.counts.posts++;
      let accepted = 0;
      if (res.status === 202) {
        accepted = Number((JSON.parse(text) as { accepted?: number }).accepted ?? 0);
        this.counts.accepted += accepted;
      } else {
        this.counts.refused++;
        const code = /"code":"([a-z_]+)"/.exec(text)?.[1] ?? '';
        this.problem(`${res.status} ${code}`.trim(), `${this.plan.nodes[i].name}: ${text.slice(0, 300)}`);
      }
      // Delivered, or refused for good (400/401/413): drop; anything else (429, 5xx) is sent again next time.
      if (res.status < 500 && res.status !== 429) s.unsent.splice(0, batch.length);
      this.onResult({ nodeId: node.id, status: res.status, accepted, ms, instance: res.instance });
    } catch (e) {
      this.counts.failed++;
      const ms = performance.now() - started;
      this.problem((e as Error).message, this.plan.nodes[i].name);
      this.onResult({ nodeId: node.id, status: 0, accepted: 0, ms, instance: null, error: (e as Error).message });
    } finally {
      s.busy = false;
    }
  }
}

/** `npm run simulate -- --nodes 10000`: seeds the town in $DATABASE_URL, then reports to $PARAPET_URL until stopped. */
export async function runTownSimulator(nodeCount: number, baseUrl: string, sequelize: Sequelize) {
  const t0 = Date.now();
  const plan = planTown(nodeCount);
  const nodes = await seedTown(sequelize, plan);
  console.log(
    `simulator: town of ${nodes.length} nodes in ${plan.hoods.length} neighbourhoods ready in ${((Date.now() - t0) / 1000).toFixed(1)} s ` +
      '(inventory written straight to the database; reports go through the HTTP API)',
  );
  const latencies: number[] = [];
  const reporter = new TownReporter(baseUrl, plan, nodes, (r) => latencies.push(r.ms));
  reporter.start();
  console.log(
    `simulator: reporting to ${baseUrl} every ${TOWN_REPORT_INTERVAL_S} s; ${reporter.flakyCount} flaky nodes; ` +
      `a power cut every ${DEFAULT_FAULTS.powerCutEveryS} s for ${DEFAULT_FAULTS.powerCutS} s`,
  );
  let logged = 0;
  const summary = setInterval(() => {
    const sorted = latencies.splice(0).sort((a, b) => a - b);
    const pct = (p: number) => (sorted.length ? sorted[Math.min(sorted.length - 1, Math.floor(p * sorted.length))].toFixed(0) : '-');
    reporter.log.slice(logged).forEach((l) => console.log(`simulator: ${l}`));
    logged = reporter.log.length;
    const c = reporter.counts;
    console.log(
      `simulator: ${c.posts} posts, ${c.accepted} reports accepted, ${c.refused} refused, ${c.failed} failed; ` +
        `last 30 s p50 ${pct(0.5)} ms, p99 ${pct(0.99)} ms`,
    );
  }, 30_000);
  const stop = async () => {
    clearInterval(summary);
    await reporter.stop(5000);
    await sequelize.close();
    process.exit(0);
  };
  process.on('SIGTERM', () => void stop());
  process.on('SIGINT', () => void stop());
}
