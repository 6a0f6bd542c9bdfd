// The tuning view's card of current-loop gains against current (along MTPA): the table and a small
// plot of Kp per axis for a flux-map project, one line for constant inductances.
import { memo, useMemo } from 'react';
import type { ResolvedProject } from '../../../../core/project/project';
import { CURVE, Plot, readTheme } from '../../components/Plot';
import { num } from '../../components/format';
import { gainScheduleFigure, gainScheduleView } from './gain-schedule-data';

export const GainScheduleCard = memo(function GainScheduleCard({ project, theme }: { project: ResolvedProject; theme: 'light' | 'dark' }) {
  const view = useMemo(() => gainScheduleView(project), [project]);
  const fig = useMemo(() => (view.kind === 'schedule' ? gainScheduleFigure(view.schedule, readTheme(), CURVE[theme]) : null), [view, theme]);
  if (view.kind === 'constant') {
    return (
      <div className="hint" style={{ fontSize: 12, marginTop: 6 }} data-testid="gain-schedule-constant">
        {view.line}
      </div>
    );
  }
  return (
    <div className="card" data-testid="gain-schedule">
      <h4>Current-loop gains against current (along MTPA)</h4>
      {view.kind === 'error' ? (
        <div className="finding danger">{view.message}</div>
      ) : (
        <>
          <div className="hint" style={{ fontSize: 12, marginBottom: 6 }}>{view.caption}</div>
          <div className="table-scroll">
          <table className="data compact" data-testid="gain-schedule-table">
            <thead>
              <tr>
                {view.headers.map((h) => (
                  <th key={h} className="num">{h}</th>
                ))}
              </tr>
            </thead>
            <tbody>
              {view.cells.map((row, i) => (
                <tr key={i}>
                  {row.map((x, j) => (
                    <td key={view.keys[j]} className="num" data-cell={`${i}:${view.keys[j]}`}>{num(x).replace('-', '−')}</td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
          </div>
          {fig && <Plot data={fig.data} layout={fig.layout} height={260} testId="gain-schedule-plot" />}
        </>
      )}
    </div>
  );
});
