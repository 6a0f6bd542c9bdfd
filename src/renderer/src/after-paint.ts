// A value that follows its source one painted frame later.
import { useEffect, useState } from 'react';

/**
 * `value`, held back until the next frame has been painted: what depends on it (secondary plots,
 * the input side's derived lines, the sizing verdicts) re-renders after the main plot is on screen.
 * With `settle_ms`, it is held back further until the source has kept its value that long after the
 * paint: during a burst of keystrokes the secondary work waits for the pause instead of running
 * between the keystrokes and slowing each one's redraw.
 */
export function useAfterPaint<T>(value: T, settle_ms = 0): T {
  const [lagged, setLagged] = useState(value);
  useEffect(() => {
    if (lagged === value) return;
    let timer: ReturnType<typeof setTimeout> | null = null;
    const frame = requestAnimationFrame(() => (timer = setTimeout(() => setLagged(value), settle_ms)));
    return () => {
      cancelAnimationFrame(frame);
      if (timer !== null) clearTimeout(timer);
    };
  }, [value, lagged, settle_ms]);
  return lagged;
}
