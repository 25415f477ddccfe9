// Sheaf's typeface, Inter, shipped with the app (@fontsource-variable/inter). Its @font-face rules
// are a style sheet of their own, added once the first page has painted: on a first visit over a
// slow link the font (49 kB) would otherwise share the link with the app's code and hold that
// page back. Until it arrives, text shows in the phone's own sans-serif (the font stack in
// tailwind.config.ts). With the app installed the font is on the phone and is added at start-up
// (web/main.tsx), so the text does not change face after it has shown.
import { useEffect } from 'react';

let requested: Promise<unknown> | null = null;

/** Adds the typeface's @font-face rules; the browser then fetches the faces the text uses. */
export function loadWebFont(): Promise<unknown> {
  requested ??= import('@fontsource-variable/inter').catch(() => {
    // No signal and the font not on the phone yet: the phone's font stays; the next page load
    // tries again.
    requested = null;
  });
  return requested;
}

/**
 * Runs `task` once the browser's next frame is on the screen and the page's own work after it is
 * done (or after two seconds at most); returns a function that cancels it.
 */
function afterPaintWhenIdle(task: () => void): () => void {
  let frame = 0;
  let idle: number | undefined;
  let timer: ReturnType<typeof setTimeout> | undefined;
  // A frame callback runs just before its frame is painted, the one after it once that frame is
  // on the screen. Browsers without idle callbacks (Safari) wait a moment instead.
  frame = requestAnimationFrame(() => {
    frame = requestAnimationFrame(() => {
      if ('requestIdleCallback' in window) idle = requestIdleCallback(task, { timeout: 2000 });
      else timer = setTimeout(task, 300);
    });
  });
  return () => {
    cancelAnimationFrame(frame);
    if (idle !== undefined) cancelIdleCallback(idle);
    clearTimeout(timer);
  };
}

/** Adds the web font once the calling view (the first page, or its error view) has painted. */
export function useWebFontAfterPaint(): void {
  useEffect(() => afterPaintWhenIdle(() => void loadWebFont()), []);
}
