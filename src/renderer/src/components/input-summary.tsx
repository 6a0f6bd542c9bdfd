// Inputs shown read-only on a view, each a link to the one place it is edited (the side panel).
import type { Json } from '../state/draft';
import { getAt } from '../state/draft';
import { useFormValue } from '../state/form-store';
import { jumpToField } from './jump-to-field';
import { num } from './format';

export interface SummaryItem {
  path: string;
  label: string;
  unit?: string;
  /** shown when the file leaves the input out */
  fallback?: string;
}

const show = (v: Json | undefined): string | null => {
  if (v === undefined || v === null) return null;
  if (typeof v === 'number') return num(v);
  if (typeof v === 'boolean') return v ? 'on' : 'off';
  if (typeof v === 'string') return v;
  return null;
};

function Item({ it }: { it: SummaryItem }) {
  const v = useFormValue((d) => show(getAt(d.tree, it.path)));
  return (
    <>
      <dt>
        <button className="link" data-jump={it.path} title="Edit in the side panel" onClick={() => jumpToField(it.path)}>
          {it.label}
        </button>
      </dt>
      <dd data-summary={it.path}>{v === null ? (it.fallback ?? '–') : `${v}${it.unit ? ` ${it.unit}` : ''}`}</dd>
    </>
  );
}

/** Steps of a list as "t s: value unit" pairs, each list a link to its rows. */
function Steps({ path, label, key2, unit }: { path: string; label: string; key2: string; unit: string }) {
  const text = useFormValue((d) => {
    const rows = getAt(d.tree, path);
    if (!Array.isArray(rows) || rows.length === 0) return null;
    return rows
      .map((r) => {
        const t = show(getAt(r, 't_s'));
        const v = show(getAt(r, key2));
        return `${t ?? '?'} s: ${v ?? '?'} ${unit}`;
      })
      .join('; ');
  });
  return (
    <>
      <dt>
        <button className="link" data-jump={path} title="Edit in the side panel" onClick={() => jumpToField(path)}>
          {label}
        </button>
      </dt>
      <dd data-summary={path}>{text ?? 'none'}</dd>
    </>
  );
}

export function InputSummary({ items, testId, note }: { items: SummaryItem[]; testId?: string; note?: string }) {
  return (
    <div className="readonly-summary" data-testid={testId}>
      <dl>
        {items.map((it) => (
          <Item key={it.path} it={it} />
        ))}
      </dl>
      {note && <div className="hint">{note}</div>}
    </div>
  );
}

export const CONTROL_SUMMARY: SummaryItem[] = [
  { path: 'control.mode', label: 'Mode', fallback: 'speed (default)' },
  { path: 'control.fCtrl_Hz', label: 'Control rate', unit: 'Hz', fallback: '10000 Hz (default)' },
  { path: 'control.delaySamples', label: 'Delay', unit: 'period(s)', fallback: '1 period (default)' },
  { path: 'control.currentBandwidth_Hz', label: 'Current bandwidth', unit: 'Hz', fallback: 'fCtrl/20 (default) or gains' },
  { path: 'control.speedBandwidth_Hz', label: 'Speed bandwidth', unit: 'Hz', fallback: '– (rule or gains)' },
  { path: 'control.speedTuning.method', label: 'Speed tuning', fallback: 'from bandwidth (default)' },
  { path: 'control.speedTuning.a', label: 'Spacing a', fallback: '–' },
  { path: 'control.speedLoopDivider', label: 'Speed loop every', unit: 'period(s)', fallback: '1 period (default)' },
  { path: 'control.antiWindup', label: 'Anti-windup', fallback: 'clamping (default)' },
  { path: 'control.speedRamp_rpm_per_s', label: 'Speed ramp', unit: 'rpm/s', fallback: 'none' },
];

export function ScenarioSummary({ testId }: { testId?: string }) {
  return (
    <div className="readonly-summary" data-testid={testId}>
      <dl>
        <Item it={{ path: 'scenario.duration_s', label: 'Duration', unit: 's' }} />
        <Item it={{ path: 'scenario.initialSpeed_rpm', label: 'Initial speed', unit: 'rpm', fallback: '0 rpm (default)' }} />
        <Item it={{ path: 'scenario.loadInertia', label: 'Load inertia', unit: 'kg·m²', fallback: '0 (default)' }} />
        <Steps path="scenario.speedSteps" label="Speed steps" key2="speed_rpm" unit="rpm" />
        <Steps path="scenario.loadSteps" label="Load steps" key2="torque_Nm" unit="N·m" />
        <Steps path="scenario.torqueSteps" label="Torque steps" key2="torque_Nm" unit="N·m" />
      </dl>
    </div>
  );
}
