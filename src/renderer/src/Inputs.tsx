// The input side: motor (model or datasheet terms), inverter, temperatures, control, scenario,
// requirement points. Every field carries its unit; currents show peak and rms; messages come from
// the project schema, by path, beside the field; typed text stays in the field while invalid.
import { createContext, useContext, useId, type ReactNode } from 'react';
import type { Draft, Json, Path } from './draft';
import { editNumber, editSubtree, editValue, getAt, textOf } from './draft';
import { num } from './format';
import { SQRT2 } from '../../core/units';
import type { Interpretation } from '../../core/nameplate';

export interface FormApi {
  draft: Draft;
  issues: Record<Path, string>;
  update: (f: (d: Draft) => Draft) => void;
}

export const FormContext = createContext<FormApi | null>(null);
const useForm = (): FormApi => useContext(FormContext)!;


type Hint = (v: number) => string;
export const HINTS = {
  mH: ((v) => `= ${num(v * 1e3)} mH`) as Hint,
  mOhm: ((v) => `= ${num(v * 1e3)} mΩ`) as Hint,
  rmsOfPeak: ((v) => `= ${num(v / SQRT2)} A rms`) as Hint,
  peakOfRms: ((v) => `= ${num(v * SQRT2)} A peak`) as Hint,
  mWb: ((v) => `= ${num(v * 1e3)} mWb`) as Hint,
  kgcm2: ((v) => `= ${num(v * 1e4)} kg·cm²`) as Hint,
  pct: ((v) => `= ${num(v * 100)} %`) as Hint,
  perK: ((v) => `= ${num(v * 100)} %/K`) as Hint,
};

/** Messages whose path is at or below `path`. */
function messagesFor(issues: Record<Path, string>, path: Path, exact = true): string[] {
  const out: string[] = [];
  for (const [k, v] of Object.entries(issues)) if (k === path || (!exact && k.startsWith(path + '.'))) out.push(v);
  return out;
}

export function NumField(props: { path: Path; label: string; unit: string; optional?: boolean; hint?: Hint; placeholder?: string }) {
  const fid = useId();
  const { draft, issues, update } = useForm();
  const text = textOf(draft, props.path);
  const msgs = messagesFor(issues, props.path);
  const v = Number(text);
  const hint = props.hint && text.trim() !== '' && Number.isFinite(v) ? props.hint(v) : null;
  return (
    <div className={'field' + (msgs.length ? ' invalid' : '')}>
      <label className="label" htmlFor={fid}>{props.label}</label>
      <span className="control">
        <input
          id={fid}
          type="text"
          inputMode="decimal"
          spellCheck={false}
          data-path={props.path}
          value={text}
          placeholder={props.placeholder ?? (props.optional ? 'default' : '')}
          aria-invalid={msgs.length > 0}
          onChange={(e) => {
            performance.mark('tw-edit');
            performance.mark('tw-edit-v');
            const t = e.target.value;
            update((d) => editNumber(d, props.path, t, props.optional ?? false));
          }}
        />
        <span className="unit">{props.unit}</span>
      </span>
      {hint && <span className="hint">{hint}</span>}
      {msgs.map((m) => (
        <span key={m} className="msg" role="alert" data-msg-for={props.path}>{m}</span>
      ))}
    </div>
  );
}

export function SelectField(props: { path: Path; label: string; options: Array<[string, string]>; optional?: boolean; unit?: string }) {
  const fid = useId();
  const { draft, issues, update } = useForm();
  const v = getAt(draft.tree, props.path);
  const msgs = messagesFor(issues, props.path);
  return (
    <div className={'field' + (msgs.length ? ' invalid' : '')}>
      <label className="label" htmlFor={fid}>{props.label}</label>
      <span className="control">
        <select
          id={fid}
          data-path={props.path}
          value={v === undefined || v === null ? '' : String(v)}
          onChange={(e) => {
            performance.mark('tw-edit');
            performance.mark('tw-edit-v');
            const t = e.target.value;
            update((d) => editValue(d, props.path, t === '' ? undefined : t));
          }}
        >
          {props.optional && <option value="">default</option>}
          {props.options.map(([value, label]) => (
            <option key={value} value={value}>{label}</option>
          ))}
        </select>
        {props.unit !== undefined && <span className="unit">{props.unit}</span>}
      </span>
      {msgs.map((m) => (
        <span key={m} className="msg" role="alert" data-msg-for={props.path}>{m}</span>
      ))}
    </div>
  );
}

