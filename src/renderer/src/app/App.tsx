// Torquewise main window: the input side on the left, the views on the right (the flux map only for a
// project that carries one; the duty cycle only for one with a thermal network and a duty cycle).
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { checkProject, listCapProblem } from '../../../core/project/schema';
import { migrateProject } from '../../../core/project/migrate';
import { loadProjectJson, parseProjectJson, type ResolvedProject } from '../../../core/project/project';
import { isInputError } from '../../../core/base/errors';
import type { MenuEvent } from '../../../types/bridge';
import { DEMOS, DEFAULT_DEMO } from './demos';
import { newDraft, normalisePath, type Json } from '../state/draft';
import { FormContext, FormStore } from '../state/form-store';
import { useAfterPaint } from '../state/after-paint';
import { InputPanel } from '../views/inputs/InputPanel';
import { computeEnvelopes, computeVerdicts, pointVerdict, DEFAULT_ENVELOPE_OPTIONS, type EnvelopeOptions, type EnvelopeResults, type Results, type Verdicts } from '../state/compute';
import { createFileBridge } from '../state/file-bridge';
import { createExporter, ExporterContext } from '../state/exporter';
import type { SimDone } from '../state/simulation-run';
import { EnvelopeView } from '../views/envelope/EnvelopeView';
import { LoadStepsView } from '../views/load-steps/LoadStepsView';
import { TuningView } from '../views/tuning/TuningView';
import { DatasheetView } from '../views/datasheet/DatasheetView';
import { FluxMapView } from '../views/flux-map/FluxMapView';
import { EfficiencyView } from '../views/efficiency/EfficiencyView';
import { DutyCycleView } from '../views/duty-cycle/DutyCycleView';
import { CompareView } from '../views/compare/CompareView';
import { TolerancesView } from '../views/tolerances/TolerancesView';
import { fluxMapOf } from '../views/flux-map/flux-map-data';
import { envelopeCsv, tracesCsv } from '../components/exports';
import { exportDatasheetHtml, exportVisiblePlot } from '../components/image-export';
import { limitPhrase } from '../../../core/reports/phrases';
import { FieldNotesContext, FindingsStrip, findingsKey, notesByPath } from '../components/field-notes';
import { num } from '../components/format';

type View = 'envelope' | 'efficiency' | 'dutycycle' | 'fluxmap' | 'loadsteps' | 'tuning' | 'compare' | 'datasheet' | 'tolerances';
const VIEWS: Array<[View, string]> = [
  ['envelope', 'Envelope'],
  ['efficiency', 'Efficiency'],
  ['dutycycle', 'Duty cycle'],
  ['fluxmap', 'Flux map'],
  ['loadsteps', 'Load steps'],
  ['tuning', 'Tuning'],
  ['compare', 'Compare'],
  ['datasheet', 'Datasheet'],
  ['tolerances', 'Tolerances'],
];

/** How long a successful export's notice stays on the status line, ms (a failure stays until replaced). */
const EXPORT_NOTICE_MS = 8000;

/** Wait after the last keystroke of a burst before recomputing, ms. */
export const EDIT_DEBOUNCE_MS = 25;

interface Checked {
  issues: Record<string, string>;
  resolved: ResolvedProject | null;
}

function inputIssue(e: unknown): Record<string, string> {
  if (isInputError(e)) {
    const p = normalisePath(e.field);
    const msg = e.message.startsWith(e.field) ? e.message.slice(e.field.length).trim() : e.message;
    return { [p]: msg };
  }
  return { file: e instanceof Error ? e.message : String(e) };
}

/**
 * Validate and resolve the form's tree, once per edit, as every reader loads a project (core
 * loadProjectJson: migration, schema, resolution, the same steps loadProjectText takes after the JSON; a file from a newer format version is read
 * as far as this version understands it and marked read-only). When it cannot be loaded, the
 * problems are gathered field by field: the schema's full list on the migrated tree, else the one
 * problem the loading named.
 */
function check(tree: Json): Checked {
  try {
    return { issues: {}, resolved: loadProjectJson(tree).resolved };
  } catch (e) {
    return { issues: fieldProblems(tree, e), resolved: null };
  }
}

