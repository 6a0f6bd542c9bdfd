// Compare view: design variants side by side. The open project, its named variants (the file's
// `variants` section) and other project files the user adds (the file bridge: the open dialog, or a
// file input in the web page), each with its own named variants; the peak-current motoring envelopes
// hot and cold overlaid (one colour per variant), and the comparison table (one column per variant).
// Everything is computed in a worker: the steady results first, then each variant's scenario simulated
// for its load-step metrics (progress, cancel).
import { memo, useCallback, useEffect, useMemo, useRef, useState } from 'react';
import type { ResolvedProject } from '../../../../core/project/project';
import { loadProject } from '../../../../core/project/project';
import { isInputError } from '../../../../core/base/errors';
import type { VariantLoadSteps, VariantSteady } from '../../../../core/reports/variant-comparison';
import { comparisonTable, type ComparisonRow } from '../../../../core/reports/variant-table';
import { useWorkerRun } from '../../state/worker-run';
import { createFileBridge } from '../../state/file-bridge';
import { Plot, readTheme } from '../../components/Plot';
import { Section } from '../../components/Section';
import type { CompareReply, CompareRequest, CompareSource } from '../../workers/compare-protocol';
import { compareEnvelopeFigure, variantColour } from './compare-figures';

type Done = Omit<Extract<CompareReply, { kind: 'done' }>, 'kind'>;

/** A project file added to the comparison: its name, text and the names of its own variants. */
interface AddedFile {
  id: number;
  name: string;
  text: string;
  variants: string[];
}

const variantNames = (file: { variants?: Array<{ name: string }> } | Record<string, unknown>): string[] => {
  const vs = (file as { variants?: unknown }).variants;
  return Array.isArray(vs) ? vs.map((v: { name?: unknown }) => String(v?.name ?? '')) : [];
};

/** Column names made unique: a repeated name gets " (2)". */
function unique(sources: CompareSource[]): CompareSource[] {
  const seen = new Map<string, number>();
  return sources.map((s) => {
    const k = (seen.get(s.name) ?? 0) + 1;
    seen.set(s.name, k);
    return k === 1 ? s : { ...s, name: `${s.name} (${k})` };
  });
}

const startWorker = () => new Worker(new URL('../../workers/compare-worker.ts', import.meta.url), { type: 'module' });

