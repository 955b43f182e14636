// `npm run bench:ingest`: loads a real server and database on loopback and prints what they sustain,
// next to two ceilings measured in the same run on the same machine: a bare Express JSON POST server
// (no token, validation or database) and COPY of report-sized rows into a scratch table. Ratios to
// these ceilings are what compare across machines; absolute figures drift with the machine's load.
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import autocannon from 'autocannon';
import pg from 'pg';
import { from as copyFrom } from 'pg-copy-streams';
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
const COPY_ROWS = Number(process.env.BENCH_COPY_ROWS ?? 300_000);
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
  : await startServerProcess({
      DATABASE_URL: databaseUrl,
      INGEST_RATE_LIMIT_PER_MIN: '100000000',
      JOBS_ENABLED: 'false',
      SESSION_SECRET: 'bench-secret-bench-secret',
      DATABASE_POOL_MAX: '20',
    });
const bare = await startServerProcess({}, { args: ['--import', 'tsx', 'server/tools/benchBareServer.ts'] });

const report = (i: number) => ({
  seq: ++seqs[i],
  sentAt: new Date().toISOString(),
  uptimeS: 1000 + seqs[i],
  load1: 0.3,
  throughputMbps: 42.5,
  latencyMs: 12,
  radios: [
    { iface: 'wlan0', channel: 36, channelWidthMHz: 40, signalDbm: -62, noiseDbm: -95, txRateMbps: 150, rxRateMbps: 135 },
    { iface: 'wlan1', clients: 5 },
  ],
});

// Every (node, seq) the server answered 202 for, to look up afterwards.
const answered = new Map<number, number[]>();
interface Sent {
  i: number;
  seqs: number[];
}

async function phase(name: string, url: string, perRequest: number, connections: number) {
  let next = 0;
  const result = await autocannon({
    url,
    connections,
    duration: DURATION_S,
    requests: [
      {
        method: 'POST',
        path: '/api/v1/heartbeats',
        setupRequest: (req, context) => {
          const i = next++ % NODES;
          const reports = Array.from({ length: perRequest }, () => report(i));
          (context as { sent?: Sent }).sent = { i, seqs: reports.map((r) => r.seq) };
          const body = perRequest === 1 ? reports[0] : { reports };
          return { ...req, headers: { ...req.headers, authorization: `Bearer ${tokens[i]}`, 'content-type': 'application/json' }, body: JSON.stringify(body) };
        },
        onResponse: (status, _body, context) => {
          const sent = (context as { sent?: Sent }).sent;
          if (status !== 202 || !sent || url !== server.url) return;
          const id = nodes[sent.i].id;
          if (!answered.has(id)) answered.set(id, []);
          answered.get(id)!.push(...sent.seqs);
        },
      },
    ],
  });
  const perS = result.requests.average * perRequest;
  console.log(
    `${name}: ${perS.toFixed(0)} reports/s (${result.requests.average.toFixed(0)} requests/s), ` +
      `latency p50 ${result.latency.p50} ms, p99 ${result.latency.p99} ms, ${result['2xx']} answered 2xx, ${result.non2xx} refused, ${result.errors} errors`,
  );
  return { perS, p99: result.latency.p99 };
}

/** COPY of `rows` report-sized rows (the heartbeats columns plus radios as jsonb) into a scratch table. */
async function copyCeiling(rows: number) {
  const client = new pg.Client({ connectionString: databaseUrl });
  await client.connect();
  const table = `bench_copy_${run}`;
  try {
    await client.query(`CREATE TABLE ${table} (node_id int, seq bigint, boot_id text, received_at timestamptz, sent_at timestamptz,
      uptime_s float8, load1 float8, mem_free_kb float8, firmware text, throughput_mbps float8, latency_ms float8, radios jsonb)`);
    const radios = JSON.stringify(report(0).radios).replace(/\\/g, '\\\\');
    const at = new Date().toISOString();
    function* lines() {
      for (let start = 0; start < rows; start += 1000) {
        let chunk = '';
        for (let n = start; n < Math.min(rows, start + 1000); n++)
          chunk += `${n % 1000}\t${n}\t\\N\t${at}\t${at}\t${1000 + n}\t0.3\t\\N\tTilecrest 5.1.2\t42.5\t12\t${radios}\n`;
        yield chunk;
      }
    }
    const started = process.hrtime.bigint();
    await pipeline(Readable.from(lines()), client.query(copyFrom(`COPY ${table} FROM STDIN`)));
    const seconds = Number(process.hrtime.bigint() - started) / 1e9;
    const perS = rows / seconds;
    console.log(`COPY ceiling: ${rows} rows in ${seconds.toFixed(2)} s = ${perS.toFixed(0)} rows/s`);
    return perS;
  } finally {
    await client.query(`DROP TABLE IF EXISTS ${table}`);
    await client.end();
  }
}

