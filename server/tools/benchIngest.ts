// `npm run bench:ingest`: loads a real server and database on loopback and prints what they sustain.
import autocannon from 'autocannon';
import { QueryTypes } from 'sequelize';
import { createSequelize } from '../db/sequelize';
import { rotateToken } from '../services/ingestTokens';
import { Neighbourhood, Node, Site, initModels } from '../models';
import { startServerProcess } from './serverProcess';

const databaseUrl = process.env.DATABASE_URL;
if (!databaseUrl) {
  console.error('DATABASE_URL is not set: point it at the development database (start.sh prints it).');
  process.exit(2);
}
const NODES = Number(process.env.BENCH_NODES ?? 200);
const DURATION_S = Number(process.env.BENCH_DURATION_S ?? 10);
const CONNECTIONS = Number(process.env.BENCH_CONNECTIONS ?? 50);
const BATCH = 100;

const sequelize = createSequelize(databaseUrl, 4);
initModels(sequelize);
const run = Date.now().toString(36);
const hood = await Neighbourhood.create({ name: `Bench ${run}` });
const site = await Site.create({ name: `Bench site ${run}`, neighbourhoodId: hood.id, latitude: 47.6, longitude: -38.4 });
const nodes = await Node.bulkCreate(Array.from({ length: NODES }, (_, i) => ({ name: `bench-${run}-${i}`, siteId: site.id, neighbourhoodId: hood.id })));
const tokens = await Promise.all(nodes.map((n) => rotateToken(sequelize, n.id, new Date())));
const seqs = nodes.map(() => 0);
// BENCH_SERVER_URL loads a server you started yourself (e.g. under a profiler); its ingest rate limit must be high.
const server = process.env.BENCH_SERVER_URL
  ? { url: process.env.BENCH_SERVER_URL, stop: async () => {} }
  : await startServerProcess({ DATABASE_URL: databaseUrl, INGEST_RATE_LIMIT_PER_MIN: '100000000', JOBS_ENABLED: 'false', SESSION_SECRET: 'bench-secret-bench-secret', DATABASE_POOL_MAX: '20' });

const report = (i: number) => ({
  seq: ++seqs[i], sentAt: new Date().toISOString(), uptimeS: 1000 + seqs[i], load1: 0.3, throughputMbps: 42.5, latencyMs: 12,
  radios: [{ iface: 'wlan0', channel: 36, channelWidthMHz: 40, signalDbm: -62, noiseDbm: -95, txRateMbps: 150, rxRateMbps: 135 }, { iface: 'wlan1', clients: 5 }],
});

async function phase(name: string, perRequest: number, connections: number) {
  let next = 0;
  const result = await autocannon({
    url: server.url,
    connections,
    duration: DURATION_S,
    requests: [{
      method: 'POST',
      path: '/api/v1/heartbeats',
      setupRequest: (req) => {
        const i = next++ % NODES;
        const body = perRequest === 1 ? report(i) : { reports: Array.from({ length: perRequest }, () => report(i)) };
        return { ...req, headers: { ...req.headers, authorization: `Bearer ${tokens[i]}`, 'content-type': 'application/json' }, body: JSON.stringify(body) };
      },
    }],
  });
  const ok = result['2xx'];
  console.log(`${name}: ${(result.requests.average * perRequest).toFixed(0)} reports/s (${result.requests.average.toFixed(0)} requests/s), ` +
    `latency p50 ${result.latency.p50} ms, p99 ${result.latency.p99} ms, ${ok} accepted requests, ${result.non2xx} refused, ${result.errors} errors`);
  return ok * perRequest;
}

try {
  console.log(`bench: ${NODES} nodes, ${DURATION_S} s per phase, server at ${server.url}`);
  const single = await phase('single reports', 1, CONNECTIONS);
  const batched = await phase(`batches of ${BATCH}`, BATCH, 10);
  const [row] = await sequelize.query<{ n: string }>('SELECT count(*) AS n FROM heartbeats WHERE node_id = ANY($1::int[])', { bind: [nodes.map((n) => n.id)], type: QueryTypes.SELECT });
  const found = Number(row.n);
  // Requests still in flight when the load stops are stored but not counted by the load generator, so found ≥ accepted.
  const lost = Math.max(0, single + batched - found);
  console.log(`rows: ${single + batched} reports answered 202, ${found} found in the database (${lost === 0 ? 'nothing lost' : `${lost} missing`})`);
} finally {
  await server.stop();
  const ids = nodes.map((n) => n.id);
  await sequelize.query('DELETE FROM heartbeats WHERE node_id = ANY($1::int[])', { bind: [ids] });
  await sequelize.query('DELETE FROM heartbeat_radios WHERE node_id = ANY($1::int[])', { bind: [ids] });
  await Node.destroy({ where: { id: ids } });
  await site.destroy();
  await hood.destroy();
  await sequelize.close();
}
