// A value that follows its source one painted frame later.
import { useEffect, useState } from 'react';

/**
 * `value`, held back until the next frame has been painted: what depends on it (secondary plots,
 * the input side's derived lines, the sizing verdicts) re-renders after the main plot is on screen.
 */
export function useAfterPaint<T>(value: T): T {
  const [lagged, setLagged] = useState(value);
  useEffect(() => {
    if (lagged === value) return;
    let timer: ReturnType<typeof setTimeout> | null = null;
    const frame = requestAnimationFrame(() => (timer = setTimeout(() => setLagged(value), 0)));
    return () => {
      cancelAnimationFrame(frame);
      if (timer !== null) clearTimeout(timer);
    };
  }, [value, lagged]);
  return lagged;
}