function fieldProblems(tree: Json, e: unknown): Record<string, string> {
  let json: unknown = tree;
  try {
    json = migrateProject(tree).json;
  } catch {
    // not an object, or a version with no path: the schema names the problem below
  }
  const issues: Record<string, string> = {};
  for (const pr of checkProject(json)) {
    const p = normalisePath(pr.path);
    if (!issues[p]) issues[p] = pr.message;
  }
  return Object.keys(issues).length ? issues : inputIssue(e);
}

declare global {
  interface Window {
    /** edit-to-redraw figures, ms, read by the end-to-end tests */
    __twPerf?: number[];
    /** where the time of each edit-to-redraw went: ms from the keystroke to each phase */
    __twPerfPhases?: Array<Record<string, number>>;
    /** edit-to-verdicts figures, ms */
    __twPerfVerdicts?: number[];
  }
}

/** A project text as the CLI and the desktop read it (syntax, duplicate keys), or why it cannot be read. */
function parseText(text: string): { ok: true; tree: Json } | { ok: false; why: string } {
  try {
    return { ok: true, tree: parseProjectJson(text) as Json };
  } catch (e) {
    // "x.json is not valid JSON: ..." for the whole file; "x.json: inverter.Imax is given twice ..." for a part of it
    if (!isInputError(e) || e.field === 'file') return { ok: false, why: ` ${isInputError(e) ? e.message.replace(/^file /, '') : 'is not valid JSON'}` };
    return { ok: false, why: `: ${e.message}` };
  }
}

function safeVerdicts(e: EnvelopeResults): Verdicts | null {
  try {
    return computeVerdicts(e.project, e.speedMax);
  } catch {
    return null;
  }
}

const demoText = (file: string): string => DEMOS.find((d) => d.file === file)?.text ?? DEMOS[0]?.text ?? '{}';

