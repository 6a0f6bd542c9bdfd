// The `dutyCycle` section of the input side: the cycle's label, and of its samples (a half hour at 10 ms
// is 180 000 of them, never drawn as rows) a summary and a sparkline of speed and torque against time; the columns come
// from the command line's import-duty-cycle (or any tool writing the file). Problems of the columns
// (the first bad sample, named by the core) are shown below the summary.
import { useId, useMemo, useRef } from 'react';
import { Section } from '../../components/Section';
import { num } from '../../components/format';
import type { Json } from '../../state/draft';
import { editValue, getAt } from '../../state/draft';
import { useFormStore, useFormValue } from '../../state/form-store';
import { useMessages } from './Inputs';
import { Optional } from './OptionalPart';
import { dutyCycleColumns, sameColumns, sparkline, summariseDutyCycle } from './duty-cycle-summary';
import { startingDutyCycle } from './starting-values';

const W = 260;
const H = 36;

function Sparkline({ dc, column, colour, label }: { dc: Json | undefined; column: 'speed' | 'torque'; colour: string; label: string }) {
  const pts = useMemo(() => {
    const c = dutyCycleColumns(dc);
    return c ? sparkline(c.t, c[column], 130) : [];
  }, [dc, column]);
  if (pts.length < 2) return null;
  const d = pts.map(([x, y], i) => `${i ? 'L' : 'M'}${(x * W).toFixed(1)},${(H - 2 - y * (H - 4)).toFixed(1)}`).join('');
  return (
    <div style={{ display: 'flex', alignItems: 'center', gap: 6, fontSize: 11, color: 'var(--muted)' }}>
      <svg width={W} height={H} viewBox={`0 0 ${W} ${H}`} role="img" aria-label={label} data-testid={`duty-spark-${column}`} style={{ background: 'var(--bg)', border: '1px solid var(--line)', borderRadius: 3 }}>
        <path d={d} fill="none" stroke={colour} strokeWidth={1.2} />
      </svg>
      <span>{label}</span>
    </div>
  );
}

const range = (a: number, b: number, unit: string): string => (num(a) === num(b) ? `${num(a)} ${unit}` : `${num(a)} to ${num(b)} ${unit}`);

/** The cycle as last summarised while its columns stay equal (an edit elsewhere copies the tree, not the cycle). */
function useStableCycle(dc: Json | undefined): Json | undefined {
  const last = useRef(dc);
  if (last.current !== dc && !sameColumns(last.current, dc)) last.current = dc;
  return last.current;
}

function Summary() {
  const dc = useStableCycle(useFormValue((d) => getAt(d.tree, 'dutyCycle')));
  const s = useMemo(() => summariseDutyCycle(dc), [dc]);
  // the columns' problems, each with the sample it names (the label's stand beside its field)
  const joined = useFormValue((_, issues) =>
    Object.entries(issues)
      .filter(([k]) => (k === 'dutyCycle' || k.startsWith('dutyCycle.')) && k !== 'dutyCycle.label')
      .map(([k, m]) => `${k.replace(/\.(\d+)(?=\.|$)/g, '[$1]')} ${m}`)
      .join('\n'),
  );
  const shown = joined === '' ? [] : joined.split('\n');
  return (
    <div data-testid="duty-summary">
      {s ? (
        <table className="taken" style={{ fontSize: 12, margin: '4px 0' }}>
          <tbody>
            <tr><td>samples</td><td data-testid="duty-samples">{s.samples.toLocaleString('en-US')}</td></tr>
            <tr><td>duration</td><td data-testid="duty-duration">{num(s.duration_s)} s{s.duration_s >= 120 ? ` (${num(s.duration_s / 60)} min)` : ''}</td></tr>
            <tr><td>time step</td><td>{range(s.stepMin_s, s.stepMax_s, 's')}</td></tr>
            <tr><td>speed</td><td data-testid="duty-speed">{range(s.speedMin_rpm, s.speedMax_rpm, 'rpm')}</td></tr>
            <tr><td>torque</td><td data-testid="duty-torque">{range(s.torqueMin_Nm, s.torqueMax_Nm, 'N·m')}</td></tr>
            <tr><td>RMS torque</td><td data-testid="duty-rms">{num(s.torqueRms_Nm)} N·m</td></tr>
          </tbody>
        </table>
      ) : (
        <div className="hint" style={{ fontSize: 12 }}>The cycle's columns cannot be read (see below).</div>
      )}
      <Sparkline dc={dc} column="speed" colour="var(--accent, #2a6fdb)" label="speed" />
      <Sparkline dc={dc} column="torque" colour="var(--warn, #c77700)" label="torque" />
      {shown.map((m) => (
        <div key={m} className="msg" role="alert" data-msg-for="dutyCycle" style={{ color: 'var(--bad)', fontSize: 12, fontWeight: 600 }}>
          {m}
        </div>
      ))}
    </div>
  );
}

function LabelField() {
  const fid = useId();
  const store = useFormStore();
  const v = useFormValue((d) => {
    const x = getAt(d.tree, 'dutyCycle.label');
    return typeof x === 'string' ? x : '';
  });
  const msgs = useMessages('dutyCycle.label');
  return (
    <div className={'field' + (msgs.length ? ' invalid' : '')}>
      <label className="label" htmlFor={fid}>Label</label>
      <span className="control">
        <input
          id={fid}
          type="text"
          spellCheck={false}
          data-path="dutyCycle.label"
          value={v}
          placeholder="none"
          onChange={(e) => {
            const t = e.target.value;
            store.update((d) => editValue(d, 'dutyCycle.label', t === '' ? undefined : t));
          }}
        />
      </span>
      {msgs.map((m) => (
        <span key={m} className="msg" role="alert" data-msg-for="dutyCycle.label">{m}</span>
      ))}
    </div>
  );
}

export function DutyCycleSection() {
  return (
    <Section title="Duty cycle" testId="sec-duty-cycle">
      <Optional path="dutyCycle" label="Duty cycle" blank={startingDutyCycle} note="samples of time, speed and torque, linear in between">
        <LabelField />
        <Summary />
        <div className="hint" style={{ fontSize: 12, marginTop: 4 }}>
          The samples are not edited here: import a CSV with the command line's import-duty-cycle.
        </div>
      </Optional>
    </Section>
  );
}
