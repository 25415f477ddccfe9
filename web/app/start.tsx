// The app itself, started by web/main.tsx once React has loaded: zod's settings, the first
// question to the server, then the providers and the router rendered into the page.
import '../lib/zod-setup';
import { startTransition, StrictMode } from 'react';
import type { Root } from 'react-dom/client';
import { meQueryOptions } from '../features/auth/api/get-me';
import { queryClient } from '../lib/query-client';
import { AppProvider } from './provider';
import { AppRouter } from './router';

export function startApp(root: Root) {
  // Every page's loader asks who is signed in: ask now, before the router has matched a page.
  void queryClient.prefetchQuery(meQueryOptions());
  // The first render as a transition: React then renders in slices and lets the browser in
  // between, rather than in one long task that a tap on a slow phone would have to wait out.
  startTransition(() => {
    root.render(
      <StrictMode>
        <AppProvider>
          <AppRouter />
        </AppProvider>
      </StrictMode>,
    );
  });
}
