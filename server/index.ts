import http from 'node:http';
import { createApp } from './app';
import { loadConfig } from './config';
import { createSequelize } from './db/sequelize';
import { startJobs } from './jobs/scheduler';
import { createRealtime } from './realtime/io';

const config = loadConfig();
const sequelize = createSequelize(config.databaseUrl, config.databasePoolMax);
const { app, session, passport, close } = createApp({ config, sequelize });
const server = http.createServer(app);
const realtime = createRealtime(server, config, session, passport);
const jobs = config.jobsEnabled ? startJobs(config, sequelize) : null;

server.listen(config.port, config.host, () => {
  console.log(`Parapet listening on http://${config.host}:${config.port}`);
});

let stopping = false;
async function stop(signal: string) {
  if (stopping) return;
  stopping = true;
  console.log(`${signal}: stopping Parapet`);
  jobs?.stop();
  await realtime.close();
  server.close();
  await Promise.allSettled([close(), sequelize.close()]);
  process.exit(0);
}
process.on('SIGINT', () => void stop('SIGINT'));
process.on('SIGTERM', () => void stop('SIGTERM'));
