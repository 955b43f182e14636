// The one address in front of several Parapet instances for `npm run bench:town`: round robin over
// loopback, WebSocket upgrades included, each answer labelled with the instance that gave it.
// PROXY_TARGETS="a=http://127.0.0.1:4101,b=http://127.0.0.1:4102" PROXY_PORT=0 tsx server/tools/townProxy.ts
import http from 'node:http';
import type { Duplex } from 'node:stream';
import httpProxy from 'http-proxy';

const targets = (process.env.PROXY_TARGETS ?? '')
  .split(',')
  .filter(Boolean)
  .map((t) => {
    const [name, url] = t.split('=');
    return { name, url };
  });
if (!targets.length || targets.some((t) => !t.name || !t.url?.startsWith('http://127.0.0.1:'))) {
  console.error('PROXY_TARGETS must list name=http://127.0.0.1:PORT pairs, comma-separated (loopback only)');
  process.exit(2);
}

const instanceOf = new WeakMap<http.IncomingMessage, string>();
// Connections to the instances are kept and reused (a fresh connection per request costs both sides a handshake).
// An idle one is closed here after 30 s, well before an instance closes it (server.keepAliveTimeout, 65 s), so a
// request never goes out on a connection the instance is closing.
const proxy = httpProxy.createProxyServer({ agent: new http.Agent({ keepAlive: true, maxSockets: 256, timeout: 30_000 }), xfwd: true });
proxy.on('proxyRes', (proxyRes, req) => {
  proxyRes.headers['x-parapet-instance'] = instanceOf.get(req) ?? '';
});
proxy.on('error', (err, req, res) => {
  const where = instanceOf.get(req) ?? '?';
  if (res instanceof http.ServerResponse) {
    if (!res.headersSent) {
      res.writeHead(502, { 'content-type': 'application/json', 'x-parapet-instance': where });
      res.end(JSON.stringify({ error: { code: 'upstream_unreachable', message: `Instance ${where} did not answer (${err.message}); try again.` } }));
    } else res.destroy();
  } else (res as Duplex).destroy();
});

let next = 0;
const pick = (req: http.IncomingMessage) => {
  const t = targets[next++ % targets.length];
  instanceOf.set(req, t.name);
  return t;
};
const server = http.createServer((req, res) => proxy.web(req, res, { target: pick(req).url }));
server.on('upgrade', (req, socket, head) => proxy.ws(req, socket, head, { target: pick(req).url }));
server.keepAliveTimeout = 65_000;
server.listen(Number(process.env.PROXY_PORT ?? 0), '127.0.0.1', () => {
  const { port } = server.address() as { port: number };
  console.log(`proxy listening on http://127.0.0.1:${port} for ${targets.map((t) => `${t.name}=${t.url}`).join(', ')}`);
});
const stop = () => {
  server.close(() => process.exit(0));
  server.closeAllConnections();
  setTimeout(() => process.exit(0), 3000);
};
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
