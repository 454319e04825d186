// The browser: take over the server's HTML with the same routes and the same data. The matched
// screen's chunk is loaded first (the server preloads it), so the first render is the server's.
import '@fontsource/barlow/500.css';
import '@fontsource/barlow/600.css';
import '@fontsource/barlow-condensed/600.css';
import './styles.css';
import { hydrate, QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { StrictMode } from 'react';
import { hydrateRoot } from 'react-dom/client';
import { createBrowserRouter } from 'react-router';
import { RouterProvider } from 'react-router/dom';
import { httpApi } from './lib/api';
import { ApiContext } from './lib/api-context';
import { createRoutes, resolveLazyMatches } from './routes';

const state = JSON.parse(document.getElementById('app-state')?.textContent ?? '{}');
const queryClient = new QueryClient({ defaultOptions: { queries: { staleTime: 30_000 } } });
if (state.query) hydrate(queryClient, state.query);

const routes = createRoutes({ queryClient, api: httpApi });
await resolveLazyMatches(routes, window.location);
const router = createBrowserRouter(routes, { hydrationData: state.router });

hydrateRoot(
  document.getElementById('root')!,
  <StrictMode>
    <ApiContext.Provider value={httpApi}>
      <QueryClientProvider client={queryClient}>
        <RouterProvider router={router} />
      </QueryClientProvider>
    </ApiContext.Provider>
  </StrictMode>,
);
