// `npm run simulate`: makes the demo network report through the real HTTP API, as nodes would.
import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import { ApiClient } from './apiClient';
import { DEMO_QUIRKS } from '../db/demoScenario';
import type { NodeDto } from '../../shared/schemas/node';
import type { RadioDto } from '../../shared/schemas/radio';
import { createSequelize } from '../db/sequelize';
import { runTownSimulator } from './simulateTown';

const baseUrl = process.env.PARAPET_URL ?? `http://${process.env.HOST ?? '127.0.0.1'}:${process.env.PORT ?? '4300'}`;
const password = process.env.PARAPET_DEMO_PASSWORD ?? 'parapet-demo';
const tokenFile = process.env.SIMULATOR_TOKENS ?? '.simulator-tokens.json';
const speedup = Number(process.env.SIMULATOR_SPEEDUP ?? '1'); // >1 sends reports faster than the node's interval
/** One node drops for a few minutes now and then, so the demo shows outages. */
const FLAKY_NODE = process.env.SIMULATOR_FLAKY_NODE ?? DEMO_QUIRKS.flakyNode;
const FLAKY_EVERY_S = 25 * 60;
const FLAKY_DOWN_S = 5 * 60;

interface TopologyLink {
  nodeAId: number;
  nodeBId: number;
  predictedSignalDbm: number | null;
  expectedRateMbps: number | null;
}
interface SimNode {
  node: NodeDto;
  radios: RadioDto[];
  token: string;
  bootId: string;
  seq: number;
  fadeDb: number;
  predicted: Map<number, number>;
  peerOf: Map<number, number>;
  unsent: object[];
}
/** Like the agent: reports the server did not take (503, no answer) are kept and sent again, at most this many. */
const BUFFER_MAX = 500;
interface InventoryLink {
  radioAId: number;
  radioBId: number;
  status: string;
}

/** A made-up, locally administered MAC per radio (the 02: prefix), so reports name their peers as real radios do. */
const simulatedMac = (radioId: number) =>
  `02:50:61:${[(radioId >> 16) & 255, (radioId >> 8) & 255, radioId & 255].map((b) => b.toString(16).padStart(2, '0')).join(':')}`;

const api = new ApiClient(baseUrl);
const tokens: Record<string, string> = fs.existsSync(tokenFile) ? JSON.parse(fs.readFileSync(tokenFile, 'utf8')) : {};
const saveTokens = () => fs.writeFileSync(tokenFile, JSON.stringify(tokens, null, 2), { mode: 0o600 });

async function provision(nodeId: number): Promise<string> {
  const { token } = await api.call<{ token: string }>('POST', `/api/v1/nodes/${nodeId}/ingest-token`);
  tokens[nodeId] = token;
  saveTokens();
  return token;
}

async function load(): Promise<SimNode[]> {
  await api.signIn('admin@parapet.example', password);
  const nodes = (await api.call<{ data: NodeDto[] }>('GET', '/api/v1/nodes?pageSize=500')).data;
  const radios = (await api.call<{ data: RadioDto[] }>('GET', '/api/v1/radios?pageSize=500')).data;
  const links = (await api.call<{ data: { links: TopologyLink[] } }>('GET', '/api/v1/topology')).data.links;
  // Only live links carry traffic: a planned link's radios name no peer, so Parapet sees it silent.
  const inventory = (await api.call<{ data: InventoryLink[] }>('GET', '/api/v1/links?pageSize=500')).data.filter((l) => l.status === 'live');
  const peerOf = new Map<number, number>();
  for (const l of inventory) {
    if (!peerOf.has(l.radioAId)) peerOf.set(l.radioAId, l.radioBId);
    if (!peerOf.has(l.radioBId)) peerOf.set(l.radioBId, l.radioAId);
  }
  const sims: SimNode[] = [];
  for (const node of nodes) {
    // Tokens are rotated at every start, so a stale file never matters.
    const token = await provision(node.id);
    const predicted = new Map<number, number>();
    for (const l of links) {
      if (l.predictedSignalDbm === null) continue;
      if (l.nodeBId === node.id) predicted.set(l.nodeAId, l.predictedSignalDbm);
      if (l.nodeAId === node.id) predicted.set(l.nodeBId, l.predictedSignalDbm);
    }
    sims.push({ node, radios: radios.filter((r) => r.nodeId === node.id), token, bootId: randomUUID(), seq: 0, fadeDb: 0, predicted, peerOf, unsent: [] });
  }
  return sims;
}

const gauss = () => Math.sqrt(-2 * Math.log(Math.random() || 1e-9)) * Math.cos(2 * Math.PI * Math.random());
const round1 = (x: number) => Math.round(x * 10) / 10;

