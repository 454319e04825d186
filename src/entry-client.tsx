// The browser: take over the server's HTML with the same routes and the same data.
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
import { createRoutes } from './routes';

const state = JSON.parse(document.getElementById('app-state')?.textContent ?? '{}');
const queryClient = new QueryClient({ defaultOptions: { queries: { staleTime: 30_000 } } });
if (state.query) hydrate(queryClient, state.query);

const router = createBrowserRouter(createRoutes({ queryClient, api: httpApi }), { hydrationData: state.router });

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
