/**
 * Serves the built dashboard (web/, built by `npm run build:web` into web/dist) at `/`: its files
 * as they are, and index.html for any other GET that is a client route (`/runs/<id>`), so a
 * reload or a shared link opens the same view. `/api` and `/socket.io` are never answered with
 * the page: an unknown API route stays a JSON 404.
 */
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import express from 'express';
import type { Router } from 'express';

/** Where `npm run build:web` writes the dashboard: web/dist in the repository. */
export const DEFAULT_WEB_DIR = fileURLToPath(new URL('../../../web/dist/', import.meta.url));

/** What `/` says while the dashboard is not built (the API works regardless). */
const NOT_BUILT_PAGE = `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>Meniscus: dashboard not built</title></head>
<body style="font-family: sans-serif; max-width: 40rem; margin: 2rem auto; line-height: 1.5">
<h1>The dashboard is not built yet</h1>
<p>The server and its API are running, but the dashboard's files are missing. Build them once with
<code>npm run build:web</code> (or start with <code>npm start</code>, which builds them when they
are missing or older than web/), then reload this page.</p>
<p>The API answers meanwhile: <a href="/api/health">/api/health</a>, <a href="/api/runs">/api/runs</a>.</p>
</body></html>
`;

/** Paths that belong to the API or the live push, never to the page. */
function isServerPath(path: string): boolean {
  return /^\/(api|socket\.io)(\/|$)/.test(path);
}

/**
 * Express router of the dashboard.
 *
 * @param webDir - folder holding the built index.html and assets [DEFAULT_WEB_DIR]
 * @returns a router to mount at `/` after the API; checks for index.html on each page request,
 *   so a build made while the server runs is served without a restart. Without it, a page
 *   request gets 503 and a page saying how to build.
 */
export function dashboardRoutes(webDir: string = DEFAULT_WEB_DIR): Router {
  const router = express.Router();
  const indexFile = join(webDir, 'index.html');
  // Hashed asset names change with each build: they may be cached for long, index.html not.
  router.use(
    '/assets',
    express.static(join(webDir, 'assets'), { immutable: true, maxAge: '365d', fallthrough: true }),
  );
  router.use(express.static(webDir, { index: false }));
  router.use((request, response, next) => {
    const isFile = /\.[A-Za-z0-9]+$/.test(request.path); // a missing asset stays a 404
    if (
      (request.method !== 'GET' && request.method !== 'HEAD') ||
      isServerPath(request.path) ||
      isFile
    ) {
      next();
      return;
    }
    if (!existsSync(indexFile)) {
      response.status(503).type('html').send(NOT_BUILT_PAGE);
      return;
    }
    response.setHeader('Cache-Control', 'no-cache');
    response.sendFile(indexFile);
  });
  return router;
}
