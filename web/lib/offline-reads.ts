// The service worker keeps the signed-in person's sites and strips for reading without signal;
// at sign-in and sign-out they are dropped so the next person on the phone never reads them.

/** The Cache Storage name the service worker keeps API reads in (see vite.config.ts). */
export const OFFLINE_API_CACHE = 'sheaf-api';

export async function forgetOfflineReads(): Promise<void> {
  if (typeof caches === 'undefined') return;
  try {
    await caches.delete(OFFLINE_API_CACHE);
  } catch {
    // Cache Storage blocked (private mode): there is nothing kept to forget.
  }
}
