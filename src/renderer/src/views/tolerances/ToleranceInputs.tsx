// The tolerance bands and the Monte Carlo settings of the file, edited in place: one row per parameter
// this file may give a band (core allowedTolerancePaths), as ± % of the nominal value or as min/max
// in its unit, or none. Edits go through the form's draft (a band's key is a dotted parameter path,
// so the whole `tolerances` object, or `tolerances.monteCarlo`, is written as one subtree) and the
// schema's messages show beside the row they concern. A field keeps what was typed while it is invalid.
import { useEffect, useState } from 'react';
import { editSubtree, getAt, parseNumberText, type Json } from '../../state/draft';
import { useFormStore, useFormValue } from '../../state/form-store';
import { allowedTolerancePaths, type TolerancePath } from '../../../../core/project/tolerance-schema';
import { bandEnds, nominalValue, type ToleranceParameter } from '../../../../core/project/tolerance-apply';
import { KEYS } from '../../../../core/project/schema-keys';
import type { ProjectFile } from '../../../../core/project/schema';
import { num } from '../../components/format';

type Obj = { [k: string]: Json };
const asObj = (x: Json | undefined): Obj => (x !== null && typeof x === 'object' && !Array.isArray(x) ? x : {});

/** Messages at `prefix` or below it, joined (a string, stable for the store's subscription). */
const useMessagesUnder = (prefix: string, exclude?: string): string =>
  useFormValue((_, issues) => Object.entries(issues).filter(([k]) => (k === prefix || k.startsWith(prefix + '.')) && !(exclude && (k === exclude || k.startsWith(exclude + '.')))).map(([, v]) => v).join('\n'));

function Messages({ text, testId }: { text: string; testId?: string }) {
  if (text === '') return null;
  return <>{text.split('\n').map((m) => <span key={m} className="msg" role="alert" data-testid={testId}>{m}</span>)}</>;
}

/** A number typed into one key of a subtree (`tolerances` with a band's key, or `tolerances.monteCarlo`). */
function SubtreeNumber({ subtree, keys, value, testId, width = 64 }: { subtree: string; keys: string[]; value: Json | undefined; testId: string; width?: number }) {
  const store = useFormStore();
  const shown = value === undefined || value === null ? '' : String(value);
  const [text, setText] = useState(shown);
  // a change from elsewhere (a new project, another form of band) shows; what is being typed stays
  useEffect(() => setText((t) => (parseNumberText(t) === value ? t : shown)), [shown, value]);
  return (
    <input
      type="text" inputMode="decimal" spellCheck={false} style={{ width }} data-testid={testId} value={text}
      onChange={(e) => {
        const t = e.target.value;
        setText(t);
        store.update((d) => {
          const root = asObj(getAt(d.tree, subtree));
          const put = (o: Obj, ks: string[]): Obj => ({ ...o, [ks[0]!]: ks.length === 1 ? (parseNumberText(t) ?? '') : put(asObj(o[ks[0]!]), ks.slice(1)) });
          return editSubtree(d, subtree, put(root, keys));
        });
      }}
    />
  );
}

const unitOf = (path: string): string => KEYS[`tolerances.${path}`]?.unit ?? '';

function BandRow({ path, file, param, runProblem }: { path: TolerancePath; file: ProjectFile; param: ToleranceParameter | undefined; runProblem: string | undefined }) {
  const store = useFormStore();
  const band = useFormValue((d) => asObj(getAt(d.tree, 'tolerances'))[path]);
  const b = asObj(band);
  const form: 'none' | 'pct' | 'abs' = band === undefined ? 'none' : 'min' in b || 'max' in b ? 'abs' : 'pct';
  const schemaMsgs = useMessagesUnder(`tolerances.${path}`);
  // a band end the file cannot take, as the corners' run found it (core checkBandEnds), beside its row
  const own = runProblem?.startsWith(`tolerances.${path} `) ? runProblem.slice(`tolerances.${path} `.length) : '';
  const msgs = [schemaMsgs, own].filter((m) => m !== '').join('\n');
  let nominal: number | null = null;
  try {
    nominal = nominalValue(file, path);
  } catch {
    nominal = null;
  }
  const unit = unitOf(path);
  const setForm = (f: string) =>
    store.update((d) => {
      const t = { ...asObj(getAt(d.tree, 'tolerances')) };
      if (f === 'none') delete t[path];
      else if (f === 'pct') t[path] = { minus_pct: 5, plus_pct: 5 };
      else {
        // the band's present ends as min/max (rounded to 4 significant digits), else ±5 % about the nominal value
        const ends = param ?? (nominal !== null ? { ...bandEnds(nominal, { minus_pct: 5, plus_pct: 5 }) } : { min: 0, max: 0 });
        t[path] = { min: Number(ends.min.toPrecision(4)), max: Number(ends.max.toPrecision(4)) };
      }
      return editSubtree(d, 'tolerances', t);
    });
  return (
    <tr className={msgs ? 'invalid' : undefined} data-testid={`band-${path}`}>
      <td style={{ whiteSpace: 'nowrap' }} title={KEYS[`tolerances.${path}`]?.doc}>{path}</td>
      <td className="num">{nominal === null ? '–' : `${num(nominal)}${unit ? ` ${unit}` : ''}`}</td>
      <td>
        <select value={form} onChange={(e) => setForm(e.target.value)} data-testid={`band-form-${path}`}>
          <option value="none">no band</option>
          <option value="pct">− % / + %</option>
          <option value="abs">min / max</option>
        </select>
      </td>
      <td style={{ whiteSpace: 'nowrap' }}>
        {form === 'pct' && (
          <>− <SubtreeNumber subtree="tolerances" keys={[path, 'minus_pct']} value={b.minus_pct} testId={`band-minus-${path}`} /> % &nbsp;+ <SubtreeNumber subtree="tolerances" keys={[path, 'plus_pct']} value={b.plus_pct} testId={`band-plus-${path}`} /> %</>
        )}
        {form === 'abs' && (
          <><SubtreeNumber subtree="tolerances" keys={[path, 'min']} value={b.min} testId={`band-min-${path}`} width={80} /> to <SubtreeNumber subtree="tolerances" keys={[path, 'max']} value={b.max} testId={`band-max-${path}`} width={80} /> {unit}</>
        )}
      </td>
      <td className="num" style={{ whiteSpace: 'nowrap' }}>{param && form !== 'none' ? `${num(param.min)} to ${num(param.max)}${unit ? ` ${unit}` : ''}` : ''}</td>
      <td><Messages text={msgs} testId="band-msg" /></td>
    </tr>
  );
}

