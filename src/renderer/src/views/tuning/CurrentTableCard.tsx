// The tuning view's card that exports the firmware's current-reference table as a C header
// (../../workers/current-table-job.ts): the grid, the corners, the control rule, and the stated bound once made.
// The table is built in a Web Worker (workers/current-table-worker.ts; a flux map takes seconds):
// progress as the share of speed rows solved, cancel terminates the worker, the window stays live.
import { memo, useMemo, useState } from 'react';
import type { ResolvedProject } from '../../../../core/project/project';
import type { CurrentTableCorners } from '../../../../core/reports/current-table-export';
import { isoDate } from '../../../../core/reports/figure-conditions';
import { useExporter } from '../../state/exporter';
import { useWorkerRun } from '../../state/worker-run';
import type { CurrentTableDone, CurrentTableRequest } from '../../workers/current-table-protocol';
import { CURRENT_TABLE_DEFAULTS, CURRENT_TABLE_POINTS_MAX } from '../../workers/current-table-job';

const whole = (s: string): number | null => {
  const n = Number(s);
  return Number.isInteger(n) && n >= 2 && n <= CURRENT_TABLE_POINTS_MAX ? n : null;
};

export const CurrentTableCard = memo(function CurrentTableCard({ project }: { project: ResolvedProject }) {
  const exporter = useExporter();
  const projectText = useMemo(() => JSON.stringify(project.file), [project]);
  const [speedText, setSpeedText] = useState(String(CURRENT_TABLE_DEFAULTS.speedPoints));
  const [torqueText, setTorqueText] = useState(String(CURRENT_TABLE_DEFAULTS.torquePoints));
  const [corners, setCorners] = useState<CurrentTableCorners>(CURRENT_TABLE_DEFAULTS.corners);
  const [minLoss, setMinLoss] = useState(false);
  const [summary, setSummary] = useState<string | null>(null);
  const sp = whole(speedText), tp = whole(torqueText);
  const hasLosses = Object.keys(project.losses).length > 0;
  const build = useWorkerRun<CurrentTableRequest, CurrentTableDone>('current table', (m) => {
    setSummary(m.summary);
    void exporter.exportAndTell('current-table-header', () => m.header, m.fileName);
  });
  const run = () => {
    if (sp === null || tp === null) return;
    const w = new Worker(new URL('../../workers/current-table-worker.ts', import.meta.url), { type: 'module' });
    build.start(w, { kind: 'current-table', projectText, choice: { speedPoints: sp, torquePoints: tp, corners, minLoss: minLoss && hasLosses }, date: isoDate(new Date()) });
  };
  const r = build.run;
  return (
    <div className="card" data-testid="current-table">
      <h4>Current-reference table for firmware</h4>
      <div className="hint" style={{ fontSize: 12, marginBottom: 6 }}>
        i_d and i_q against electromagnetic torque and x = electrical speed / effective bus (one table for a varying bus), with the largest torque per row to clamp the demand; a C header of float arrays.
      </div>
      <div className="toolbar">
        <label>speed rows <input data-testid="ct-speed" size={4} value={speedText} onChange={(e) => setSpeedText(e.target.value)} aria-invalid={sp === null} /></label>{' '}
        <label>torque nodes 0..peak <input data-testid="ct-torque" size={4} value={torqueText} onChange={(e) => setTorqueText(e.target.value)} aria-invalid={tp === null} /></label>{' '}
        <label>corners{' '}
          <select data-testid="ct-corners" value={corners} onChange={(e) => setCorners(e.target.value as CurrentTableCorners)}>
            <option value="both">hot and cold</option>
            <option value="hot">hot</option>
            <option value="cold">cold</option>
          </select>
        </label>{' '}
        {hasLosses && <label><input type="checkbox" data-testid="ct-min-loss" checked={minLoss} onChange={(e) => setMinLoss(e.target.checked)} /> loss-minimising</label>}{' '}
        <button className="btn" data-testid="ct-export" disabled={sp === null || tp === null || r.kind === 'running'} onClick={run}>Export current table</button>{' '}
        <button className="btn danger" data-testid="ct-cancel" disabled={r.kind !== 'running'} onClick={build.cancel}>Cancel</button>
      </div>
      {r.kind === 'running' && (
        <div className="hint" style={{ fontSize: 12, marginTop: 6 }} data-testid="ct-building">
          <progress className="progress" data-testid="ct-progress" max={1} value={r.fraction} /> <span data-testid="ct-percent">{Math.round(r.fraction * 100)} %</span> of the speed rows solved, in the background; the header is exported when the table is done. Leaving the Tuning view cancels the build.
        </div>
      )}
      {r.kind === 'cancelled' && <div className="hint" style={{ fontSize: 12, marginTop: 6 }} data-testid="ct-cancelled">Cancelled; nothing was exported.</div>}
      {r.kind === 'error' && <div className="finding danger" data-testid="ct-error">{r.message}</div>}
      {summary && <div className="hint" style={{ fontSize: 12, marginTop: 6 }} data-testid="ct-summary">{summary}</div>}
    </div>
  );
});
