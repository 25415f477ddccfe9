// Browser entry: self-hosted font, global styles, providers and the router.
import '@fontsource-variable/inter';
import './styles/app.css';
import { startTransition, StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { z } from 'zod';
import { AppProvider } from './app/provider';
import { AppRouter } from './app/router';
import { meQueryOptions } from './features/auth/api/get-me';
import { queryClient } from './lib/query-client';

// zod probes for eval support once at start-up; the CSP forbids eval, so tell zod not to try.
z.config({ jitless: true });

// Every page's loader asks who is signed in: ask now, while the page's own code is still loading,
// rather than one round trip after it.
void queryClient.prefetchQuery(meQueryOptions());

// The service worker (vite-plugin-pwa's build output) keeps the app and the grower's own data for
// opening without signal; registered at the load event so it never competes with the first page.
if (import.meta.env.PROD && 'serviceWorker' in navigator) {
  window.addEventListener('load', () => {
    navigator.serviceWorker.register('/sw.js', { scope: '/' }).catch(() => {
      // No worker (a private window, storage off): the app works online as before.
    });
  });
}

const container = document.getElementById('root');
if (!container) throw new Error('Sheaf needs an element with id "root" in index.html');

// The first render as a transition: React then renders in slices and lets the browser in between,
// rather than in one long task that a tap on a slow phone would have to wait out.
const root = createRoot(container);
startTransition(() => {
  root.render(
    <StrictMode>
      <AppProvider>
        <AppRouter />
      </AppProvider>
    </StrictMode>,
  );
});
