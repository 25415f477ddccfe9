// Parts of a page below its first screen on a phone, built in renders of their own just after the
// first paint, so a slow phone shows the top of the page without first building all of it.
import { startTransition, useEffect, useState } from 'react';

/**
 * 0 for the first render, then 1, 2 … up to `stages`: each step a render (and commit) of its own,
 * started once the one before has been committed, so no single task builds all the later parts.
 */
export function useStagesAfterFirstPaint(stages: number): number {
  const [shown, setShown] = useState(0);
  useEffect(() => {
    if (shown >= stages) return;
    // A timer rather than the effect itself, so the browser paints the render before in between.
    const timer = setTimeout(() => startTransition(() => setShown((step) => step + 1)), 0);
    return () => clearTimeout(timer);
  }, [shown, stages]);
  return shown;
}
