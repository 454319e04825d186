// Serving the screens: Vite in middleware mode during development, the built client and
// server bundles in production. Both render through src/entry-server.tsx.
import { existsSync, readFileSync, symlinkSync } from 'node:fs';
import type { Server } from 'node:http';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import express, { type Request, type RequestHandler } from 'express';
import type { RenderResult } from '@/entry-server';
import type { Api } from '@/reads';
import type { Deps } from '@server/deps';
import { serverApi } from '@server/reads';
import { PROJECT_ROOT } from '@server/root';

export const ROOT = PROJECT_ROOT;
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

/**
 * The server bundle imports the screens' packages (react, react-router…) by name, which Node looks
 * up from the bundle's own folder: a build folder outside the project (JUGLINE_DIST=/tmp/…) gets a
 * link to the project's node_modules so it finds them.
 */
function linkPackages() {
  const inside = !path.relative(ROOT, DIST).startsWith('..');
  const link = path.join(DIST, 'node_modules');
  if (inside || existsSync(link)) return;
  try {
    symlinkSync(path.join(ROOT, 'node_modules'), link, 'dir');
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code !== 'EEXIST') throw err;
  }
}

export const isBuilt = () => existsSync(path.join(CLIENT_DIR, 'index.html')) && existsSync(SERVER_ENTRY);

function toFetchRequest(req: Request): Request_ {
  const url = new URL(req.originalUrl, `${req.protocol}://${req.get('host') ?? 'localhost'}`);
  const headers = new Headers();
  for (const [k, v] of Object.entries(req.headers)) if (typeof v === 'string') headers.set(k, v);
  return new globalThis.Request(url, { method: 'GET', headers });
}

type Page = Extract<RenderResult, { kind: 'page' }>;

interface ManifestChunk {
  file: string;
  isEntry?: boolean;
  imports?: string[];
  css?: string[];
}
export type Manifest = Record<string, ManifestChunk>;

/** The build's chunk table (`build.manifest`); null for a build made without it, or in development. */
export function readManifest(clientDir = CLIENT_DIR): Manifest | null {
  const file = path.join(clientDir, '.vite/manifest.json');
  return existsSync(file) ? (JSON.parse(readFileSync(file, 'utf8')) as Manifest) : null;
}

/** A chunk's file and everything it imports statically, each once. */
export function chunkClosure(manifest: Manifest, keys: string[]): { js: string[]; css: string[] } {
  const seen = new Set<string>();
  const js: string[] = [];
  const css = new Set<string>();
  const visit = (key: string) => {
    const chunk = manifest[key];
    if (!chunk || seen.has(key)) return;
    seen.add(key);
    js.push(chunk.file);
    chunk.css?.forEach((c) => css.add(c));
    chunk.imports?.forEach(visit);
  };
  keys.forEach(visit);
  return { js, css: [...css] };
}

/**
 * `<link>`s for the matched screens' chunks that the entry does not already bring, so the browser
 * fetches them beside the entry rather than after it has run (the entry waits for them before it
 * hydrates).
 */
export function preloadLinks(manifest: Manifest | null, modules: string[]): string {
  if (!manifest || modules.length === 0) return '';
  const entry = chunkClosure(
    manifest,
    Object.keys(manifest).filter((k) => manifest[k].isEntry),
  );
  const screen = chunkClosure(manifest, modules);
  const have = new Set([...entry.js, ...entry.css]);
  return [
    ...screen.css.filter((f) => !have.has(f)).map((f) => `<link rel="stylesheet" crossorigin href="/${f}">`),
    ...screen.js.filter((f) => !have.has(f)).map((f) => `<link rel="modulepreload" crossorigin href="/${f}">`),
  ].join('');
}

function fill(template: string, page: Page, manifest: Manifest | null = null): string {
  // function replacers: a `$` in the page must not be read as a replacement pattern
  return template
    .replace('<!--app-head-->', () => page.head + preloadLinks(manifest, page.modules))
    .replace('<!--app-html-->', () => page.html)
    .replace('<!--app-state-->', () => `<script id="app-state" type="application/json">${page.state}</script>`);
}

function pageHandler(deps: Deps, load: (url: string) => Promise<{ template: string; render: Render; manifest?: Manifest | null }>): RequestHandler {
  return async (req, res, next) => {
    try {
      const { template, render, manifest } = await load(req.originalUrl);
      const result = await render(toFetchRequest(req), serverApi(deps, req.user));
      if (result.kind === 'redirect') return res.redirect(result.status, result.location);
      res
        .status(result.status)
        .set('content-type', 'text/html; charset=utf-8')
        .set('cache-control', 'no-store')
        .send(fill(template, result, manifest));
    } catch (err) {
      next(err);
    }
  };
}

export function productionPages(): PageRenderer {
  if (!isBuilt()) throw new Error('No build found: run `npm run build` (npm start does it for you).');
  const template = readFileSync(path.join(CLIENT_DIR, 'index.html'), 'utf8');
  linkPackages();
  const manifest = readManifest();
  const loaded = import(pathToFileURL(SERVER_ENTRY).href) as Promise<{ render: Render }>;
  return {
    assets: express.static(CLIENT_DIR, { index: false, maxAge: '1h' }),
    handler: (deps) => pageHandler(deps, async () => ({ template, render: (await loaded).render, manifest })),
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
