/// <reference types="vite/client" />
import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { compression, defineAlgorithm } from 'vite-plugin-compression2';
import { constants } from 'node:zlib';

const apiPort = process.env.PORT ?? '4300';

export default defineConfig({
  plugins: [
    react(),
    tailwindcss(),
    // Pre-compressed copies at the highest levels, so the server sends them without compressing per request.
    compression({
      include: /\.(js|css|svg)$/,
      threshold: 1024,
      algorithms: [defineAlgorithm('brotliCompress', { params: { [constants.BROTLI_PARAM_QUALITY]: 11 } }), defineAlgorithm('gzip', { level: 9 })],
    }),
  ],
  server: {
    host: '127.0.0.1',
    port: 5173,
    proxy: {
      '/api': `http://127.0.0.1:${apiPort}`,
      '/socket.io': { target: `http://127.0.0.1:${apiPort}`, ws: true },
    },
  },
  // Maps stay beside the build for reading a stack trace, but scripts do not point to them and the server never sends them.
  // The manifest tells the server which scripts each page needs, so it can name them in the HTML (server/staticClient.ts).
  build: {
    outDir: 'dist',
    sourcemap: 'hidden',
    chunkSizeWarningLimit: 1500,
    manifest: true,
    rolldownOptions: {
      output: {
        // What every page runs (React, the router, the query cache) as one file: on slow mobile data each extra file costs
        // about 1 KB of response headers and a place in the browser's six-connection queue.
        codeSplitting: {
          groups: [
            { name: 'framework', test: /node_modules[\\/](react|react-dom|scheduler|react-router|react-router-dom|@tanstack)[\\/]/ },
            // The live connection's client, loaded after a page's first draw (src/lib/socket.ts).
            {
              name: 'live-client',
              test: /node_modules[\\/](socket\.io-client|socket\.io-parser|engine\.io-client|engine\.io-parser|@socket\.io[\\/]component-emitter)[\\/]/,
            },
          ],
        },
      },
    },
  },
});
