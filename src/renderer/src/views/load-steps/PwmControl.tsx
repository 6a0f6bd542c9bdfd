// The inverter model of the load-step run (control.pwm), edited in the project through the form's
// draft like every input: averaged (the controller's voltage applied as the period's mean) or
// switching (each carrier period split at the legs' switching instants), with the carrier frequency,
// the dead time, the modulation and where the zoom window of full-resolution traces sits (the run's
// end, the first load step, or times given). Messages come from the project schema, by path, beside
// the field.
import { useId } from 'react';
import { editNumber, editSubtree, editValue, getAt, textOf, type Json } from '../../state/draft';
import { useFormStore, useFormValue } from '../../state/form-store';
import { num } from '../../components/format';
import { MODULATION_NAMES, suggestedWindow, WINDOW_HINTS, WINDOW_MODES, windowModeOf, type WindowMode } from './switching-figures';

// each option short enough for the narrow column
const SHORT: Record<string, string> = { sinusoidal: 'sinusoidal', svpwm: 'SVPWM (min-max)', dpwm1: 'DPWM1 (discontinuous)' };

const PWM = 'control.pwm';

function Messages({ path }: { path: string }) {
  const joined = useFormValue((_, issues) => Object.entries(issues).filter(([k]) => k === path).map(([, v]) => v).join('\n'));
  return joined === '' ? null : (
    <>
      {joined.split('\n').map((m) => (
        <span key={m} className="msg" role="alert" data-msg-for={path}>{m}</span>
      ))}
    </>
  );
}

function PwmNumber({ path, label, unit, placeholder, hint, emptyHint, testId }: { path: string; label: string; unit: string; placeholder: string; hint?: (v: number) => string; emptyHint?: string; testId: string }) {
  const fid = useId();
  const store = useFormStore();
  const text = useFormValue((d) => textOf(d, path));
  const bad = useFormValue((_, issues) => issues[path] !== undefined);
  const v = Number(text);
  return (
    <div className={'field' + (bad ? ' invalid' : '')}>
      <label className="label" htmlFor={fid}>{label}</label>
      <span className="control">
        <input id={fid} type="text" inputMode="decimal" spellCheck={false} data-path={path} data-testid={testId} value={text} placeholder={placeholder} aria-invalid={bad}
          onChange={(e) => {
            const t = e.target.value;
            store.update((d) => editNumber(d, path, t, true));
          }}
        />
        <span className="unit">{unit}</span>
      </span>
      {hint && text.trim() !== '' && Number.isFinite(v) && <span className="hint">{hint(v)}</span>}
      {emptyHint && text.trim() === '' && <span className="hint">{emptyHint}</span>}
      <Messages path={path} />
    </div>
  );
}

