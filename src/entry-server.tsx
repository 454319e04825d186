// Server rendering: run the matched routes' loaders into a fresh QueryClient for this request,
// render the screen to HTML, and hand the data to the browser as non-executable JSON.
import { defaultShouldDehydrateQuery, dehydrate, QueryClient, QueryClientProvider, type Query } from '@tanstack/react-query';
import { StrictMode } from 'react';
import { renderToString } from 'react-dom/server';
import { createStaticHandler, createStaticRouter, StaticRouterProvider } from 'react-router';
import type { Api } from './lib/api';
import { ApiContext } from './lib/api-context';
import { escapeHtml, jsonForScript } from './domain/html';
import { createRoutes, SCREEN_FILES } from './routes';
import { embedOf, headOf, titleOf } from './routes/root';

export type RenderResult =
  | { kind: 'redirect'; status: number; location: string }
  | {
      kind: 'page';
      status: number;
      head: string;
      html: string;
      state: string;
      /** Source files of the matched lazy screens (the build manifest's keys), for preload links. */
      modules: string[];
    };

export async function render(request: Request, api: Api): Promise<RenderResult> {
  // Never module-level on the server: one request's data must not reach another's page.
  // (The static handler loads the matched lazy screens itself before their loaders run.)
  const queryClient = new QueryClient({ defaultOptions: { queries: { retry: false, staleTime: 30_000 } } });
  const handler = createStaticHandler(createRoutes({ queryClient, api }));
  const context = await handler.query(request);
  if (context instanceof Response) {
    return { kind: 'redirect', status: context.status, location: context.headers.get('Location') ?? '/' };
  }
  const router = createStaticRouter(handler.dataRoutes, context);
  const html = renderToString(
    <StrictMode>
      <ApiContext.Provider value={api}>
        <QueryClientProvider client={queryClient}>
          <StaticRouterProvider router={router} context={context} hydrate={false} />
        </QueryClientProvider>
      </ApiContext.Provider>
    </StrictMode>,
  );
  const handles = context.matches.map((m) => ({ handle: m.route.handle }));
  // A customer-facing screen embeds only its own queries (not, say, who is signed in).
  const embed = embedOf(handles);
  const embedded = (q: Query) => defaultShouldDehydrateQuery(q) && (!embed || embed.some((key) => key.every((part, i) => q.queryKey[i] === part)));
  const state = {
    query: dehydrate(queryClient, { shouldDehydrateQuery: embedded }),
    router: { loaderData: context.loaderData, actionData: context.actionData, errors: context.errors },
  };
  const head = `<title>${escapeHtml(titleOf(handles))}</title>${headOf(handles)}`;
  const modules = context.matches.flatMap((m) => (SCREEN_FILES[m.route.id] ? [SCREEN_FILES[m.route.id]] : []));
  return { kind: 'page', status: context.statusCode, head, html, state: jsonForScript(state), modules };
}