function reportFor(sim: SimNode, now: Date) {
  // Slow fading: a bounded random walk, a few dB either way (common practice, no source).
  sim.fadeDb = Math.max(-6, Math.min(4, sim.fadeDb * 0.95 + gauss() * 0.6));
  const hour = now.getHours() + now.getMinutes() / 60;
  const eveningLoad = 0.5 + 0.5 * Math.cos(((hour - 21) / 24) * 2 * Math.PI); // busiest around 21:00
  const backhaulSignal = [...sim.predicted.values()].sort((a, b) => a - b)[0];
  const radios = sim.radios.map((r) => {
    const isBackhaul = r.role !== 'access-point';
    // The demo's quirks carry on live: the drifting antenna stays off its aim, the moved channel stays moved.
    const driftDb = sim.node.name === DEMO_QUIRKS.driftingNode && r.role === 'backhaul-client' ? DEMO_QUIRKS.driftDb : 0;
    const signal = isBackhaul && backhaulSignal !== undefined ? backhaulSignal + sim.fadeDb - driftDb : -55 - Math.random() * 15;
    return {
      iface: r.iface,
      role: r.role,
      band: r.band,
      channel: DEMO_QUIRKS.channels[sim.node.name]?.[r.iface] ?? r.channel,
      channelWidthMHz: r.channelWidthMHz,
      ssid: r.ssid ?? undefined,
      signalDbm: round1(Math.max(-119, Math.min(-1, signal))),
      noiseDbm: round1(-95 + gauss() * 0.8),
      txRateMbps: isBackhaul ? 150 : 72,
      rxRateMbps: isBackhaul ? 135 : 65,
      clients: r.role === 'access-point' ? Math.round(2 + 10 * eveningLoad * Math.random()) : undefined,
      mac: simulatedMac(r.id),
      peerMac: isBackhaul && sim.peerOf.has(r.id) ? simulatedMac(sim.peerOf.get(r.id)!) : undefined,
    };
  });
  return {
    seq: ++sim.seq,
    bootId: sim.bootId,
    sentAt: now.toISOString(),
    uptimeS: Math.round(process.uptime() + 86_400),
    load1: round1(0.1 + eveningLoad * 0.8),
    memFreeKb: 30_000 + Math.round(Math.random() * 5000),
    firmware: DEMO_QUIRKS.firmware[sim.node.name] ?? sim.node.firmware ?? undefined,
    throughputMbps: round1(Math.max(1, 60 * (1 - 0.6 * eveningLoad) + gauss() * 3)),
    latencyMs: round1(8 + 20 * eveningLoad + Math.abs(gauss()) * 4),
    radios,
  };
}

async function send(sim: SimNode) {
  const now = new Date();
  if (sim.node.name === FLAKY_NODE && (now.getTime() / 1000) % FLAKY_EVERY_S < FLAKY_DOWN_S) return; // the flaky node is "unplugged"
  sim.unsent.push(reportFor(sim, now));
  sim.unsent.splice(0, Math.max(0, sim.unsent.length - BUFFER_MAX));
  const batch = sim.unsent.slice();
  const body = JSON.stringify(batch.length === 1 ? batch[0] : { reports: batch });
  const post = () =>
    fetch(`${baseUrl}/api/v1/heartbeats`, { method: 'POST', headers: { authorization: `Bearer ${sim.token}`, 'content-type': 'application/json' }, body });
  let res: Response;
  try {
    res = await post();
    if (res.status === 401) {
      sim.token = await provision(sim.node.id); // someone rotated it: provision again
      res = await post();
    }
  } catch (e) {
    console.warn(`simulator: ${sim.node.name}: ${(e as Error).message}; keeping ${sim.unsent.length} report(s) to resend`);
    return;
  }
  if (res.status === 202 || res.status === 400) sim.unsent.splice(0, batch.length); // delivered, or refused for good
  if (res.status !== 202)
    console.warn(
      `simulator: ${sim.node.name} got ${res.status}${res.status === 400 ? '' : `; keeping ${sim.unsent.length} report(s) to resend`}: ${await res.text()}`,
    );
}

async function runDemo() {
  const sims = await load();
  console.log(
    `simulator: ${sims.length} nodes reporting to ${baseUrl} (tokens in ${tokenFile}); ` +
      `${FLAKY_NODE} drops for ${FLAKY_DOWN_S / 60} min every ${FLAKY_EVERY_S / 60} min`,
  );
  for (const [i, sim] of sims.entries()) {
    const intervalMs = (sim.node.reportIntervalS * 1000) / speedup;
    setTimeout(
      () => {
        void send(sim).catch((e) => console.warn(`simulator: ${sim.node.name}: ${(e as Error).message}`));
        setInterval(() => void send(sim).catch((e) => console.warn(`simulator: ${sim.node.name}: ${(e as Error).message}`)), intervalMs);
      },
      (i * intervalMs) / sims.length,
    ); // spread the nodes over the interval
  }
  process.on('SIGTERM', () => process.exit(0));
  process.on('SIGINT', () => process.exit(0));
}

// `--nodes N` (or SIMULATOR_NODES=N): a synthetic town of N nodes instead of the demo network.
const nodesArg = process.argv.indexOf('--nodes');
const townNodes = nodesArg >= 0 ? process.argv[nodesArg + 1] : process.env.SIMULATOR_NODES;
if (townNodes === undefined) {
  await runDemo();
} else {
  const count = Number(townNodes);
  if (!Number.isInteger(count) || count < 1 || count > 200_000) {
    console.error(`simulator: --nodes needs a whole number from 1 to 200000, got "${townNodes}"`);
    process.exit(2);
  }
  if (!process.env.DATABASE_URL) {
    console.error('simulator: the town is written straight into the database: set DATABASE_URL (start.sh prints it) and PARAPET_URL');
    process.exit(2);
  }
  await runTownSimulator(count, baseUrl, createSequelize(process.env.DATABASE_URL, 4));
}