export function PwmControl() {
  const store = useFormStore();
  const hasControl = useFormValue((d) => getAt(d.tree, 'control') !== undefined);
  const model = useFormValue((d) => (getAt(d.tree, `${PWM}.model`) === 'switching' ? 'switching' : 'average'));
  const fCtrl = useFormValue((d) => getAt(d.tree, 'control.fCtrl_Hz'));
  const invMod = useFormValue((d) => getAt(d.tree, 'inverter.modulation'));
  const windowMode = useFormValue((d) => windowModeOf(getAt(d.tree, PWM)));
  const duration = useFormValue((d) => getAt(d.tree, 'scenario.duration_s'));
  const modulation = useFormValue((d) => {
    const m = getAt(d.tree, `${PWM}.modulation`);
    return typeof m === 'string' ? m : '';
  });
  if (!hasControl) return <div className="hint">Add a controller in the side panel to choose the inverter model.</div>;
  const setModel = (m: 'average' | 'switching') =>
    store.update((d) => {
      const cur = getAt(d.tree, PWM);
      const rest = cur && typeof cur === 'object' && !Array.isArray(cur) ? (cur as Record<string, Json>) : {};
      return editSubtree(d, PWM, { ...rest, model: m });
    });
  const fromInverter = invMod === 'sinusoidal' ? 'sinusoidal' : 'svpwm';
  const setWindow = (m: WindowMode) =>
    store.update((d) => {
      const cur = getAt(d.tree, PWM);
      const rest = { ...(cur && typeof cur === 'object' && !Array.isArray(cur) ? (cur as Record<string, Json>) : {}) };
      delete rest.windowAt;
      delete rest.window_s;
      if (m === 'load-step') rest.windowAt = 'load-step';
      if (m === 'times') rest.window_s = suggestedWindow(typeof duration === 'number' ? duration : null);
      return editSubtree(d, PWM, rest);
    });
  return (
    <div data-testid="pwm-control">
      <div className="field">
        <span className="label">inverter model</span>
        <span className="control" role="radiogroup" style={{ display: 'inline-flex', gap: 4 }}>
          {(['average', 'switching'] as const).map((m) => (
            <button key={m} className={'btn small' + (model === m ? ' primary' : '')} role="radio" aria-checked={model === m} data-testid={`pwm-${m}`} onClick={() => setModel(m)}>
              {m === 'average' ? 'averaged' : 'switching'}
            </button>
          ))}
        </span>
      </div>
      {model === 'switching' && (
        <>
          <PwmNumber path={`${PWM}.fsw_Hz`} label="carrier frequency" unit="Hz" testId="pwm-fsw" placeholder={typeof fCtrl === 'number' ? String(fCtrl) : ''} emptyHint="empty: the control rate" hint={(v) => `= ${num(v / 1e3)} kHz (the control rate must be 1 or 2 times it)`} />
          <PwmNumber path={`${PWM}.deadTime_s`} label="dead time" unit="s" testId="pwm-dead-time" placeholder="0" hint={(v) => `= ${num(v * 1e6)} µs`} />
          <div className="field">
            <label className="label" htmlFor="pwm-modulation">modulation</label>
            <span className="control">
              <select id="pwm-modulation" data-path={`${PWM}.modulation`} data-testid="pwm-modulation" value={modulation}
                onChange={(e) => {
                  const v = e.target.value;
                  store.update((d) => editValue(d, `${PWM}.modulation`, v === '' ? undefined : v));
                }}
              >
                <option value="">inverter's: {fromInverter === 'svpwm' ? 'SVPWM' : 'sinusoidal'}</option>
                {Object.keys(MODULATION_NAMES).map((k) => (
                  <option key={k} value={k} title={MODULATION_NAMES[k]}>{SHORT[k] ?? k}</option>
                ))}
              </select>
            </span>
            <Messages path={`${PWM}.modulation`} />
          </div>
          <div className="field">
            <label className="label" htmlFor="pwm-window-at">zoom window</label>
            <span className="control">
              <select id="pwm-window-at" data-path={`${PWM}.windowAt`} data-testid="pwm-window-at" value={windowMode} onChange={(e) => setWindow(e.target.value as WindowMode)}>
                {(Object.keys(WINDOW_MODES) as WindowMode[]).map((k) => (
                  <option key={k} value={k}>{WINDOW_MODES[k]}</option>
                ))}
              </select>
            </span>
            <span className="hint">{WINDOW_HINTS[windowMode]}</span>
            <Messages path={`${PWM}.windowAt`} />
          </div>
          {windowMode === 'times' && (
            <>
              <PwmNumber path={`${PWM}.window_s.from`} label="window from" unit="s" testId="pwm-window-from" placeholder="" hint={(v) => `= ${num(v * 1e3)} ms`} />
              <PwmNumber path={`${PWM}.window_s.to`} label="window to" unit="s" testId="pwm-window-to" placeholder="" hint={(v) => `= ${num(v * 1e3)} ms`} />
              <Messages path={`${PWM}.window_s`} />
            </>
          )}
          <Messages path={PWM} />
          <Messages path={`${PWM}.model`} />
        </>
      )}
    </div>
  );
}
