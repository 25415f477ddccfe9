// Browser entry: global styles, the service worker, then the app in stages.
import './styles/app.css';
import { createRoot } from 'react-dom/client';
import { loadWebFont } from './lib/web-font';

// The web font once the app is on the phone (a service worker answers from it), at start-up; a
// first visit keeps the phone's own font (web/lib/web-font.ts). The dev server has no worker.
if (import.meta.env.DEV || navigator.serviceWorker?.controller) void loadWebFont();

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

// The app starts in steps, each in a task of its own so that none holds a slow phone for long:
// React with this file, then zod (the schemas' library), then React Router, then the app itself
// (queries, schemas, the shell and its router). Each library is a file of its own (vite.config.ts)
// because a file's code runs in one go: in one task, zod, the router and the app held the page for
// 200–350 ms at a phone's speed. index.html preloads all of them, so the steps cost no round trips.
async function start(container: HTMLElement) {
  await nextTask();
  await import('./lib/zod-setup');
  await nextTask();
  await import('./app/router-library');
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
