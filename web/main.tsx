// Browser entry: global styles, the service worker, then the app in stages.
import './styles/app.css';
import { createRoot } from 'react-dom/client';
import { loadWebFont } from './lib/web-font';

// The web font: with the app installed (a service worker answers from the phone) at once; on a
// first visit once the first page has painted (web/lib/web-font.ts, web/app/routes/root.tsx).
if (navigator.serviceWorker?.controller) void loadWebFont();

// The service worker (vite-plugin-pwa's build output) keeps the app and the grower's own data for
// opening without signal; registered at the load event so it never competes with the first page.
if (import.meta.env.PROD && 'serviceWorker' in navigator) {
  window.addEventListener('load', () => {
    navigator.serviceWorker.register('/sw.js', { scope: '/' }).catch(() => {
      // No worker (a private window, storage off): the app works online as before.
    });
  });
}

const root = document.getElementById('root');
if (!root) throw new Error('Sheaf needs an element with id "root" in index.html');

/** Resolves in a later task of the browser's, so it can paint and take a tap in between. */
const nextTask = () => new Promise<void>((resolve) => setTimeout(resolve, 0));

// The app starts in two steps, each in a task of its own: React with this file, then the app
// (router, queries, schemas). On a slow phone one task for all of it held the page for a third
// of a second. index.html preloads the app's file too (vite.config.ts), so the split costs no
// round trip.
async function start(container: HTMLElement) {
  await nextTask();
  const { startApp } = await import('./app/start');
  await nextTask();
  startApp(createRoot(container));
}

// The app's file can fail to arrive when the signal drops mid-load (with the app installed it
// comes from the phone). Say so in place of the loading view rather than spin for ever.
start(root).catch(() => {
  const note = document.createElement('p');
  note.setAttribute('role', 'alert');
  note.className = 'p-6 text-ink';
  note.textContent =
    'Sheaf could not load all of its files, probably because the signal dropped. Reload the page when there is signal.';
  root.replaceChildren(note);
});
