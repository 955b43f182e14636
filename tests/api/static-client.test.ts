import fs from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import zlib from 'node:zlib';
import request from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';
import { reportMonth } from '../../src/app/page-data';
import { buildUser, signIn, useApi } from '../helpers/api';
import { buildNeighbourhood } from '../helpers/factories';

// A small built client of our own, so these checks do not depend on what the real build contains.
const dist = fs.mkdtempSync(path.join(os.tmpdir(), 'parapet-dist-'));
const script = `export const lines = [${Array.from({ length: 400 }, (_, i) => `"line ${i} of the map page"`).join(',')}];\n`;
const shell =
  '<!doctype html><html lang="en"><head><title>Parapet</title><script type="module" src="/assets/index-Ab12Cd34.js"></script></head>' +
  '<body><div id="root"></div></body></html>';
fs.mkdirSync(path.join(dist, 'assets'));
fs.writeFileSync(path.join(dist, 'index.html'), shell);
fs.writeFileSync(path.join(dist, 'assets', 'index-Ab12Cd34.js'), script);
// As the build leaves them: a brotli and a gzip copy beside the main script; the chunk has none.
const scriptBr = zlib.brotliCompressSync(script, { params: { [zlib.constants.BROTLI_PARAM_QUALITY]: 11 } });
fs.writeFileSync(path.join(dist, 'assets', 'index-Ab12Cd34.js.br'), scriptBr);
fs.writeFileSync(path.join(dist, 'assets', 'index-Ab12Cd34.js.gz'), zlib.gzipSync(script, { level: 9 }));
fs.writeFileSync(path.join(dist, 'assets', 'chunk-Zz99Yy88.js'), script.replaceAll('map page', 'chart'));
fs.writeFileSync(path.join(dist, 'assets', 'index-Ab12Cd34.js.map'), '{"version":3,"sources":["src/secret.ts"],"mappings":""}');
fs.writeFileSync(path.join(dist, 'favicon.svg'), '<svg xmlns="http://www.w3.org/2000/svg"/>');
// The build's manifest, as Vite writes it: which chunks each page and the signed-in shell import.
fs.mkdirSync(path.join(dist, '.vite'));
const manifest = {
  'index.html': { file: 'assets/index-Ab12Cd34.js', isEntry: true, imports: ['_vendor-Vv11.js'] },
  '_vendor-Vv11.js': { file: 'assets/vendor-Vv11.js' },
  '_live-Ll22.js': { file: 'assets/live-Ll22.js', imports: ['_vendor-Vv11.js'] },
  '_table-Tt33.js': { file: 'assets/table-Tt33.js', imports: ['_vendor-Vv11.js'] },
  'src/app/signed-in-layout.tsx': { file: 'assets/signed-in-layout-Ss44.js', isDynamicEntry: true, imports: ['_vendor-Vv11.js', '_live-Ll22.js'] },
  'src/routes/nodes.tsx': { file: 'assets/nodes-Nn55.js', isDynamicEntry: true, imports: ['index.html', '_table-Tt33.js'], css: ['assets/nodes-Nn55.css'] },
  'src/routes/public-status.tsx': { file: 'assets/public-status-Pp66.js', isDynamicEntry: true, imports: ['_vendor-Vv11.js'] },
};
fs.writeFileSync(path.join(dist, '.vite', 'manifest.json'), JSON.stringify(manifest));
const SESSION_PRELOAD = '<link rel="preload" href="/api/v1/session" as="fetch" crossorigin>';
const preloadedScripts = (html: string) => [...html.matchAll(/<link rel="modulepreload" crossorigin href="([^"]+)">/g)].map((m) => m[1]);
const dataPreloads = (html: string) =>
  [...html.matchAll(/<link rel="preload" href="([^"]+)" as="fetch" crossorigin>/g)]
    .map((m) => m[1].replaceAll('&amp;', '&'))
    .filter((url) => url !== '/api/v1/session');
const withoutLinks = (html: string) => html.replace(/\s*<link [^>]*>/g, '').replace(/\s+<\/head>/, '</head>');
afterAll(() => fs.rmSync(dist, { recursive: true, force: true }));

