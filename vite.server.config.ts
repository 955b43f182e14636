import { defineConfig } from 'vite';

// The server compiled once for production (`npm run build:server`), so `node dist-server/index.js`
// runs without transpiling TypeScript at start. Packages stay in node_modules (not bundled).
export default defineConfig({
  publicDir: false,
  build: {
    ssr: true,
    rollupOptions: { input: { index: 'server/index.ts', migrate: 'server/db/migrate.ts' } },
    outDir: 'dist-server',
    emptyOutDir: true,
    sourcemap: true,
    target: 'node20',
  },
});