/** Answered (node, seq) pairs with no stored heartbeat. */
async function countLost() {
  const [row] = await sequelize.query<{ lost: string }>(
    `SELECT count(*) AS lost FROM jsonb_each($1::jsonb) AS a(node_id, seqs), jsonb_array_elements_text(a.seqs) AS s(seq)
      WHERE NOT EXISTS (SELECT 1 FROM heartbeats h WHERE h.node_id = a.node_id::int AND h.seq = s.seq::bigint)`,
    { bind: [JSON.stringify(Object.fromEntries(answered))], type: QueryTypes.SELECT },
  );
  return Number(row.lost);
}

/** One report per node first: a node's first report moves it from unknown to online (the locked path with
 * its transition), which is not what steady ingest costs. */
async function warmUp() {
  for (let start = 0; start < NODES; start += 10) {
    await Promise.all(
      nodes.slice(start, start + 10).map(async (_n, k) => {
        const i = start + k;
        const res = await fetch(`${server.url}/api/v1/heartbeats`, {
          method: 'POST',
          headers: { authorization: `Bearer ${tokens[i]}`, 'content-type': 'application/json' },
          body: JSON.stringify(report(i)),
        });
        if (res.status !== 202) throw new Error(`warm-up report refused with ${res.status}: ${await res.text()}`);
      }),
    );
  }
}

const ratio = (a: number, b: number) => (b > 0 ? (a / b).toFixed(2) : 'n/a');
try {
  console.log(`bench: ${NODES} nodes, ${DURATION_S} s per phase, ${CONNECTIONS} connections, server at ${server.url}`);
  await warmUp();
  const bareRun = await phase('bare Express JSON POST (ceiling)', bare.url, 1, CONNECTIONS);
  const single = await phase('single reports', server.url, 1, CONNECTIONS);
  const batched = await phase(`batches of ${BATCH}`, server.url, BATCH, 10);
  const copyPerS = await copyCeiling(COPY_ROWS);
  const lost = await countLost();
  const answeredCount = [...answered.values()].reduce((n, s) => n + s.length, 0);
  console.log(`rows: ${answeredCount} reports answered 202, ${lost === 0 ? 'every one found in the database' : `${lost} not found in the database`}`);
  console.log(
    `ratios: single reports ${ratio(single.perS, bareRun.perS)} × bare Express (goal ≥ 0.6, p99 ${single.p99} ms, goal < 100 ms); ` +
      `batches ${ratio(batched.perS, copyPerS)} × COPY (goal ≥ 0.4)`,
  );
  console.log(
    JSON.stringify({
      singleReportsPerS: Math.round(single.perS),
      singleP99Ms: single.p99,
      batchedReportsPerS: Math.round(batched.perS),
      bareExpressPerS: Math.round(bareRun.perS),
      copyRowsPerS: Math.round(copyPerS),
      lost,
    }),
  );
} finally {
  await server.stop();
  await bare.stop();
  const ids = nodes.map((n) => n.id);
  await sequelize.query('DELETE FROM heartbeats WHERE node_id = ANY($1::int[])', { bind: [ids] });
  await Node.destroy({ where: { id: ids } });
  await site.destroy();
  await hood.destroy();
  await sequelize.close();
}
