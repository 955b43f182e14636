import { matchRoutes } from 'react-router';
import { dataUrl, pageData } from '../src/app/page-data';
import { pages, pagesWithoutSession, pageSource, SIGNED_IN_SHELL_SOURCE } from '../src/app/pages';

/** The part of Vite's build manifest (`dist/.vite/manifest.json`) read here: one entry per source module or chunk. */
export interface ManifestChunk {
  file: string;
  imports?: string[];
  css?: string[];
  isEntry?: boolean;
}
export type Manifest = Record<string, ManifestChunk>;

const routes = pages.map((page) => ({ path: page.pattern, page }));
const pageAt = (urlPath: string) => matchRoutes(routes, urlPath)?.at(-1)?.route.page;

/**
 * The API answers the page at `urlPath` asks for first (src/app/page-data.ts), for a visitor whose request carries a
 * session cookie; none for anyone else, nor for a page without an entry there.
 */
export function pageDataUrls(urlPath: string, search: string, hasSession: boolean): string[] {
  const page = pageAt(urlPath);
  const requests = hasSession && page?.signedIn ? pageData[page.pattern] : undefined;
  return requests ? requests(new URLSearchParams(search)).map(dataUrl) : [];
}

/**
 * The scripts and styles the page at `urlPath` needs beyond the entry's own (which index.html already names):
 * the page's chunk, the signed-in shell's for console pages, and everything those import statically.
 * Without them in the HTML the browser learns of them only after the entry has downloaded and run: one more
 * round trip plus the entry's whole download on the critical path.
 */
export function pageAssets(manifest: Manifest, urlPath: string): { session: boolean; scripts: string[]; styles: string[] } {
  const page = pageAt(urlPath);
  // An address no page claims still opens in the signed-in shell (its "not found" page), which asks for the session.
  if (!page) return { session: true, scripts: [], styles: [] };
  const session = !pagesWithoutSession.includes(page.pattern);
  const already = new Set<string>();
  const entry = Object.entries(manifest).find(([, chunk]) => chunk.isEntry);
  const skip = (key: string) => {
    if (already.has(key)) return;
    already.add(key);
    for (const next of manifest[key]?.imports ?? []) skip(next);
  };
  if (entry) skip(entry[0]);
  const scripts: string[] = [];
  const styles: string[] = [];
  const visit = (key: string) => {
    const chunk = manifest[key];
    if (!chunk || already.has(key)) return;
    already.add(key);
    scripts.push(`/${chunk.file}`);
    for (const css of chunk.css ?? []) styles.push(`/${css}`);
    for (const next of chunk.imports ?? []) visit(next);
  };
  if (page.signedIn) visit(SIGNED_IN_SHELL_SOURCE);
  visit(pageSource(page.file));
  return { session, scripts, styles };
}

const escapeAttribute = (value: string) => value.replace(/&/g, '&amp;').replace(/"/g, '&quot;').replace(/</g, '&lt;');

/** The session answer main.tsx asks for at start-up (`fetch` with credentials "same-origin", so `crossorigin` anonymous). */
export const SESSION_PRELOAD = '<link rel="preload" href="/api/v1/session" as="fetch" crossorigin>';

/**
 * A page's data answer, fetched like `api` in src/lib/api.ts fetches it (credentials "same-origin" is what `crossorigin`
 * anonymous means for this origin), so the browser hands the preloaded answer to that fetch.
 */
export const dataPreload = (url: string) => `<link rel="preload" href="${escapeAttribute(url)}" as="fetch" crossorigin>`;

/** Who is asking, as far as the page's HTML needs to know: the address's query, and whether a session cookie came along. */
export interface PageRequest {
  search?: string;
  hasSession?: boolean;
}

/**
 * index.html with, first in its head, the session preload and, for a visitor with a session, the page's data preloads
 * (so those requests take the browser's six connections before the scripts queue on them), and at its end the page's
 * scripts (modulepreload) and styles.
 */
export function htmlForPage(indexHtml: string, manifest: Manifest, urlPath: string, request: PageRequest = {}): string {
  const { session, scripts, styles } = pageAssets(manifest, urlPath);
  const early = [...(session ? [SESSION_PRELOAD] : []), ...pageDataUrls(urlPath, request.search ?? '', request.hasSession ?? false).map(dataPreload)];
  const withSession = early.length > 0 ? indexHtml.replace('<head>', `<head>\n    ${early.join('\n    ')}`) : indexHtml;
  if (scripts.length === 0 && styles.length === 0) return withSession;
  const tags = [
    ...scripts.map((href) => `<link rel="modulepreload" crossorigin href="${escapeAttribute(href)}">`),
    ...styles.map((href) => `<link rel="stylesheet" crossorigin href="${escapeAttribute(href)}">`),
  ].join('\n    ');
  return withSession.replace('</head>', `    ${tags}\n  </head>`);
}
