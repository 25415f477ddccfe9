// Sheaf's typeface, Inter, shipped with the app (@fontsource-variable/inter). It is used once the
// app is on the phone: the service worker keeps the font files with the app's code, and with the
// worker in control (web/main.tsx) the @font-face rules are added at start-up, so the text never
// changes face after it has shown. A first visit keeps the phone's own sans-serif (the font stack
// in tailwind.config.ts) throughout: on a slow link the font (49 kB) would share the link with the
// page's code, and swapping it in after the page had shown cost a relayout of the whole page
// (about 30 ms on a fast machine, four times that on a slow phone) and a visible jump of the text.

let requested: Promise<unknown> | null = null;

/** Adds the typeface's @font-face rules; the browser then fetches the faces the text uses. */
export function loadWebFont(): Promise<unknown> {
  requested ??= import('@fontsource-variable/inter').catch(() => {
    // The font's style sheet did not arrive: the phone's font stays; the next start tries again.
    requested = null;
  });
  return requested;
}