/** The bytes exactly as they travel (supertest would decode them), with the answer's headers. */
function raw(app: http.RequestListener, url: string, acceptEncoding: string) {
  return new Promise<{ status: number; headers: http.IncomingHttpHeaders; body: Buffer }>((resolve, reject) => {
    const server = http.createServer(app).listen(0, '127.0.0.1', () => {
      const { port } = server.address() as AddressInfo;
      http
        .get({ host: '127.0.0.1', port, path: url, headers: { 'Accept-Encoding': acceptEncoding } }, (res) => {
          const chunks: Buffer[] = [];
          res.on('data', (c: Buffer) => chunks.push(c));
          res.on('end', () => server.close(() => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) })));
        })
        .on('error', (err) => server.close(() => reject(err)));
    });
  });
}

describe('serving the built client', () => {
  const ctx = useApi({ clientDist: dist });

  it('sends the pre-compressed brotli copy of a hashed asset when the browser offers it, cached for a year as immutable', async () => {
    const res = await raw(ctx.app, '/assets/index-Ab12Cd34.js', 'gzip, deflate, br');
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe('br');
    expect(res.headers['content-type']).toMatch(/^text\/javascript|^application\/javascript/);
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(res.headers['vary']).toMatch(/accept-encoding/i);
    expect(res.body.equals(scriptBr)).toBe(true);
    expect(zlib.brotliDecompressSync(res.body).toString()).toBe(script);
  });

  it('falls back to the gzip copy, and to plain bytes for a client that offers no encoding', async () => {
    const gz = await raw(ctx.app, '/assets/index-Ab12Cd34.js', 'gzip');
    expect(gz.headers['content-encoding']).toBe('gzip');
    expect(gz.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(zlib.gunzipSync(gz.body).toString()).toBe(script);

    const plain = await raw(ctx.app, '/assets/index-Ab12Cd34.js', 'identity');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.body.toString()).toBe(script);
  });

  it('compresses an asset that has no pre-compressed copy as it is sent', async () => {
    const res = await raw(ctx.app, '/assets/chunk-Zz99Yy88.js', 'br');
    expect(res.headers['content-encoding']).toBe('br');
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(res.body.length).toBeLessThan(script.length / 3);
    expect(zlib.brotliDecompressSync(res.body).toString()).toBe(script.replaceAll('map page', 'chart'));
  });

  it('never serves source maps, in the assets folder or anywhere else', async () => {
    for (const url of ['/assets/index-Ab12Cd34.js.map', '/index.js.map', '/nodes/3/radio.map']) {
      const res = await request(ctx.app).get(url);
      expect(res.status, url).toBe(404);
      expect(res.headers['content-type'], url).toMatch(/json/);
      expect(res.body.error.message, url).toContain('Reload the page');
      expect(res.text, url).not.toContain('secret.ts');
    }
  });

  it('answers a missing hashed asset with 404, not with the page shell under a script name', async () => {
    const res = await request(ctx.app).get('/assets/index-OldHash9.js');
    expect(res.status).toBe(404);
    expect(res.body.error).toEqual({
      code: 'not_found',
      message: 'There is no file /assets/index-OldHash9.js in this release. Reload the page to get the current version.',
    });
  });

  it('sends the page shell for every client route, revalidated on each use so a release shows at once', async () => {
    for (const url of ['/', '/topology', '/nodes/12']) {
      const res = await request(ctx.app).get(url).set('Accept-Encoding', 'gzip');
      expect(res.status, url).toBe(200);
      expect(res.headers['content-type'], url).toMatch(/text\/html/);
      expect(res.headers['cache-control'], url).toBe('no-cache');
      expect(withoutLinks(res.text), url).toBe(shell);
    }
    const icon = await request(ctx.app).get('/favicon.svg');
    expect(icon.status).toBe(200);
    expect(icon.headers['cache-control']).toBe('no-cache');
  });

  it("names the opened page's own scripts and styles in the shell, so they download alongside the entry", async () => {
    const nodes = await request(ctx.app).get('/nodes?page=2');
    expect(nodes.status).toBe(200);
    // The shell's and the page's chunks and what they import, but not what the entry itself already brings.
    expect(preloadedScripts(nodes.text)).toEqual([
      '/assets/signed-in-layout-Ss44.js',
      '/assets/live-Ll22.js',
      '/assets/nodes-Nn55.js',
      '/assets/table-Tt33.js',
    ]);
    expect(nodes.text).toContain('<link rel="stylesheet" crossorigin href="/assets/nodes-Nn55.css">');
    // The session question goes first, before the scripts take the browser's connections.
    expect(nodes.text.indexOf(SESSION_PRELOAD)).toBeGreaterThan(0);
    expect(nodes.text.indexOf(SESSION_PRELOAD)).toBeLessThan(nodes.text.indexOf('<title>'));

    const status = await request(ctx.app).get('/status');
    expect(preloadedScripts(status.text)).toEqual(['/assets/public-status-Pp66.js']);
    expect(status.text).not.toContain('/api/v1/session');
  });

  it("opens an address no page claims with the plain shell, and a page the manifest does not list with the shell's scripts alone", async () => {
    const unknown = await request(ctx.app).get('/no-such-page');
    expect(unknown.status).toBe(200);
    expect(preloadedScripts(unknown.text)).toEqual([]);
    expect(unknown.text).toContain(SESSION_PRELOAD);
    for (const url of ['/sites/new', '/nodes/12']) {
      const res = await request(ctx.app).get(url);
      expect(res.status, url).toBe(200);
      expect(preloadedScripts(res.text), url).toEqual(['/assets/signed-in-layout-Ss44.js', '/assets/live-Ll22.js']);
      expect(res.text, url).toContain(SESSION_PRELOAD);
    }
  });

  it("names a signed-in page's first API answers in its HTML (from src/app/page-data.ts), and none for a visitor without a session", async () => {
    const agent = await signIn(ctx, await buildUser({ role: 'admin' }));
    const nodes = await agent.get('/nodes?page=2&state=down&pageSize=10');
    expect(nodes.status).toBe(200);
    // Exactly what the nodes page asks first: its list (page, size, sort, search, filters in the page's order), then its pickers.
    expect(dataPreloads(nodes.text)).toEqual([
      '/api/v1/nodes?page=2&pageSize=10&sort=name&state=down',
      '/api/v1/sites?page=1&pageSize=500&sort=name',
      '/api/v1/neighbourhoods?page=1&pageSize=500&sort=name',
    ]);
    // Early in the head, with the session question, before the scripts queue on the browser's connections.
    expect(nodes.text.indexOf('/api/v1/nodes?')).toBeLessThan(nodes.text.indexOf('<title>'));
    expect(nodes.headers['vary']).toMatch(/cookie/i);
    expect(dataPreloads((await agent.get('/topology')).text)).toEqual([
      '/api/v1/topology',
      '/api/v1/topology/neighbourhoods',
      '/api/v1/neighbourhoods?page=1&pageSize=500&sort=name',
    ]);
    expect(dataPreloads((await agent.get('/')).text)).toEqual(['/api/v1/overview']);
    expect(dataPreloads((await agent.get('/neighbourhoods')).text)).toEqual(['/api/v1/neighbourhoods?page=1&pageSize=25&sort=name&retired=all']);
    // The reports page's month: the one its address names (as the page reads it), else the last whole month.
    expect(dataPreloads((await agent.get('/reports?month=2026-03')).text)).toEqual(['/api/v1/reports/availability?month=2026-03']);
    expect(dataPreloads((await agent.get('/reports')).text)).toEqual([`/api/v1/reports/availability?month=${reportMonth(new URLSearchParams())}`]);
    // An attribute cannot be broken out of by the address's query.
    const odd = await agent.get('/sites?q=%22%3E%3Cscript%3E');
    expect(odd.text).not.toContain('"><script>');
    expect(dataPreloads(odd.text)[0]).toBe('/api/v1/sites?page=1&pageSize=25&sort=name&q=%22%3E%3Cscript%3E');
    // Pages outside the console, and pages with no entry in the table, get none even with a session.
    for (const url of ['/status', '/sign-in', '/planning', '/nodes/12']) expect(dataPreloads((await agent.get(url)).text), url).toEqual([]);

    // No session cookie: the session question alone (it decides where to send the visitor), no data.
    const anonymous = await request(ctx.app).get('/nodes');
    expect(anonymous.status).toBe(200);
    expect(anonymous.text).toContain(SESSION_PRELOAD);
    expect(dataPreloads(anonymous.text)).toEqual([]);
  });

  it('compresses JSON answers from the API as well', async () => {
    for (let i = 0; i < 30; i++) await buildNeighbourhood({ name: `Lindenfall ward ${i}` });
    const res = await raw(ctx.app, '/api/v1/public/status', 'br');
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe('br');
    const body = JSON.parse(zlib.brotliDecompressSync(res.body).toString());
    expect(body.data.neighbourhoods).toHaveLength(30);
  });
});
