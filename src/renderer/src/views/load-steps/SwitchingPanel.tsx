// What a switching run adds to the Load steps view: the ripple window (phase currents at full
// resolution with the applied phase voltage and the DC-link current), the ripple's envelope over the
// fundamental, the phase current's spectrum (linear or log amplitude, THD stated), the averaged and
// switching runs overlaid, and the summary card. Exports: PNG/SVG of each figure with its conditions,
// CSV of the full-resolution window.
import { useMemo, useRef, useState } from 'react';
import type { ResolvedProject } from '../../../../core/project/project';
import { CURVE, Plot, readTheme } from '../../components/Plot';
import { exportPlotImage } from '../../components/image-export';
import { num } from '../../components/format';
import { useExporter } from '../../state/exporter';
import type { SimDone } from '../../state/simulation-run';
import { runFile } from './angle-figures';
import { firstLoadEvent } from '../../../../core/project/switching-window';
import { overlayFigure, rippleEnvelopeFigure, rippleWindowFigure, spectrumFigure, switchingConditions, switchingSummary, switchingWindowCsv, windowZoom, type WindowZoom } from './switching-figures';

type Which = 'window' | 'envelope' | 'spectrum' | 'overlay';

function Exports({ save, which }: { save: (w: Which, f: 'png' | 'svg') => void; which: Which }) {
  return (
    <span className="no-print" style={{ marginLeft: 10, display: 'inline-flex', gap: 4 }}>
      <button className="btn small" onClick={() => save(which, 'png')} data-testid={`sw-${which}-png`}>PNG</button>
      <button className="btn small" onClick={() => save(which, 'svg')} data-testid={`sw-${which}-svg`}>SVG</button>
    </span>
  );
}

