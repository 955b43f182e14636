// `npm run bench:live`: 200 signed-in sockets; time from a node's POST to the event in every browser.
import { io as connect, type Socket } from 'socket.io-client';
import { hashPassword } from '../auth/passwords';
import { createSequelize } from '../db/sequelize';
import { rotateToken } from '../services/ingestTokens';
import { Neighbourhood, Node, Site, User, initModels } from '../models';
import { sessionCookieOf } from './apiClient';
import { startServerProcess } from './serverProcess';

const databaseUrl = process.env.DATABASE_URL;
if (!databaseUrl) {
  console.error('DATABASE_URL is not set: point it at the development database (start.sh prints it).');
  process.exit(2);
}
const SOCKETS = Number(process.env.BENCH_SOCKETS ?? 200);
const POSTS = Number(process.env.BENCH_POSTS ?? 50);

const sequelize = createSequelize(databaseUrl, 4);
initModels(sequelize);
const run = Date.now().toString(36);
const password = `bench-password-${run}`;
const hood = await Neighbourhood.create({ name: `Live bench ${run}` });
const site = await Site.create({ name: `Live bench site ${run}`, neighbourhoodId: hood.id, latitude: 47.6, longitude: -38.4 });
const nodes = await Node.bulkCreate(Array.from({ length: POSTS }, (_, i) => ({ name: `live-${run}-${i}`, siteId: site.id, neighbourhoodId: hood.id })));
const tokens = await Promise.all(nodes.map((n) => rotateToken(sequelize, n.id, new Date())));
const watcher = await User.create({ email: `bench-${run}@parapet.example`, name: 'Bench watcher', role: 'admin', passwordHash: await hashPassword(password) });
const server = await startServerProcess({
  DATABASE_URL: databaseUrl,
  JOBS_ENABLED: 'false',
  SESSION_SECRET: 'bench-secret-bench-secret',
  SIGNIN_LIMIT_PER_ADDRESS: '100000',
});

const sockets: Socket[] = [];
try {
  const signIn = await fetch(`${server.url}/api/v1/session`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email: watcher.email, password }),
  });
  const cookie = sessionCookieOf(signIn);
  const sentAt = new Map<number, number>();
  const latencies: number[] = [];
  await Promise.all(
    Array.from(
      { length: SOCKETS },
      () =>
        new Promise<void>((resolve, reject) => {
          const s = connect(server.url, { transports: ['websocket'], extraHeaders: { cookie }, reconnection: false });
          s.on('node:figures', (e: { nodeId: number }) => {
            const t0 = sentAt.get(e.nodeId);
            if (t0 !== undefined) latencies.push(performance.now() - t0);
          });
          s.on('connect', () => resolve());
          s.on('connect_error', reject);
          sockets.push(s);
        }),
    ),
  );
  console.log(`bench: ${SOCKETS} sockets connected to ${server.url}; ${POSTS} reports from ${POSTS} nodes`);
  for (const [i, node] of nodes.entries()) {
    sentAt.set(node.id, performance.now());
    await fetch(`${server.url}/api/v1/heartbeats`, {
      method: 'POST',
      headers: { authorization: `Bearer ${tokens[i]}`, 'content-type': 'application/json' },
      body: JSON.stringify({ seq: 1, sentAt: new Date().toISOString(), radios: [{ iface: 'wlan0', signalDbm: -60, noiseDbm: -95 }] }),
    });
    await new Promise((r) => setTimeout(r, 100));
  }
  await new Promise((r) => setTimeout(r, 2000));
  latencies.sort((a, b) => a - b);
  const pct = (p: number) => latencies[Math.min(latencies.length - 1, Math.floor((p / 100) * latencies.length))]?.toFixed(1);
  console.log(`events: ${latencies.length} of ${SOCKETS * POSTS} expected; POST→event p50 ${pct(50)} ms, p95 ${pct(95)} ms, max ${pct(100)} ms`);
} finally {
  sockets.forEach((s) => s.close());
  await server.stop();
  await Node.destroy({ where: { id: nodes.map((n) => n.id) } });
  await site.destroy();
  await hood.destroy();
  await watcher.destroy();
  await sequelize.close();
}
