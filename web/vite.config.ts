/**
 * Vite build of the dashboard: `npm run build:web` writes web/dist, which the server serves at
 * `/` (server/src/api/dashboardRoutes.ts). `npm run dev:web` serves the sources with live reload
 * and passes /api and /socket.io to a server on MENISCUS_HTTP_PORT (8080 by default).
 */
import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vite';

const serverPort = process.env.MENISCUS_HTTP_PORT ?? '8080';
const server = `http://127.0.0.1:${serverPort}`;

export default defineConfig({
  root: fileURLToPath(new URL('.', import.meta.url)),
  base: '/',
  build: {
    outDir: 'dist',
    emptyOutDir: true,
    // Tablets on site run current browsers; no legacy transforms.
    target: 'es2022',
    chunkSizeWarningLimit: 200,
  },
  server: {
    proxy: {
      '/api': server,
      '/socket.io': { target: server, ws: true },
    },
  },
});