export function App() {
  const [theme, setTheme] = useState<'light' | 'dark'>(() => {
    const t = localStorage.getItem('tw-theme') === 'dark' ? 'dark' : 'light';
    document.documentElement.dataset.theme = t;
    return t;
  });
  const [source, setSource] = useState<{ name: string; path: string | null; demo: boolean; readOnly: boolean }>({
    name: DEFAULT_DEMO,
    path: null,
    demo: true,
    readOnly: false,
  });
  const [dirty, setDirty] = useState(false);
  const pathRef = useRef<string | null>(null);
  const [store] = useState(() => {
    const demo = parseText(demoText(DEFAULT_DEMO));
    const d = newDraft(demo.ok ? demo.tree : {});
    return new FormStore(d, check(d.tree).issues);
  });
  const [checked, setChecked] = useState<Checked>(() => check(store.getDraft().tree));
  const [lastGood, setLastGood] = useState<ResolvedProject | null>(checked.resolved);
  const [envOpts, setEnvOpts] = useState<EnvelopeOptions>(DEFAULT_ENVELOPE_OPTIONS);
  const [view, setView] = useState<View>('envelope');
  const [notice, setNotice] = useState<string | null>(null);
  // this window's file bridge (Electron's or the browser's), and its exports, each of which says on
  // the status line how it went (a success for a while, a failure until replaced)
  const [bridge] = useState(createFileBridge);
  const noticeTimer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const [exporter] = useState(() =>
    createExporter(bridge, (message, done) => {
      setNotice(message);
      if (noticeTimer.current) clearTimeout(noticeTimer.current);
      noticeTimer.current = done ? setTimeout(() => setNotice((cur) => (cur === message ? null : cur)), EXPORT_NOTICE_MS) : null;
    }),
  );
  useEffect(() => () => {
    if (noticeTimer.current) clearTimeout(noticeTimer.current);
  }, []);
  // the last finished load-step run and the datasheet's table step: kept here, so they survive
  // switching views and the Export menu reaches them
  const [simulation, setSimulation] = useState<SimDone | null>(null);
  const [tableStep, setTableStep] = useState<number | undefined>(undefined);

  // the window title names the file and marks unsaved edits; leaving with unsaved edits asks first
  // (the browser's own question; on the desktop main asks, see src/main/unsaved-prompt.ts)
  useEffect(() => {
    document.title = `Torquewise — ${source.name}${dirty ? ' •' : ''}`;
    if (!dirty) return;
    const hold = (e: BeforeUnloadEvent) => {
      e.preventDefault();
      e.returnValue = '';
    };
    window.addEventListener('beforeunload', hold);
    return () => window.removeEventListener('beforeunload', hold);
  }, [source.name, dirty]);

  useEffect(() => {
    document.documentElement.dataset.theme = theme;
    localStorage.setItem('tw-theme', theme);
  }, [theme]);

  // validate and resolve, debounced after the last edit; autosave (Electron) a while after it
  useEffect(() => {
    let h: ReturnType<typeof setTimeout> | null = null;
    let save: ReturnType<typeof setTimeout> | null = null;
    // true from a check until the task that redraws after it has ended: a keystroke that finds it
    // true was waiting in the queue behind that redraw (keys arriving faster than the redraws)
    let busy = false;
    const off = store.onEdit(() => {
      setDirty(true);
      if (h !== null) clearTimeout(h);
      // an edit is checked at once while the redraws keep up with the keys; keys that queued up
      // behind a redraw are coalesced into one check EDIT_DEBOUNCE_MS after the last of them
      const quiet = !busy;
      const run = () => {
        h = null;
        busy = true;
        setTimeout(() => (busy = false), 0);
        performance.mark('tw-check');
        const c = check(store.getDraft().tree);
        store.setIssues(c.issues);
        setChecked(c);
        if (c.resolved) setLastGood(c.resolved);
      };
      // a quiet edit is checked within the keystroke's own task, so the keystroke and the redrawn
      // plot reach the screen in the same frame
      if (quiet) run();
      else h = setTimeout(run, EDIT_DEBOUNCE_MS);
      // autosave of the edits for recovery after a crash or a closed tab (a file beside the user
      // data on the desktop, local storage in a browser)
      if (save !== null) clearTimeout(save);
      save = setTimeout(() => void bridge.recoveryWrite(JSON.stringify(store.getDraft().tree, null, 2), pathRef.current), 1500);
    });
    return () => {
      off();
      if (h !== null) clearTimeout(h);
      if (save !== null) clearTimeout(save);
    };
  }, [store, bridge]);

  // the curves, or why the engine could not compute them (derived here, never set as state)
  const computed = useMemo((): { envelopes: EnvelopeResults | null; error: string | null } => {
    if (!lastGood) return { envelopes: null, error: null };
    try {
      performance.mark('tw-compute');
      const r = computeEnvelopes(lastGood, envOpts);
      performance.mark('tw-computed');
      return { envelopes: r, error: null };
    } catch (e) {
      return { envelopes: null, error: isInputError(e) ? e.message : `The engine could not compute this project: ${e instanceof Error ? e.message : String(e)}` };
    }
  }, [lastGood, envOpts]);
  const envelopes = computed.envelopes;
  const computeError = computed.error;

  // verdicts (sizing searches) follow the curves: computed after the redraw, so typing stays quick
  const [verdicts, setVerdicts] = useState<Verdicts | null>(() => (envelopes ? safeVerdicts(envelopes) : null));
  const lateEnvelopes = useAfterPaint(envelopes);
  useEffect(() => {
    const envelopes = lateEnvelopes;
    if (!envelopes || verdicts?.verdictsFor === envelopes.project) return;
    const h = setTimeout(() => {
      const v = safeVerdicts(envelopes);
      if (v) setVerdicts(v);
      const marks = performance.getEntriesByName('tw-edit-v', 'mark');
      if (marks.length) {
        (window.__twPerfVerdicts ??= []).push(performance.now() - marks[marks.length - 1]!.startTime);
        performance.clearMarks('tw-edit-v');
      }
    }, 0);
    return () => clearTimeout(h);
  }, [lateEnvelopes, verdicts]);
  const results: Results | null = useMemo(() => (envelopes && verdicts ? { ...envelopes, ...verdicts } : null), [envelopes, verdicts]);
  // the flux-map tab only for a project that carries a map; its view falls back to the envelope otherwise
  const hasMap = fluxMapOf(results?.project) !== null;
  // the duty-cycle tab only for a project with both a thermal network and a duty cycle
  const hasCycle = results?.project.thermal !== undefined && results?.project.dutyCycle !== undefined;
  // the tolerances tab only for a project with a `tolerances` section
  const hasTol = results?.project.file.tolerances !== undefined;
  const views = VIEWS.filter(([v]) => (v !== 'fluxmap' || hasMap) && (v !== 'dutycycle' || hasCycle) && (v !== 'tolerances' || hasTol));
  const shown: View = (view === 'fluxmap' && !hasMap) || (view === 'dutycycle' && !hasCycle) || (view === 'tolerances' && !hasTol) ? 'envelope' : view;


  const load = useCallback((text: string, src: { name: string; path: string | null; demo: boolean; readOnly: boolean }, message?: string) => {
    const parsed = parseText(text);
    if (!parsed.ok) {
      setNotice(`${src.name}${parsed.why}; nothing was changed.`);
      return false;
    }
    // a list beyond the schema's cap is refused by its length before the form lays it out
    const tooLong = listCapProblem(parsed.tree);
    if (tooLong) {
      setNotice(`${src.name} was not opened: ${tooLong.path} ${tooLong.message}; nothing was changed.`);
      return false;
    }
    const tree = parsed.tree;
    const d = newDraft(tree);
    const c = check(tree);
    store.replace(d, c.issues);
    setChecked(c);
    setLastGood(c.resolved);
    setSource(src);
    setDirty(false);
    setNotice(message ?? null);
    return true;
  }, [store]);

  pathRef.current = source.path;
  const readOnly = source.readOnly || lastGood?.readOnly === true;
  const projectText = () => JSON.stringify(store.getDraft().tree, null, 2) + '\n';
  const suggested = () => (source.demo ? source.name.replace(/^demo-/, 'my-') : source.name.replace(/^.*[\\/]/, ''));

  const doOpen = useCallback(async () => {
    const r = await bridge.open();
    if (r.ok) load(r.text, { name: r.path.replace(/^.*[\\/]/, ''), path: r.path, demo: false, readOnly: r.readOnly }, r.message);
    else if (!r.canceled) setNotice(r.message);
  }, [bridge, load]);

  const doOpenRecent = useCallback(async (path: string) => {
    const r = await bridge.openRecent(path);
    if (r.ok) load(r.text, { name: r.path.replace(/^.*[\\/]/, ''), path: r.path, demo: false, readOnly: r.readOnly }, r.message);
    else if (!r.canceled) setNotice(r.message);
  }, [bridge, load]);

  const doSave = useCallback(
    async (as: boolean) => {
      // a read-only project (a file from a newer format version) is never written over: Save is Save As
      const canUsePath = !as && !source.demo && !readOnly ? source.path : null;
      const r = as || !canUsePath ? await bridge.saveAs(projectText(), suggested()) : await bridge.save(projectText(), canUsePath, suggested());
      if (r.ok) {
        setSource({ name: r.path.replace(/^.*[\\/]/, ''), path: r.path, demo: false, readOnly: false });
        setDirty(false);
        // saved, but perhaps not durable (the folder could not be flushed): the warning says so
        setNotice(r.warning ?? `Saved ${r.path.replace(/^.*[\\/]/, '')}.`);
        void bridge.recoveryDiscard();
      } else if (!r.canceled) setNotice(r.message);
    },
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [bridge, source, store, readOnly],
  );

  // Electron: a project given at start, unsaved edits from last time, menu events
  useEffect(() => {
    if (bridge.kind === 'electron') {
      void bridge.initialFile().then((r) => {
        if (r && r.ok) load(r.text, { name: r.path.replace(/^.*[\\/]/, ''), path: r.path, demo: false, readOnly: r.readOnly }, r.message);
        else if (r && !r.ok && !r.canceled) setNotice(r.message);
      });
    }
    void bridge.recoveryCheck().then((offer) => {
      if (offer && window.confirm(`Unsaved edits from ${offer.savedAt} were found. Restore them?`)) {
        if (load(offer.text, { name: offer.documentPath?.replace(/^.*[\\/]/, '') ?? 'recovered.json', path: offer.documentPath, demo: false, readOnly: false })) {
          setDirty(true);
          // restored: autosaved afresh, so it is offered again if the tab goes before a save
          void bridge.recoveryWrite(offer.text, offer.documentPath);
        }
        // not restored: the entry stays as it is, and the next start keeps it aside instead of offering it again
      } else if (offer) void bridge.recoveryDiscard();
    });
  }, [bridge, load]);

  const menuRef = useRef<(e: MenuEvent) => void>(() => {});
  menuRef.current = (e: MenuEvent) => {
    switch (e.name) {
      case 'file:new':
        load(demoText(DEFAULT_DEMO), { name: 'untitled.json', path: null, demo: false, readOnly: false }, 'New project, started from the traction demo (invented data).');
        break;
      case 'file:open':
        void doOpen();
        break;
      case 'file:open-recent':
        if (e.path) void doOpenRecent(e.path);
        break;
      case 'file:save':
        void doSave(false);
        break;
      case 'file:save-as':
        void doSave(true);
        break;
      case 'export:envelope-csv':
        if (results) void exporter.exportAndTell('envelope-csv', () => envelopeCsv(results), 'envelope.csv');
        break;
      case 'export:traces-csv': {
        const sim = simulation;
        if (sim) void exporter.exportAndTell('traces-csv', () => tracesCsv(sim.traces), 'traces.csv');
        else setNotice('Run a load-step test first: there are no traces to export.');
        break;
      }
      case 'export:plot-png':
      case 'export:plot-svg':
        if (!results) setNotice('No plot on this view to export.');
        else void exportVisiblePlot(e.name === 'export:plot-png' ? 'png' : 'svg', results.project, exporter).then((ok) => ok || setNotice('No plot on this view to export.'));
        break;
      case 'export:datasheet':
        setView('datasheet');
        if (results) void exportDatasheetHtml(results, tableStep, exporter).then((ok) => ok || setNotice('The datasheet could not be exported.'));
        else setNotice('The datasheet could not be exported: the project has no valid results yet.');
        break;
    }
  };
  useEffect(() => bridge.onMenu((e) => menuRef.current(e)), [bridge]);

  const stale = Object.keys(checked.issues).length > 0;
  const marks = useMemo(() => requirementMarks(results), [results]);
  const lateResolved = useAfterPaint(lastGood);
  const lateMarks = useAfterPaint(marks);
  const projectName = lastGood?.name || source.name;
  // findings about the inputs: beside their fields and in the strip above every view (the context
  // value changes only when the findings do, so the fields do not re-render on every edit)
  const inputFindings = lateResolved?.findings ?? [];
  const fKey = findingsKey(inputFindings);
  // eslint-disable-next-line react-hooks/exhaustive-deps
  const notes = useMemo(() => notesByPath(inputFindings), [fKey]);

  return (
    <ExporterContext.Provider value={exporter}>
    <FormContext.Provider value={store}>
      <FieldNotesContext.Provider value={notes}>
      <div className="app">
        <header className="topbar">
          <span className="brand">
            Torquewise<small>PMSM drive bench</small>
          </span>
          <label>
            Demo
            <select
              data-testid="demo-picker"
              value={source.demo ? source.name : ''}
              onChange={(e) => e.target.value && load(demoText(e.target.value), { name: e.target.value, path: null, demo: true, readOnly: false })}
            >
              {!source.demo && <option value="">(own file)</option>}
              {DEMOS.map((d) => (
                <option key={d.file} value={d.file}>
                  {d.file.replace(/^demo-|\.json$/g, '')} (invented)
                </option>
              ))}
            </select>
          </label>
          <span className="project-name" data-testid="project-name" title={projectName}>
            {projectName}
            {dirty ? ' •' : ''}
          </span>
          {source.demo && <span className="invented">invented demo data</span>}
          {readOnly && <span className="invented">read-only</span>}
          <span className="spacer" />
          <button className="btn" onClick={() => void doOpen()} data-testid="open">Open…</button>
          <button className="btn" onClick={() => void doSave(false)} data-testid="save" title={readOnly ? 'read-only: saves a copy' : undefined}>{readOnly ? 'Save a copy…' : 'Save'}</button>
          <button className="btn" onClick={() => void doSave(true)}>Save as…</button>
          <button
            className="btn"
            data-testid="theme-toggle"
            aria-label="Switch light or dark theme"
            onClick={() => {
              // the plots read their colours from the document while rendering: switch it first
              const next = theme === 'dark' ? 'light' : 'dark';
              document.documentElement.dataset.theme = next;
              setTheme(next);
            }}
          >
            {theme === 'dark' ? 'Light theme' : 'Dark theme'}
          </button>
        </header>
        <div className="body">
          <aside className="inputs" data-testid="inputs">
            <InputPanel resolved={lateResolved} marks={lateMarks} />
          </aside>
          <main className="main">
            <nav className="tabs" role="tablist">
              {views.map(([v, label]) => (
                <button key={v} role="tab" className="tab" aria-selected={shown === v} data-testid={`tab-${v}`} onClick={() => setView(v)}>
                  {label}
                </button>
              ))}
            </nav>
            <div className={'status' + (stale ? ' stale' : '')} data-testid="status" role="status">
              {stale
                ? `${Object.keys(checked.issues).length} input problem(s): showing the last valid project. ${otherIssues(checked.issues)}`
                : (notice ?? computeError ?? (results ? `Envelopes in ${results.compute_ms.toFixed(1)} ms (${results.curves.length} × ${results.points} points); sizing verdicts in ${results.verdict_ms.toFixed(1)} ms.` : ''))}
            </div>
            <FindingsStrip findings={inputFindings.filter((f) => f.code !== 'newer-format')} />
            {readOnly && (
              <div className="finding warning" data-testid="read-only-banner" role="note">
                <strong>Read-only.</strong> {lastGood?.findings.find((f) => f.code === 'newer-format')?.message ?? 'This file is shown read-only: Save writes a copy (Save As), the file itself is not changed.'}
              </div>
            )}
            <div className="view">
              {computeError && <div className="finding danger">{computeError}</div>}
              {!results ? (
                <div className="empty">No valid project yet: correct the marked inputs.</div>
              ) : shown === 'envelope' ? (
                <EnvelopeView results={results} opts={envOpts} setOpts={setEnvOpts} theme={theme} />
              ) : shown === 'efficiency' ? (
                <EfficiencyView results={results} theme={theme} />
              ) : shown === 'dutycycle' ? (
                <DutyCycleView results={results} theme={theme} />
              ) : shown === 'fluxmap' ? (
                <FluxMapView project={results.project} theme={theme} />
              ) : shown === 'loadsteps' ? (
                <LoadStepsView project={results.project} theme={theme} stale={stale} result={simulation} setResult={setSimulation} />
              ) : shown === 'tolerances' ? (
                <TolerancesView project={results.project} theme={theme} />
              ) : shown === 'tuning' ? (
                <TuningView project={results.project} theme={theme} />
              ) : shown === 'compare' ? (
                <CompareView project={results.project} theme={theme} />
              ) : (
                <DatasheetView results={results} theme={theme} tableStep={tableStep} setTableStep={setTableStep} />
              )}
            </div>
          </main>
        </div>
      </div>
      </FieldNotesContext.Provider>
    </FormContext.Provider>
    </ExporterContext.Provider>
  );
}

