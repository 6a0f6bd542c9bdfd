/**
 * A progress line on a terminal: `<label>: k of n (p %)` rewritten in place on standard error while
 * a long command runs, cleared at the end; nothing when standard error is not a terminal (a pipe, a
 * file, a test), so what a script reads never changes. The line is written again only when the
 * count changes and, past the first, at most once per whole percent (a study of many small steps
 * writes about a hundred lines, not one per step).
 */
export interface TerminalProgress {
  /** absent when standard error is not a terminal */
  onStep?: (done: number, total: number) => void;
  end(): void;
}

export function terminalProgress(label: string, err: { isTTY?: boolean; write(s: string): unknown } = process.stderr): TerminalProgress {
  if (err.isTTY !== true) return { end: () => undefined };
  let shown = false, lastDone = -1, lastPct = -1;
  return {
    onStep: (done, total) => {
      const pct = Math.floor((100 * done) / total);
      if (done === lastDone || (shown && pct === lastPct && done < total && total > 100)) return;
      shown = true;
      lastDone = done;
      lastPct = pct;
      err.write(`\r${label}: ${done} of ${total} (${pct} %)\u001b[K`);
    },
    end: () => {
      if (shown) err.write('\r\u001b[K');
    },
  };
}
