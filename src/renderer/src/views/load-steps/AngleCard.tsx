// Where the run's rotor angle came from, above its traces: the angle source named (encoder lines,
// resolver tracking loop, sensorless observer with its PLL), how the traces show it, the angle error's
// rms and peak, and the findings about it (the sensorless observer's validity and hand-over, the
// estimator against the speed loop). Nothing for the true angle.
import { fieldPhrase, plainMessage, severityPhrase } from '../../../../core/reports/phrases';
import { jumpToField } from '../../components/jump-to-field';
import type { SimDone } from '../../state/simulation-run';
import { angleFindings, angleSourceText, angleText } from './angle-figures';

export function AngleCard({ result, file, polePairs }: { result: SimDone; file: unknown; polePairs: number }) {
  const source = angleSourceText(file, polePairs);
  if (source === null || !result.traces.thetaError_rad) return null;
  const m = result.metrics;
  const rms = typeof m.angleErrorRms_rad === 'number' ? angleText(m.angleErrorRms_rad) : null;
  const peak = typeof m.angleErrorPeak_rad === 'number' ? angleText(m.angleErrorPeak_rad) : null;
  return (
    <div data-testid="angle-source" style={{ margin: '0 0 8px' }}>
      <div className="key">
        <span>
          <strong>Rotor angle:</strong> <span data-testid="angle-source-text">{source}</span>.
          {' '}The speed row shows the controller's estimate (dotted) over the true speed; the angle-error row the estimated less the true electrical angle, in electrical degrees.
          {rms && peak && <> Angle error {rms} rms, {peak} peak.</>}
        </span>
      </div>
      {angleFindings(result.findings).map((f, i) => (
        <div key={i} className={`finding ${f.severity}`} data-testid="angle-finding">
          <strong>{severityPhrase(f.severity)}</strong>
          {f.field && (
            <>
              {', '}
              <button className="link" onClick={() => jumpToField(f.field!)}>{fieldPhrase(f.field)}</button>
            </>
          )}
          : {plainMessage(f.message)}
        </div>
      ))}
    </div>
  );
}
