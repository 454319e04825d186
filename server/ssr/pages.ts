// Serving the screens: Vite in middleware mode during development, the built client and
// server bundles in production. Both render through src/entry-server.tsx.
import { existsSync, readFileSync } from 'node:fs';
import type { Server } from 'node:http';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import express, { type Request, type RequestHandler } from 'express';
import type { RenderResult } from '../../src/entry-server';
import type { Api } from '../../src/lib/api';
import type { Deps } from '../services/deps';
import { serverApi } from './server-api';

export const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
// JUGLINE_DIST: another build folder (e.g. two builds side by side on one machine)
const DIST = path.resolve(ROOT, process.env.JUGLINE_DIST ?? 'dist');
export const CLIENT_DIR = path.join(DIST, 'client');
export const SERVER_ENTRY = path.join(DIST, 'server/entry-server.js');

type Render = (request: Request_, api: Api) => Promise<RenderResult>;
type Request_ = globalThis.Request;

export interface PageRenderer {
  assets: RequestHandler;
  handler(deps: Deps): RequestHandler;
  close(): Promise<void>;
}

export const isBuilt = () => existsSync(path.join(CLIENT_DIR, 'index.html')) && existsSync(SERVER_ENTRY);

function toFetchRequest(req: Request): Request_ {
  const url = new URL(req.originalUrl, `${req.protocol}://${req.get('host') ?? 'localhost'}`);
  const headers = new Headers();
  for (const [k, v] of Object.entries(req.headers)) if (typeof v === 'string') headers.set(k, v);
  return new globalThis.Request(url, { method: 'GET', headers });
}

function fill(template: string, page: Extract<RenderResult, { kind: 'page' }>): string {
  // function replacers: a `$` in the page must not be read as a replacement pattern
  return template
    .replace('<!--app-head-->', () => page.head)
    .replace('<!--app-html-->', () => page.html)
    .replace('<!--app-state-->', () => `<script id="app-state" type="application/json">${page.state}</script>`);
}

function pageHandler(deps: Deps, load: (url: string) => Promise<{ template: string; render: Render }>): RequestHandler {
  return async (req, res, next) => {
    try {
      const { template, render } = await load(req.originalUrl);
      const result = await render(toFetchRequest(req), serverApi(deps, req.user));
      if (result.kind === 'redirect') return res.redirect(result.status, result.location);
      res.status(result.status).set('content-type', 'text/html; charset=utf-8').set('cache-control', 'no-store').send(fill(template, result));
    } catch (err) {
      next(err);
    }
  };
}

export function productionPages(): PageRenderer {
  if (!isBuilt()) throw new Error('No build found: run `npm run build` (npm start does it for you).');
  const template = readFileSync(path.join(CLIENT_DIR, 'index.html'), 'utf8');
  const loaded = import(pathToFileURL(SERVER_ENTRY).href) as Promise<{ render: Render }>;
  return {
    assets: express.static(CLIENT_DIR, { index: false, maxAge: '1h' }),
    handler: (deps) => pageHandler(deps, async () => ({ template, render: (await loaded).render })),
    close: async () => {},
  };
}

export async function developmentPages(httpServer: Server): Promise<PageRenderer> {
  const { createServer } = await import('vite');
  const vite = await createServer({
    root: ROOT,
    appType: 'custom',
    server: { middlewareMode: true, hmr: { server: httpServer } },
  });
  return {
    assets: vite.middlewares,
    handler: (deps) =>
      pageHandler(deps, async (url) => {
        const template = await vite.transformIndexHtml(url, readFileSync(path.join(ROOT, 'index.html'), 'utf8'));
        const { render } = (await vite.ssrLoadModule('/src/entry-server.tsx')) as { render: Render };
        return { template, render };
      }),
    close: () => vite.close(),
  };
}
