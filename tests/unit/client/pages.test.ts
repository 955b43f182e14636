import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { componentName, pages, pageSource } from '../../../src/app/pages';
import { pageAssets, type Manifest } from '../../../server/pagePreloads';

// The page list is read by the router (lazy routes) and by the server (preloads): it must name real files.
describe('the page list', () => {
  it('names every page file once, each exporting its component, and nothing else in src/routes', () => {
    const files = fs
      .readdirSync(path.resolve('src/routes'))
      .filter((f) => f.endsWith('.tsx'))
      .map((f) => f.replace(/\.tsx$/, ''));
    // The "not found" page is not lazy: the router imports it directly as the shell's catch-all.
    expect(pages.map((p) => p.file).sort()).toEqual(files.filter((f) => f !== 'not-found').sort());
    for (const page of pages) {
      const source = fs.readFileSync(path.resolve(pageSource(page.file)), 'utf8');
      expect(source, page.file).toContain(`export function ${componentName(page.file)}(`);
    }
    expect(new Set(pages.map((p) => p.pattern)).size).toBe(pages.length);
  });

  it('turns a file name into its component name', () => {
    expect(componentName('my-nodes')).toBe('MyNodesPage');
    expect(componentName('overview')).toBe('OverviewPage');
  });

  it('matches an address to its page the way the router does: a fixed segment before a parameter', () => {
    const manifest: Manifest = {
      'src/routes/site-new.tsx': { file: 'assets/site-new.js' },
      'src/routes/site-detail.tsx': { file: 'assets/site-detail.js' },
      'src/app/signed-in-layout.tsx': { file: 'assets/shell.js' },
    };
    expect(pageAssets(manifest, '/sites/new').scripts).toEqual(['/assets/shell.js', '/assets/site-new.js']);
    expect(pageAssets(manifest, '/sites/7').scripts).toEqual(['/assets/shell.js', '/assets/site-detail.js']);
    expect(pageAssets(manifest, '/status')).toEqual({ session: false, scripts: [], styles: [] });
    expect(pageAssets(manifest, '/sign-in').session).toBe(true);
  });
});
