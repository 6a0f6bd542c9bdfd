// The Datasheet view's efficiency map: for a project with a `losses` section, the map over the
// datasheet's own grid (core datasheet-parts.ts) solved in the efficiency worker (the window stays
// responsive; a flux map takes seconds), drawn as the same SVG figure the exported datasheet and the
// CLI's `datasheet` carry (core efficiency-map-chart.ts), with the best points in words.
import { useEffect, useLayoutEffect, useMemo, useRef, useState } from 'react';
import type { DatasheetEfficiency } from '../../../../core/reports/datasheet-efficiency';
import { datasheetEfficiencySummary } from '../../../../core/reports/datasheet-efficiency';
import { datasheetEfficiencyGridOf } from '../../../../core/reports/datasheet-parts';
import { efficiencyMapChart } from '../../../../core/reports/efficiency-map-chart';
import { isoDate } from '../../../../core/reports/figure-conditions';
import type { EfficiencyGridSpec } from '../../../../core/reports/efficiency-map-grid';
import type { EfficiencyReply, EfficiencyRequest } from '../../workers/efficiency-protocol';
import { useWorkerRun } from '../../state/worker-run';
import { svgNode } from '../../components/PrintCharts';
import { num } from '../../components/format';
import type { Results } from '../../state/compute';

type Done = Omit<Extract<EfficiencyReply, { kind: 'done' }>, 'kind'>;

/**
 * The datasheet's efficiency map for the results shown: null without a `losses` section (`grid` null),
 * null too until the worker has solved the current project and grid.
 */
export function useDatasheetEfficiency(results: Results): { grid: EfficiencyGridSpec | null; efficiency: DatasheetEfficiency | null; running: boolean; fraction: number; error: string | null } {
  const grid = useMemo(() => datasheetEfficiencyGridOf(results), [results]);
  const projectText = useMemo(() => JSON.stringify(results.project.file), [results.project]);
  const key = grid === null ? '' : `${projectText}\n${JSON.stringify(grid)}`;
  const [solved, setSolved] = useState<{ key: string; efficiency: DatasheetEfficiency } | null>(null);
  const asked = useRef({ key, grid });
  asked.current = { key, grid };
  const forKey = useRef('');
  const { run, start } = useWorkerRun<EfficiencyRequest, Done>('efficiency', (m) => {
    const g = asked.current.grid;
    if (g !== null && forKey.current === asked.current.key) setSolved({ key: forKey.current, efficiency: { grid: g, map: m.map } });
  });
  // solved again when the project or the grid changes (the last request wins)
  useEffect(() => {
    if (grid === null || solved?.key === key) return;
    const h = setTimeout(() => {
      forKey.current = key;
      start(new Worker(new URL('../../workers/efficiency-worker.ts', import.meta.url), { type: 'module' }), { kind: 'map', projectText, grid });
    }, 150);
    return () => clearTimeout(h);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [key]);
  return {
    grid,
    efficiency: solved !== null && solved.key === key ? solved.efficiency : null,
    running: run.kind === 'running',
    fraction: run.kind === 'running' ? run.fraction : 0,
    error: run.kind === 'error' ? run.message : null,
  };
}

const pct = (x: number): string => `${(100 * x).toFixed(1)} %`;

/** The efficiency card: the figure (a core SVG parsed inertly), the best points, or how far the solve is. */
export function DatasheetEfficiencyCard({ results, state }: { results: Results; state: ReturnType<typeof useDatasheetEfficiency> }) {
  const box = useRef<HTMLDivElement | null>(null);
  const e = state.efficiency;
  const svg = useMemo(
    () => (e ? efficiencyMapChart({ project: results.project, efficiency: e, envelopes: results.curves.filter((q) => q.corner === e.grid.corner) }, { date: isoDate(new Date()) }) : null),
    [e, results],
  );
  useLayoutEffect(() => {
    const el = box.current;
    if (!el) return;
    const node = svg === null ? null : svgNode(svg);
    el.replaceChildren(...(node ? [node] : []));
  }, [svg]);
  if (state.grid === null) return null;
  const s = e ? datasheetEfficiencySummary(e) : null;
  const peak = (q: { efficiency: number; speed_rpm: number; torque_Nm: number } | null, what: string) =>
    q === null ? `no ${what} point inside the envelope` : `${pct(q.efficiency)} ${what} at ${Math.round(q.speed_rpm)} rpm, ${num(q.torque_Nm)} N·m`;
  return (
    <div className="card" data-testid="datasheet-efficiency">
      <h4>System efficiency, hot corner, least-current control</h4>
      {state.error && <div className="finding danger" data-testid="datasheet-efficiency-error">{state.error}</div>}
      {!e && !state.error && (
        <div className="hint" data-testid="datasheet-efficiency-running">
          Solving the efficiency map ({state.grid.points} × {state.grid.points} points)… {state.running ? `${Math.round(100 * state.fraction)} %` : ''}
        </div>
      )}
      <div className="print-charts" style={{ maxWidth: 960 }} ref={box} data-testid="datasheet-efficiency-figure" />
      {s && (
        <div className="hint" data-testid="datasheet-efficiency-peaks" data-value={s.peakSystem?.efficiency ?? ''}>
          Highest system efficiency: {peak(s.peakMotoring, 'motoring')}; {peak(s.peakGenerating, 'generating')}.
        </div>
      )}
    </div>
  );
}
