import http from 'node:http';
import { createApp } from './app';
import { loadConfig } from './config';
import { DatabaseWatch } from './db/availability';
import { createSequelize } from './db/sequelize';
import { startJobs } from './jobs/scheduler';
import { createRealtime } from './realtime/io';
import { hearChangeNotices } from './services/ingestCaches';

const config = loadConfig();
const sequelize = createSequelize(config.databaseUrl, config.databasePoolMax);
const databaseWatch = new DatabaseWatch(() => sequelize.query('SELECT 1'), config.databaseProbeIntervalMs);
const { app, session, passport, close } = createApp({ config, sequelize, databaseWatch });
const server = http.createServer(app);
// Behind a proxy that keeps connections open, the app must not close an idle one first (the proxy's next request
// on it would be reset): 65 s is longer than common proxies keep them idle (60 s). Headers must still arrive in time.
server.keepAliveTimeout = 65_000;
server.headersTimeout = 66_000;
const realtime = createRealtime(server, config, session, passport, databaseWatch);
const jobs = config.jobsEnabled ? startJobs(config, sequelize, databaseWatch) : null;
// Ingest's caches forget an edit when it commits, on every instance (migration 0019's notices).
const notices = hearChangeNotices(config.databaseUrl, config.databaseProbeIntervalMs);

// A lost database connection must never end the process: log it, let the watch probe, carry on.
// Anything else unexpected still ends it, as Node would, for the supervisor to start it afresh.
process.on('unhandledRejection', (reason) => {
  if (databaseWatch.reportFailure(reason)) return;
  console.error('unhandled rejection, exiting:', reason);
  process.exit(1);
});

server.listen(config.port, config.host, () => {
  console.log(`Parapet listening on http://${config.host}:${config.port}`);
});

let stopping = false;
async function stop(signal: string) {
  if (stopping) return;
  stopping = true;
  console.log(`${signal}: stopping Parapet`);
  await jobs?.stop();
  await notices.stop();
  databaseWatch.stop();
  await realtime.close();
  server.close();
  await Promise.allSettled([close(), sequelize.close()]);
  process.exit(0);
}
process.on('SIGINT', () => void stop('SIGINT'));
process.on('SIGTERM', () => void stop('SIGTERM'));
