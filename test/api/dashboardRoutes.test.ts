/**
 * dashboardRoutes() over a real HTTP server: the built files, index.html for client routes,
 * never for /api or /socket.io, and a page saying how to build while the build is missing.
 */
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import express from 'express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { dashboardRoutes } from '../../server/src/api/dashboardRoutes.ts';

const PAGE = '<!doctype html><title>dashboard page</title>';

let webDir: string;
let http: Server;
let base: string;

beforeAll(async () => {
  webDir = mkdtempSync(join(tmpdir(), 'meniscus-web-'));
  const app = express();
  app.use('/api', (_request, response) => {
    response.status(404).json({ error: 'no such API route' });
  });
  app.use(dashboardRoutes(webDir));
  http = await new Promise((resolve) => {
    const server = app.listen(0, '127.0.0.1', () => resolve(server));
  });
  base = `http://127.0.0.1:${(http.address() as AddressInfo).port}`;
});

afterAll(async () => {
  await new Promise((resolve) => http.close(resolve));
  rmSync(webDir, { recursive: true, force: true });
});

describe('dashboardRoutes()', () => {
  it('answers / with 503 and how to build while index.html is missing', async () => {
    const response = await fetch(`${base}/`);
    expect(response.status).toBe(503);
    expect(await response.text()).toContain('npm run build:web');
  });

  it('serves a build made while the server runs, without a restart', async () => {
    mkdirSync(join(webDir, 'assets'), { recursive: true });
    writeFileSync(join(webDir, 'index.html'), PAGE);
    writeFileSync(join(webDir, 'assets', 'app-1234.js'), 'console.log(1);');
    const page = await fetch(`${base}/`);
    expect(page.status).toBe(200);
    expect(await page.text()).toBe(PAGE);
    const asset = await fetch(`${base}/assets/app-1234.js`);
    expect(asset.status).toBe(200);
    expect(asset.headers.get('cache-control')).toContain('immutable');
  });

  it.each([['/runs/r-1'], ['/runs/r-1/'], ['/anything/else']])(
    'answers the client route %s with index.html',
    async (path) => {
      const response = await fetch(`${base}${path}`);
      expect(response.status).toBe(200);
      expect(await response.text()).toBe(PAGE);
    },
  );

  it.each([['/api/nope'], ['/socket.io/?EIO=4'], ['/assets/missing-5678.js'], ['/favicon.ico']])(
    'never answers %s with the page',
    async (path) => {
      const response = await fetch(`${base}${path}`);
      expect(response.status).toBe(404);
      expect(await response.text()).not.toBe(PAGE);
    },
  );

  it('does not answer a POST to a client route with the page', async () => {
    const response = await fetch(`${base}/runs/r-1`, { method: 'POST' });
    expect(response.status).toBe(404);
  });
});
