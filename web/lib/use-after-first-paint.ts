// Parts of a page below its first screen on a phone, built in a render of their own just after the
// first paint, so a slow phone shows the top of the page without first building all of it.
import { startTransition, useEffect, useState } from 'react';

/** False for the first render, true from a moment after it. */
export function useAfterFirstPaint(): boolean {
  const [shown, setShown] = useState(false);
  useEffect(() => {
    // A timer rather than the effect itself, so the browser paints the first render in between.
    const timer = setTimeout(() => startTransition(() => setShown(true)), 0);
    return () => clearTimeout(timer);
  }, []);
  return shown;
}
