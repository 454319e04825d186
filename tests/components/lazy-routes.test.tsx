// Screens are lazy routes (their own chunks). The server renders them fully; the browser must load
// the matched screen before it makes its router, or the router starts uninitialised and hydration
// throws the server's HTML away. React Router's SSR guide ("Lazy Routes") describes the fix that
// resolveLazyMatches implements.
import { existsSync } from 'node:fs';
import path from 'node:path';
import { hydrate, QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { act, StrictMode, type ReactElement } from 'react';
import { hydrateRoot, type Root } from 'react-dom/client';
// RouterProvider from 'react-router' itself: under Node, 'react-router/dom' can resolve to another
// copy of the package, whose router context the screens would not see.
import { createBrowserRouter, createStaticHandler, RouterProvider, type RouteObject } from 'react-router';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { render } from '@/entry-server';
import type { Api } from '@/lib/api';
import { ApiContext } from '@/lib/api-context';
import { createRoutes, resolveLazyMatches, SCREEN_FILES } from '@/routes';
import type { RouteDeps } from '@/routes/deps';
import { signInRoute } from '@/routes/signin';

const ROOT = path.resolve(__dirname, '../..');
// Only the sign-in screen is rendered here, signed out: it needs the session and nothing else.
const signedOut = { session: async () => ({ user: null }) } as unknown as Api;
const deps = (): RouteDeps => ({ queryClient: new QueryClient(), api: signedOut });
const screens = (routes: RouteObject[]) => routes[0].children ?? [];

describe('the lazy screens', () => {
  it('are every screen but home and not-found, each listed with its file', () => {
    const lazy = screens(createRoutes(deps())).filter((r) => r.lazy);
    expect(lazy.map((r) => r.id).sort()).toEqual(Object.keys(SCREEN_FILES).sort());
    for (const file of Object.values(SCREEN_FILES)) expect(existsSync(path.join(ROOT, file)), file).toBe(true);
    const eager = screens(createRoutes(deps()))
      .filter((r) => !r.lazy)
      .map((r) => r.id);
    expect(eager).toEqual(['home', 'not-found']);
  });

  it('load the module their file names (the preload links depend on it)', async () => {
    const d = deps();
    for (const route of screens(createRoutes(d)).filter((r) => r.lazy)) {
      const loaded = await (route.lazy as () => Promise<RouteObject>)();
      const mod = (await import(/* @vite-ignore */ path.join(ROOT, SCREEN_FILES[route.id!]))) as Record<string, unknown>;
      const make = Object.entries(mod).find(([name, v]) => name.endsWith('Route') && typeof v === 'function')?.[1] as (d: RouteDeps) => RouteObject;
      expect(loaded.Component, route.id).toBeTypeOf('function');
      expect(loaded.Component, route.id).toBe(make(d).Component);
    }
    // every screen's module imported cold: about 2 s on a quiet machine, more than 5 at load 7;
    // a safety net, not a measure
  }, 30_000);
});

describe('resolveLazyMatches', () => {
  it('loads only the matched screen, in place', async () => {
    const routes = createRoutes(deps());
    expect(await resolveLazyMatches(routes, '/bar')).toEqual(['bar']);
    const bar = screens(routes).find((r) => r.id === 'bar')!;
    expect(bar.lazy).toBeUndefined();
    expect(bar.Component).toBeTypeOf('function');
    expect(bar.loader).toBeTypeOf('function');
    expect(bar.handle).toMatchObject({ title: 'Bar' });
    expect(screens(routes).find((r) => r.id === 'counter')!.lazy).toBeTypeOf('function');
  });

  it('leaves a path with no lazy screen alone', async () => {
    const routes = createRoutes(deps());
    expect(await resolveLazyMatches(routes, '/no-such-screen')).toEqual([]);
    expect(screens(routes).filter((r) => r.lazy)).toHaveLength(Object.keys(SCREEN_FILES).length);
  });
});

describe('a server-rendered screen', () => {
  let root: Root | undefined;
  // hydrateRoot by hand (Testing Library's render would make a fresh root): tell React it runs under act
  (globalThis as { IS_REACT_ACT_ENVIRONMENT?: boolean }).IS_REACT_ACT_ENVIRONMENT = true;
  afterEach(() => {
    act(() => root?.unmount());
    root = undefined;
    document.body.innerHTML = '';
  });

  it('the server loads the lazy screen itself, even one without a loader', async () => {
    const d = deps();
    const handler = createStaticHandler(createRoutes(d));
    const context = await handler.query(new Request('http://localhost/signin'));
    if (context instanceof Response) throw new Error('expected a page');
    const signin = context.matches.at(-1)!.route;
    expect(signin.id).toBe('signin');
    // the router turns a loaded Component into its element
    expect((signin.element as ReactElement | undefined)?.type).toBe(signInRoute(d).Component);
    expect(signin.handle).toMatchObject({ title: 'Sign in' });
  });

  it('hydrates onto the server HTML without replacing it', async () => {
    const page = await render(new Request('http://localhost/signin'), signedOut);
    if (page.kind !== 'page') throw new Error('expected a page');
    expect(page.html).toContain('Sign in');
    expect(page.modules).toEqual(['src/routes/signin.tsx']);
    const state = JSON.parse(page.state);

    window.history.replaceState(null, '', '/signin');
    const container = document.createElement('div');
    container.innerHTML = page.html;
    document.body.append(container);
    const serverNode = container.firstElementChild;

    const queryClient = new QueryClient();
    hydrate(queryClient, state.query);
    const routes = createRoutes({ queryClient, api: signedOut });
    // without the matched screen's module the router could not start with the server's data
    expect(createBrowserRouter(createRoutes({ queryClient, api: signedOut }), { hydrationData: state.router }).state.initialized).toBe(false);
    await resolveLazyMatches(routes, window.location);
    const router = createBrowserRouter(routes, { hydrationData: state.router });
    expect(router.state.initialized).toBe(true);

    const recoverable: unknown[] = [];
    // React reports a mismatch, and the router a missing screen ("No `HydrateFallback`…"), here
    const said = [vi.spyOn(console, 'error'), vi.spyOn(console, 'warn')];
    // synchronous act: React hydrates before any import could settle, as in a browser that is
    // still fetching a chunk
    act(() => {
      root = hydrateRoot(
        container,
        <StrictMode>
          <ApiContext.Provider value={signedOut}>
            <QueryClientProvider client={queryClient}>
              <RouterProvider router={router} />
            </QueryClientProvider>
          </ApiContext.Provider>
        </StrictMode>,
        { onRecoverableError: (e) => recoverable.push(e) },
      );
    });
    expect(recoverable).toEqual([]);
    for (const spy of said) {
      expect(spy.mock.calls).toEqual([]);
      spy.mockRestore();
    }
    expect(container.firstElementChild).toBe(serverNode); // the same element: hydrated, not re-rendered
    expect(container.querySelector('button[type="submit"], button')).not.toBeNull();
    router.dispose();
  });
});
