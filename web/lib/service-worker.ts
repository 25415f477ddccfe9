// Registers the offline service worker (built by vite-plugin-pwa, see vite.config.ts) once the
// first page has shown and the browser has a quiet moment: installing it downloads the whole app
// shell (about 1 MB), which must not compete with the page's own code and data on a slow phone
// connection. Later visits are served by the worker and need no waiting.

/** Resolves after the window's load event. */
function loaded(): Promise<void> {
  if (document.readyState === 'complete') return Promise.resolve();
  return new Promise((resolve) => window.addEventListener('load', () => resolve(), { once: true }));
}

/** Resolves when the main thread is idle (or after `timeout` ms at the latest). */
function idle(timeout: number): Promise<void> {
  return new Promise((resolve) => {
    if ('requestIdleCallback' in window) window.requestIdleCallback(() => resolve(), { timeout });
    else setTimeout(resolve, 200);
  });
}

export async function registerServiceWorkerAfter(firstPageShown: Promise<void>): Promise<void> {
  if (!('serviceWorker' in navigator)) return;
  await Promise.all([firstPageShown, loaded()]);
  await idle(3000);
  try {
    await navigator.serviceWorker.register('/sw.js', { scope: '/' });
  } catch {
    // Private browsing or a blocked worker: the app still works, only not without signal.
  }
}
