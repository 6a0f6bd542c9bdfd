// The input side: motor (model or datasheet terms), inverter, temperatures, control, scenario,
// requirement points. Every field carries its unit; currents show peak and rms; messages come from
// the project schema, by path, beside the field; typed text stays in the field while invalid.
import { memo, useId, type ReactNode } from 'react';
import type { Json, Path } from '../../state/draft';
import { editNumber, editSubtree, editValue, getAt, textOf } from '../../state/draft';
import { num } from '../../components/format';
import { SQRT2 } from '../../../../core/base/units';
import type { Interpretation } from '../../../../core/machine/nameplate';
import { KEYS } from '../../../../core/project/schema';

import { useFormStore, useFormValue } from '../../state/form-store';
import { FieldNotes } from '../../components/field-notes';

/** Messages of one field as one string (stable for useSyncExternalStore), split for display. */
export const useMessages = (path: Path, exact = true): string[] => {
  const joined = useFormValue((_, issues) => messagesFor(issues, path, exact).join('\n'));
  return joined === '' ? [] : joined.split('\n');
};


/** The unit of a schema key as a field shows it (KEYS' spelling: A is a peak current, ohm is Ω). */
export function unitOf(path: Path): string {
  const u = KEYS[path.replace(/\.\d+\./g, '[].')]?.unit ?? '';
  if (u === 'A') return 'A peak';
  if (u === 'ohm') return 'Ω';
  return u === '' ? '–' : u;
}

/** What the schema says of a key (a field's tooltip), if it says anything. */
export const keyDoc = (path: Path): string | undefined => KEYS[path.replace(/\.\d+\./g, '[].')]?.doc;

export type Hint = (v: number) => string;
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

interface NumFieldProps {
  path: Path;
  label: string;
  unit: string;
  optional?: boolean;
  hint?: Hint;
  placeholder?: string;
}

// Fields re-render from the form store; their props are plain text, and a hint function is the
// same when its source is (inline hints are recreated on every render of the section).
const sameField = (a: Record<string, unknown>, b: Record<string, unknown>): boolean =>
  Object.keys({ ...a, ...b }).every((k) =>
    typeof a[k] === 'function' && typeof b[k] === 'function' ? String(a[k]) === String(b[k]) : a[k] === b[k],
  );

export const NumField = memo(function NumField(props: NumFieldProps) {
  const fid = useId();
  const store = useFormStore();
  const update = store.update.bind(store);
  const text = useFormValue((d) => textOf(d, props.path));
  const msgs = useMessages(props.path);
  const v = Number(text);
  const hint = props.hint && text.trim() !== '' && Number.isFinite(v) ? props.hint(v) : null;
  return (
    <div className={'field' + (msgs.length ? ' invalid' : '')}>
      <label className="label" htmlFor={fid} title={keyDoc(props.path)}>{props.label}</label>
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
      <FieldNotes path={props.path} />
    </div>
  );
}, sameField);

export const SelectField = memo(function SelectField(props: { path: Path; label: string; options: Array<[string, string]>; optional?: boolean; unit?: string }) {
  const fid = useId();
  const store = useFormStore();
  const update = store.update.bind(store);
  const v = useFormValue((d) => {
    const x = getAt(d.tree, props.path);
    return x === undefined || x === null ? undefined : String(x);
  });
  const msgs = useMessages(props.path);
  return (
    <div className={'field' + (msgs.length ? ' invalid' : '')}>
      <label className="label" htmlFor={fid}>{props.label}</label>
      <span className="control">
        <select
          id={fid}
          data-path={props.path}
          value={v ?? ''}
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
      <FieldNotes path={props.path} />
    </div>
  );
}, (a, b) => a.path === b.path && a.label === b.label && a.optional === b.optional && a.unit === b.unit && a.options.length === b.options.length);

