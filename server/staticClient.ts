import fs from 'node:fs';
import type http from 'node:http';
import path from 'node:path';
import expressStaticGzip from 'express-static-gzip';
import express, { type NextFunction, type Request, type Response } from 'express';
import { SESSION_COOKIE } from './auth/session';
import { ApiError } from './errors';
import { htmlForPage, type Manifest } from './pagePreloads';

/** Whether the request carries Parapet's session cookie (it may have expired: the page's own requests find out). */
const hasSessionCookie = (req: Request) => (req.get('cookie') ?? '').split(';').some((part) => part.trim().startsWith(`${SESSION_COOKIE}=`));

/** Vite names every built asset by its content hash, so a name never changes meaning: cache it for a year. */
const HASHED_ASSETS = '/assets';
const YEAR_S = 365 * 24 * 3600;

/**
 * Serves the built client: hashed assets immutable for a year, everything else (index.html, the
 * agent script, the icon) revalidated on each use so a new release shows at once. The page shell
 * names the opened page's own scripts (`pagePreloads.ts`), so they download alongside the entry. Source maps are
 * never served; an asset that is not there is a 404, never the page shell in its place.
 */
export function staticClient(clientDist: string) {
  const dist = path.resolve(clientDist);
  const indexHtml = path.join(dist, 'index.html');
  const router = express.Router();
  if (!fs.existsSync(indexHtml)) return router;
  // Read once: a new release is a new process. The manifest names each page's scripts for the HTML.
  const shell = fs.readFileSync(indexHtml, 'utf8');
  const manifestFile = path.join(dist, '.vite', 'manifest.json');
  const manifest: Manifest = fs.existsSync(manifestFile) ? (JSON.parse(fs.readFileSync(manifestFile, 'utf8')) as Manifest) : {};

  const missing = (req: Request, _res: Response, next: NextFunction) =>
    next(new ApiError(404, 'not_found', `There is no file ${req.originalUrl} in this release. Reload the page to get the current version.`));
  router.use((req, res, next) => (req.path.endsWith('.map') ? missing(req, res, next) : next()));
  router.use(
    HASHED_ASSETS,
    // The build writes a brotli and a gzip copy beside each script and style (at the highest level, once).
    expressStaticGzip(path.join(dist, 'assets'), {
      index: false,
      enableBrotli: true,
      orderPreference: ['br', 'gzip'],
      serveStatic: { index: false, setHeaders: (res: http.ServerResponse) => res.setHeader('Cache-Control', `public, max-age=${YEAR_S}, immutable`) },
    }),
    missing,
  );
  router.use(express.static(dist, { index: false, setHeaders: (res: Response) => res.set('Cache-Control', 'no-cache') }));
  router.get('/{*splat}', (req, res) => {
    // The page's data preloads depend on whether a session cookie came along.
    res.set({ 'Cache-Control': 'no-cache', Vary: 'Cookie' });
    const search = req.originalUrl.includes('?') ? req.originalUrl.slice(req.originalUrl.indexOf('?')) : '';
    res.type('html').send(htmlForPage(shell, manifest, req.path, { search, hasSession: hasSessionCookie(req) }));
  });
  return router;
}