export const CompareView = memo(function CompareView({ project, theme }: { project: ResolvedProject; theme: 'light' | 'dark' }) {
  const openText = useMemo(() => JSON.stringify(project.file), [project]);
  const own = useMemo(() => variantNames(project.file), [project]);
  const [excluded, setExcluded] = useState<Record<string, boolean>>({});
  const [files, setFiles] = useState<AddedFile[]>([]);
  const [notice, setNotice] = useState<string | null>(null);
  const nextId = useRef(1);
  const bridge = useMemo(() => createFileBridge(), []);

  const sources = useMemo(() => {
    const list: CompareSource[] = [{ name: 'open project', projectText: openText, variant: null }];
    for (const v of own) if (!excluded[v]) list.push({ name: v, projectText: openText, variant: v });
    for (const f of files) {
      list.push({ name: f.name, projectText: f.text, variant: null });
      for (const v of f.variants) list.push({ name: `${f.name} / ${v}`, projectText: f.text, variant: v });
    }
    return unique(list);
  }, [openText, own, excluded, files]);
  const key = useMemo(() => `${openText.length}:${openText}|${sources.map((s) => s.name).join('|')}|${files.map((f) => f.id).join(',')}`, [openText, sources, files]);

  const [steady, setSteady] = useState<{ key: string; columns: VariantSteady[]; ms: number } | null>(null);
  const [loads, setLoads] = useState<{ key: string; columns: VariantLoadSteps[]; ms: number } | null>(null);
  // what the running comparison was asked (an edit while it runs labels only the next one)
  const asked = useRef(key);
  const askedSources = useRef<CompareSource[]>(sources);
  const sims = useWorkerRun<CompareRequest, Done>('comparison', (m) => {
    if (m.loads) setLoads({ key: asked.current, columns: m.loads, ms: m.compute_ms });
  });
  const steadyRun = useWorkerRun<CompareRequest, Done>('comparison', (m) => {
    if (!m.steady) return;
    setSteady({ key: asked.current, columns: m.steady, ms: m.compute_ms });
    sims.start(startWorker(), { kind: 'load-steps', sources: askedSources.current });
  });
  useEffect(() => {
    const h = setTimeout(() => {
      asked.current = key;
      askedSources.current = sources;
      sims.cancel();
      steadyRun.start(startWorker(), { kind: 'steady', sources });
    }, 150);
    return () => clearTimeout(h);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [key]);

  const addFile = useCallback(async () => {
    const r = await bridge.open();
    if (!r.ok) {
      if (!r.canceled) setNotice(r.message);
      return;
    }
    const name = r.path.replace(/^.*[\\/]/, '').replace(/\.json$/i, '');
    try {
      const loaded = loadProject(r.text);
      setFiles((fs) => [...fs, { id: nextId.current++, name, text: r.text, variants: variantNames(loaded.file) }]);
      setNotice(null);
    } catch (e) {
      setNotice(`${name} was not added: ${isInputError(e) ? e.message : 'it is not a project file'}.`);
    }
  }, [bridge]);

  const shown = steady?.columns ?? null;
  const fig = useMemo(() => (shown ? compareEnvelopeFigure(shown, readTheme()) : null), [shown, theme]);
  const loadsNow = loads !== null && steady !== null && loads.key === steady.key ? loads.columns : null;
  const table = useMemo(() => (shown ? comparisonTable(shown, loadsNow ?? []) : null), [shown, loadsNow]);
  const fresh = steady?.key === key;

  return (
    <div className="compare-view" data-testid="compare-view">
      <Section title="Variants" right={<span>{sources.length} compared</span>}>
        <div data-testid="compare-sources" style={{ display: 'flex', flexWrap: 'wrap', gap: '6px 14px', alignItems: 'center' }}>
          <label>
            <input type="checkbox" checked disabled /> open project ({project.name || 'unnamed'})
          </label>
          {own.map((v) => (
            <label key={v}>
              <input type="checkbox" data-testid={`compare-own-${v}`} checked={!excluded[v]} onChange={(e) => setExcluded((x) => ({ ...x, [v]: !e.target.checked }))} /> variant “{v}”
            </label>
          ))}
          {own.length === 0 && <span className="hint">This file names no variants (a `variants` section: name, and the parameters it overrides).</span>}
          {files.map((f) => (
            <span key={f.id} className="compare-file" data-testid="compare-file">
              {f.name}
              {f.variants.length > 0 ? ` and its ${f.variants.length} variant${f.variants.length > 1 ? 's' : ''}` : ''}{' '}
              <button onClick={() => setFiles((fs) => fs.filter((g) => g.id !== f.id))}>Remove</button>
            </span>
          ))}
          <button data-testid="compare-add-file" onClick={() => void addFile()}>Add project file…</button>
        </div>
        {notice && <div className="finding warning" data-testid="compare-notice">{notice}</div>}
        <div className="hint" data-testid="compare-status">
          {steadyRun.run.kind === 'error' ? <span className="finding danger">{steadyRun.run.message}</span>
            : steadyRun.run.kind === 'running' || !fresh ? 'Comparing…'
            : steady ? `Envelopes, sizing and efficiency of ${steady.columns.length} variants in ${steady.ms.toFixed(0)} ms. ` : ''}
          {sims.run.kind === 'running' && (
            <span data-testid="compare-sim-progress">
              Simulating the load steps ({Math.round(100 * sims.run.fraction)} %) <button data-testid="compare-sim-cancel" onClick={sims.cancel}>Cancel</button>
            </span>
          )}
          {sims.run.kind === 'cancelled' && <span data-testid="compare-sim-cancelled">Load steps not simulated (cancelled).</span>}
          {sims.run.kind === 'error' && <span className="finding danger">{sims.run.message}</span>}
          {loads && fresh && loads.key === steady?.key && sims.run.kind === 'idle' && <span data-testid="compare-sim-done" data-ms={loads.ms.toFixed(0)}>Load steps simulated in {(loads.ms / 1000).toFixed(1)} s.</span>}
        </div>
      </Section>
      {fig && (
        <Section title="Envelopes at the peak current, motoring: hot solid, cold dashed">
          <Plot data={fig.data} layout={fig.layout} height={380} testId="compare-plot" />
        </Section>
      )}
      {table && (
        <Section title="Side by side">
          <CompareTable columns={table.columns} rows={table.rows} dark={theme === 'dark'} />
          <p className="hint">Requirement cells: met with the current headroom / voltage headroom (0 V in field weakening), or the torque short. Efficiency: hot corner, least-current control, at the point's shaft torque. A dash: the variant has no such point or figure.</p>
        </Section>
      )}
    </div>
  );
});

function CompareTable({ columns, rows, dark }: { columns: string[]; rows: ComparisonRow[]; dark: boolean }) {
  let group = '';
  return (
    <div className="table-scroll">
      <table className="data compact" data-testid="compare-table">
        <thead>
          <tr>
            <th />
            <th>unit</th>
            {columns.map((c, i) => (
              <th key={c} className="num" style={{ borderBottom: `3px solid ${variantColour(i, dark)}` }} data-testid="compare-column">{c}</th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.flatMap((r) => {
            const out = [];
            if (r.group !== group) {
              group = r.group;
              out.push(<tr key={`g-${group}`}><th colSpan={2 + columns.length} style={{ paddingTop: 8, textTransform: 'uppercase', fontSize: 11, letterSpacing: '0.05em' }}>{group}</th></tr>);
            }
            out.push(
              <tr key={`${r.group}-${r.label}`} data-row={r.label}>
                <th style={{ fontWeight: 400 }}>{r.label}</th>
                <td className="hint">{r.unit}</td>
                {r.cells.map((c, i) => <td key={i} className={c.startsWith('NOT') ? 'num fail' : 'num'}>{c}</td>)}
              </tr>,
            );
            return out;
          })}
        </tbody>
      </table>
    </div>
  );
}
