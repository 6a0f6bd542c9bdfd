// The cautions of a project: the hazards (always with the safety caution) and the other findings,
// shown by the Envelope and the Datasheet views.
import type { Finding } from '../../../core/base/finding';
import type { Results } from '../state/compute';
import { fieldPhrase, plainMessage, severityPhrase } from '../../../core/reports/phrases';

/** Findings that must carry the safety caution wherever they are shown. */
export const isHazard = (f: Finding): boolean =>
  f.severity === 'danger' || (f.severity === 'warning' && /demagnet|uncontrolled|braking|back-emf/i.test(f.code));

export function Cautions({ results, testId, hazardsOnly, compact }: { results: Results; testId?: string; hazardsOnly?: boolean; compact?: boolean }) {
  const s = results.safety;
  const findings = [...results.project.findings, ...s.findings];
  const hazards = findings.filter(isHazard);
  return (
    <div data-testid={testId}>
      {hazards.length > 0 && !compact && (
        <div className="caution" role="alert">
          <strong>Caution.</strong> {hazards.map((h) => plainMessage(h.message)).join(' ')} {s.caution}
        </div>
      )}
      {hazards.length > 0 && compact && (
        <details className="caution compact" role="alert">
          <summary>
            <strong>Caution.</strong> {plainMessage(hazards[0]!.message).split('. ')[0]}. Follow local codes, licensed practice and IEC 61800-5-1 (details).
          </summary>
          {hazards.map((h) => plainMessage(h.message)).join(' ')} {s.caution}
        </details>
      )}
      {!hazardsOnly &&
        findings
        .filter((f) => !isHazard(f))
        .map((f, i) => (
          <div key={i} className={`finding ${f.severity}`}>
            <strong>{severityPhrase(f.severity)}</strong>{f.field ? `, ${fieldPhrase(f.field)}` : ''}: {plainMessage(f.message)}
          </div>
        ))}
    </div>
  );
}