export function BoolField(props: { path: Path; label: string }) {
  const fid = useId();
  const store = useFormStore();
  const update = store.update.bind(store);
  const v = useFormValue((d) => getAt(d.tree, props.path) === true);
  const msgs = useMessages(props.path);
  return (
    <div className="field">
      <label className="label" htmlFor={fid}>{props.label}</label>
      <span className="control">
        <input
          id={fid}
          type="checkbox"
          data-path={props.path}
          checked={v}
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

export interface RowColumn {
  key: string;
  label: string;
  kind?: 'number' | 'text' | 'select';
  /** for kind 'select': [value, label]; the first is what an absent key means */
  options?: Array<[string, string]>;
}

/** An editable list of rows (requirement points, steps). */
export function Rows(props: { path: Path; columns: RowColumn[]; blank: Record<string, Json>; addLabel: string; marks?: Array<ReactNode> }) {
  const store = useFormStore();
  const n = useFormValue((d) => {
    const rows = getAt(d.tree, props.path);
    return Array.isArray(rows) ? rows.length : 0;
  });
  const msgs = useMessages(props.path);
  const rows = (): Json[] => {
    const r = getAt(store.getDraft().tree, props.path);
    return Array.isArray(r) ? r : [];
  };
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
          {Array.from({ length: n }, (_, i) => (
            <tr key={i}>
              {props.columns.map((c) =>
                c.kind === 'select' ? (
                  <RowSelect key={c.key} path={`${props.path}.${i}.${c.key}`} label={`${c.label}, row ${i + 1}`} options={c.options ?? []} />
                ) : (
                  <RowCell key={c.key} path={`${props.path}.${i}.${c.key}`} label={`${c.label}, row ${i + 1}`} text={c.kind === 'text'} />
                ),
              )}
              {props.marks && <td>{props.marks[i]}</td>}
              <td>
                <button
                  className="btn small"
                  title="Remove this row"
                  onClick={() => store.update((d) => editSubtree(d, props.path, rows().filter((__, j) => j !== i)))}
                >
                  ×
                </button>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      {msgs.map((m) => (
        <div key={m} className="msg" role="alert">{m}</div>
      ))}
      <button className="btn small" onClick={() => store.update((d) => editSubtree(d, props.path, [...rows(), props.blank]))}>
        + {props.addLabel}
      </button>
    </div>
  );
}

/** A choice in a row; an absent key shows as the first option (its default). */
function RowSelect({ path, label, options }: { path: Path; label: string; options: Array<[string, string]> }) {
  const store = useFormStore();
  const v = useFormValue((d) => {
    const x = getAt(d.tree, path);
    return x === undefined || x === null ? '' : String(x);
  });
  const msgs = useMessages(path);
  return (
    <td className={msgs.length ? 'invalid' : ''}>
      <select
        data-path={path}
        aria-label={label}
        value={v || (options[0]?.[0] ?? '')}
        onChange={(e) => {
          performance.mark('tw-edit');
          performance.mark('tw-edit-v');
          const t = e.target.value;
          store.update((d) => editValue(d, path, t));
        }}
      >
        {options.map(([value, text]) => (
          <option key={value} value={value}>{text}</option>
        ))}
      </select>
      {msgs.map((m) => (
        <div key={m} className="msg" role="alert" data-msg-for={path}>{m}</div>
      ))}
    </td>
  );
}

export function RowCell({ path, label, text }: { path: Path; label: string; text: boolean }) {
  const store = useFormStore();
  const value = useFormValue((d) => textOf(d, path));
  const msgs = useMessages(path);
  return (
    <td className={msgs.length ? 'invalid' : ''}>
      <input
        type="text"
        data-path={path}
        aria-label={label}
        spellCheck={false}
        value={value}
        onChange={(e) => {
          performance.mark('tw-edit');
          performance.mark('tw-edit-v');
          const t = e.target.value;
          store.update((d) => (text ? editValue(d, path, t) : editNumber(d, path, t, false)));
        }}
      />
      {msgs.map((m) => (
        <div key={m} className="msg" role="alert" data-msg-for={path}>{m}</div>
      ))}
    </td>
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
