import { matchRoutes } from 'react-router';
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

/**
 * The scripts and styles the page at `urlPath` needs beyond the entry's own (which index.html already names):
 * the page's chunk, the signed-in shell's for console pages, and everything those import statically.
 * Without them in the HTML the browser learns of them only after the entry has downloaded and run: one more
 * round trip plus the entry's whole download on the critical path.
 */
export function pageAssets(manifest: Manifest, urlPath: string): { session: boolean; scripts: string[]; styles: string[] } {
  const matched = matchRoutes(routes, urlPath);
  const page = matched?.at(-1)?.route.page;
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
 * index.html with, first in its head, the session preload (so that request takes one of the browser's six
 * connections before the scripts queue on them), and at its end the page's scripts (modulepreload) and styles.
 */
export function htmlForPage(indexHtml: string, manifest: Manifest, urlPath: string): string {
  const { session, scripts, styles } = pageAssets(manifest, urlPath);
  const withSession = session ? indexHtml.replace('<head>', `<head>\n    ${SESSION_PRELOAD}`) : indexHtml;
  if (scripts.length === 0 && styles.length === 0) return withSession;
  const tags = [
    ...scripts.map((href) => `<link rel="modulepreload" crossorigin href="${escapeAttribute(href)}">`),
    ...styles.map((href) => `<link rel="stylesheet" crossorigin href="${escapeAttribute(href)}">`),
  ].join('\n    ');
  return withSession.replace('</head>', `    ${tags}\n  </head>`);
}