export function BoolField(props: { path: Path; label: string }) {
  const fid = useId();
  const { draft, issues, update } = useForm();
  const v = getAt(draft.tree, props.path);
  const msgs = messagesFor(issues, props.path);
  return (
    <div className="field">
      <label className="label" htmlFor={fid}>{props.label}</label>
      <span className="control">
        <input
          id={fid}
          type="checkbox"
          data-path={props.path}
          checked={v === true}
          onChange={(e) => {
            const c = e.target.checked;
            update((d) => editValue(d, props.path, c));
          }}
        />
      </span>
      {msgs.map((m) => (
        <span key={m} className="msg" role="alert">{m}</span>
      ))}
    </div>
  );
}

export function Section(props: { title: string; right?: ReactNode; children: ReactNode; testId?: string }) {
  return (
    <section className="section" data-testid={props.testId}>
      <h3>
        {props.title}
        {props.right && <span className="right">{props.right}</span>}
      </h3>
      <div className="content">{props.children}</div>
    </section>
  );
}

export interface RowColumn {
  key: string;
  label: string;
  kind?: 'number' | 'text';
}

/** An editable list of rows (requirement points, steps). */
export function Rows(props: { path: Path; columns: RowColumn[]; blank: Record<string, Json>; addLabel: string; marks?: Array<ReactNode> }) {
  const { draft, issues, update } = useForm();
  const rows = (getAt(draft.tree, props.path) as Json[] | undefined) ?? [];
  return (
    <div>
      <table className="rows" data-path={props.path}>
        <thead>
          <tr>
            {props.columns.map((c) => (
              <th key={c.key}>{c.label}</th>
            ))}
            {props.marks && <th />}
            <th />
          </tr>
        </thead>
        <tbody>
          {rows.map((_, i) => (
            <tr key={i}>
              {props.columns.map((c) => {
                const p = `${props.path}.${i}.${c.key}`;
                const msgs = messagesFor(issues, p);
                return (
                  <td key={c.key} className={msgs.length ? 'invalid' : ''}>
                    <input
                      type="text"
                      data-path={p}
                      aria-label={`${c.label}, row ${i + 1}`}
                      spellCheck={false}
                      value={textOf(draft, p)}
                      onChange={(e) => {
                        performance.mark('tw-edit');
            performance.mark('tw-edit-v');
                        const t = e.target.value;
                        update((d) => (c.kind === 'text' ? editValue(d, p, t) : editNumber(d, p, t, false)));
                      }}
                    />
                    {msgs.map((m) => (
                      <div key={m} className="msg" role="alert" data-msg-for={p}>{m}</div>
                    ))}
                  </td>
                );
              })}
              {props.marks && <td>{props.marks[i]}</td>}
              <td>
                <button
                  className="btn small"
                  title="Remove this row"
                  onClick={() => update((d) => editSubtree(d, props.path, rows.filter((__, j) => j !== i)))}
                >
                  ×
                </button>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      {messagesFor(issues, props.path).map((m) => (
        <div key={m} className="msg" role="alert">{m}</div>
      ))}
      <button className="btn small" onClick={() => update((d) => editSubtree(d, props.path, [...rows, props.blank]))}>
        + {props.addLabel}
      </button>
    </div>
  );
}

export function TakenAs({ items }: { items: Interpretation[] }) {
  if (!items.length) return null;
  return (
    <table className="taken" data-testid="taken-as">
      <thead>
        <tr>
          <th>input</th>
          <th>given</th>
          <th>taken as</th>
        </tr>
      </thead>
      <tbody>
        {items.map((it) => (
          <tr key={it.field}>
            <td>{it.field.slice(it.field.lastIndexOf('.') + 1)}</td>
            <td>{it.given}</td>
            <td>{it.takenAs}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