export function SwitchingPanel({ result, project, theme }: { result: SimDone; project: ResolvedProject; theme: 'light' | 'dark' }) {
  const exporter = useExporter();
  const [log, setLog] = useState(true);
  const [zoom, setZoom] = useState<WindowZoom>('window');
  const s = result.switching;
  const avg = result.averaged;
  const col = CURVE[theme];
  const zr = useMemo(() => (s ? windowZoom(s, zoom) : null), [s, zoom]);
  // the run's first load event (its own file: the inputs key), marked in the window when it falls there
  const loadAt = useMemo(() => {
    const sc = (runFile(result.inputsKey, project.file) as { scenario?: Parameters<typeof firstLoadEvent>[0] } | null)?.scenario;
    return sc ? firstLoadEvent(sc) : null;
  }, [result.inputsKey, project.file]);
  const marks = useMemo(() => (loadAt === null ? [] : [{ t_s: loadAt, label: `load step ${num(loadAt * 1e3)} ms` }]), [loadAt]);
  const win = useMemo(() => (s ? rippleWindowFigure(s, readTheme(), col, zr, marks) : null), [s, col, zr, marks]);
  const env = useMemo(() => (s ? rippleEnvelopeFigure(s, readTheme(), col) : null), [s, col]);
  const spec = useMemo(() => (s ? spectrumFigure(s, log, readTheme(), col) : null), [s, log, col]);
  const over = useMemo(() => (avg ? overlayFigure(avg, result, readTheme(), col) : null), [avg, result, col]);
  const els = useRef<Partial<Record<Which, HTMLDivElement | null>>>({});
  const cond = s ? switchingConditions(s) : 'switching model';
  const span = s ? `window ${num(s.window.from_s * 1e3)} to ${num(s.window.to_s * 1e3)} ms` : '';
  const shown = zr ? `4 carrier periods, ${num(zr[0], 6)} to ${num(zr[1], 6)} ms, of the ${span}` : span;
  const save = (which: Which, format: 'png' | 'svg') => {
    const el = els.current[which];
    const what = {
      window: zr ? `ripple at ia's ${zoom === 'peak' ? 'peak' : 'zero crossing'}` : 'ripple window',
      envelope: 'phase-current ripple over the fundamental',
      spectrum: `phase-current spectrum, THD ${s ? num(s.thd * 100, 3) : '–'} %`,
      overlay: 'averaged and switching runs overlaid',
    }[which];
    const more = which === 'window' ? `${cond}; ${shown}` : `${cond}; the project's load-step scenario`;
    if (el) void exportPlotImage(el, format, `switching-${which}`, project, exporter, what, [more]);
  };
  const saveCsv = () => {
    if (!s) return;
    const comments = [`# torquewise switching window; project: ${project.name || 'unnamed'}; ${cond}; ${span}; currents in A, voltage phase to neutral in V`];
    void exporter.exportAndTell('switching-csv', () => switchingWindowCsv(s, comments), 'switching-window.csv');
  };

  return (
    <div data-testid="switching-panel">
      <div className="key" data-testid="sw-conditions">
        <span>
          {cond}
          {s && (s.analysed.cycles > 0
            ? `; statistics over ${num(s.analysed.from_s * 1e3)} to ${num(s.analysed.to_s * 1e3)} ms (${s.analysed.cycles} whole fundamental periods of ${num(s.fundamental_Hz, 3)} Hz at the run's end)`
            : '; no whole fundamental period at the run\'s end: no harmonic figures')}.
          {s?.window.truncated && ' The window holds fewer samples than it spans: it stops at its sample bound.'}
        </span>
      </div>
      {!s && (
        <div className="finding warning" data-testid="sw-missing">
          This run used the switching model, but the engine reported no switching detail (ripple window, spectrum, summary): only the overlay of its traces is shown.
        </div>
      )}
      {s && (
        <>
          <div className="card">
            <h4>
              Ripple window — {span}
              <select className="no-print" style={{ marginLeft: 10, fontWeight: 400 }} value={zoom} onChange={(e) => setZoom(e.target.value as WindowZoom)} data-testid="sw-zoom" title="drag on the plot to zoom further; double-click to reset">
                <option value="window">whole window</option>
                <option value="peak">4 carrier periods at ia's peak</option>
                <option value="zero">4 carrier periods at ia's zero crossing</option>
              </select>
              <Exports save={save} which="window" />
              <button className="btn small no-print" style={{ marginLeft: 4 }} onClick={saveCsv} data-testid="sw-csv">CSV</button>
            </h4>
            {win && <Plot data={win.data} layout={win.layout} height={520} testId="switching-window-plot" elRef={(el) => (els.current.window = el)} />}
          </div>
          <div style={{ display: 'grid', gridTemplateColumns: 'minmax(0, 1fr) minmax(0, 1fr)', gap: 12 }}>
            <div className="card">
              <h4>
                Phase-current spectrum
                <label style={{ fontWeight: 400, fontSize: 12, marginLeft: 10 }}>
                  <input type="checkbox" checked={log} onChange={(e) => setLog(e.target.checked)} data-testid="sw-log" /> log scale
                </label>
                <Exports save={save} which="spectrum" />
              </h4>
              {spec && <Plot data={spec.data} layout={spec.layout} height={320} testId="switching-spectrum-plot" elRef={(el) => (els.current.spectrum = el)} />}
            </div>
            <div className="card" data-testid="sw-summary">
              <h4>Switching summary</h4>
              <table className="data">
                <tbody>
                  {switchingSummary(s).map((r) => (
                    <tr key={r.key}>
                      <td>{r.label}</td>
                      <td className="num" data-sw={r.key} data-value={r.value}>{r.text}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
              <h4 style={{ marginTop: 10 }}>
                Ripple over the fundamental
                <Exports save={save} which="envelope" />
              </h4>
              {env && <Plot data={env.data} layout={env.layout} height={200} testId="switching-envelope-plot" elRef={(el) => (els.current.envelope = el)} />}
            </div>
          </div>
        </>
      )}
      <div className="card">
        <h4>
          Averaged and switching runs overlaid
          {over && <Exports save={save} which="overlay" />}
        </h4>
        {over ? (
          <Plot data={over.data} layout={over.layout} height={420} testId="switching-overlay-plot" elRef={(el) => (els.current.overlay = el)} />
        ) : (
          <div className="empty" data-testid="sw-no-averaged">No averaged run of these inputs is kept: choose “averaged”, run, then switch back and run to overlay the two.</div>
        )}
      </div>
    </div>
  );
}