/**
 * The band table: every parameter this file may give a band, its nominal value, its band and its ends
 * (as the last valid project has them). `runProblem`: the message of a run that stopped at a band
 * (an InputError at tolerances.<path>), shown beside that band.
 */
export function ToleranceBands({ file, params, runProblem }: { file: ProjectFile; params: readonly ToleranceParameter[]; runProblem?: string }) {
  const allowed = allowedTolerancePaths(file);
  const top = useFormValue((_, issues) => Object.entries(issues).filter(([k]) => k === 'tolerances' || (k.startsWith('tolerances.') && !allowed.some((p) => k === `tolerances.${p}` || k.startsWith(`tolerances.${p}.`)) && !k.startsWith('tolerances.monteCarlo'))).map(([k, v]) => `${k} ${v}`).join('\n'));
  return (
    <>
      <table className="data compact" data-testid="tolerance-bands">
        <thead><tr><th>parameter</th><th>nominal</th><th>band as</th><th>band</th><th>ends</th><th /></tr></thead>
        <tbody>
          {allowed.map((p) => <BandRow key={p} path={p} file={file} param={params.find((q) => q.path === p)} runProblem={runProblem} />)}
        </tbody>
      </table>
      <Messages text={top} />
    </>
  );
}

/** The Monte Carlo settings of the file (tolerances.monteCarlo): samples, seed, distribution, sigma of the half band. */
export function MonteCarloFields() {
  const store = useFormStore();
  const mc = asObj(useFormValue((d) => getAt(d.tree, 'tolerances.monteCarlo')));
  const msgs = useMessagesUnder('tolerances.monteCarlo');
  const distribution = typeof mc.distribution === 'string' ? mc.distribution : 'uniform';
  return (
    <span style={{ display: 'inline-flex', gap: 10, alignItems: 'center', flexWrap: 'wrap' }}>
      <label title={KEYS['tolerances.monteCarlo.samples']?.doc}>samples <SubtreeNumber subtree="tolerances.monteCarlo" keys={['samples']} value={mc.samples ?? 1000} testId="mc-samples" width={70} /></label>
      <label title={KEYS['tolerances.monteCarlo.seed']?.doc}>seed <SubtreeNumber subtree="tolerances.monteCarlo" keys={['seed']} value={mc.seed ?? 1} testId="mc-seed" width={60} /></label>
      <label title={KEYS['tolerances.monteCarlo.distribution']?.doc}>
        distribution{' '}
        <select data-testid="mc-distribution" value={distribution} onChange={(e) => {
          const v = e.target.value;
          store.update((d) => editSubtree(d, 'tolerances.monteCarlo', { ...asObj(getAt(d.tree, 'tolerances.monteCarlo')), distribution: v }));
        }}>
          <option value="uniform">uniform over the band</option>
          <option value="normal">normal, truncated to the band</option>
        </select>
      </label>
      {distribution === 'normal' && (
        <label title={KEYS['tolerances.monteCarlo.sigmaOfBand']?.doc}>sigma <SubtreeNumber subtree="tolerances.monteCarlo" keys={['sigmaOfBand']} value={mc.sigmaOfBand ?? 0.33} testId="mc-sigma" width={50} /> × half band</label>
      )}
      <Messages text={msgs} testId="mc-msg" />
    </span>
  );
}