/** Problems on paths no field shows (whole-file or section-level), spelled out in the status line. */
function otherIssues(issues: Record<string, string>): string {
  const top = Object.entries(issues).filter(([p]) => !p.includes('.') || p === 'file');
  return top.map(([p, m]) => `${p} ${m}.`).join(' ');
}

function requirementMarks(r: Results | null) {
  if (!r) return [];
  return r.sizing.points.map((pt, i) => {
    const v = pointVerdict(r, i);
    // the verdict says which current limit it was checked against, and the headroom or the shortfall
    const duty = `${pt.duty} duty, ${pt.duty} current limit ${num(pt.currentLimit_A)} A peak (${pt.currentLimitBinds === 'motor' ? "motor's rating" : "inverter's rating"})`;
    const cold = r.sizingCold.points[i]!;
    const why = v.fails === 'cold' ? `not met with the cold magnet (${duty}): ${cold.headroomNote}` : `not met (${duty}${v.fails === 'both' ? ', hot and cold' : ', hot magnet'}): ${pt.headroomNote}`;
    return (
      <span key={i} className={v.met ? 'pass' : 'fail'} data-testid={`req-mark-${i}`} data-duty={pt.duty} title={v.met ? `met, hot and cold (${duty}); hot magnet: ${pt.headroomNote}` : why}>
        {v.met ? 'pass' : 'fail'}
      </span>
    );
  });
}
