// The tuning view's card that exports the firmware's current-reference table as a C header
// (current-table-data.ts): the grid, the corners, the control rule, and the stated bound once made.
import { memo, useState } from 'react';
import type { ResolvedProject } from '../../../../core/project/project';
import type { CurrentTableCorners } from '../../../../core/reports/current-table-export';
import { isoDate } from '../../../../core/reports/figure-conditions';
import { useExporter } from '../../state/exporter';
import { CURRENT_TABLE_DEFAULTS, CURRENT_TABLE_POINTS_MAX, currentTableExport, currentTableFileName } from './current-table-data';

const whole = (s: string): number | null => {
  const n = Number(s);
  return Number.isInteger(n) && n >= 2 && n <= CURRENT_TABLE_POINTS_MAX ? n : null;
};

export const CurrentTableCard = memo(function CurrentTableCard({ project }: { project: ResolvedProject }) {
  const exporter = useExporter();
  const [speedText, setSpeedText] = useState(String(CURRENT_TABLE_DEFAULTS.speedPoints));
  const [torqueText, setTorqueText] = useState(String(CURRENT_TABLE_DEFAULTS.torquePoints));
  const [corners, setCorners] = useState<CurrentTableCorners>(CURRENT_TABLE_DEFAULTS.corners);
  const [minLoss, setMinLoss] = useState(false);
  const [summary, setSummary] = useState<string | null>(null);
  const sp = whole(speedText), tp = whole(torqueText);
  const hasLosses = Object.keys(project.losses).length > 0;
  const run = () => {
    if (sp === null || tp === null) return;
    void exporter.exportAndTell('current-table-header', () => {
      const r = currentTableExport(project, { speedPoints: sp, torquePoints: tp, corners, minLoss: minLoss && hasLosses }, isoDate(new Date()));
      setSummary(r.summary);
      return r.header;
    }, currentTableFileName(project));
  };
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
        <button data-testid="ct-export" disabled={sp === null || tp === null} onClick={run}>Export current table</button>
      </div>
      {summary && <div className="hint" style={{ fontSize: 12, marginTop: 6 }} data-testid="ct-summary">{summary}</div>}
    </div>
  );
});
