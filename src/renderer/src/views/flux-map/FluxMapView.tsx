// Flux-map view (shown only for a project with motor.fluxMap): the map as the engine reads it. psi_d
// against id and psi_q against iq, the apparent and incremental inductances along MTPA, and the MTPA
// trajectory on the (id, iq) plane with the torque contours; all computed by the core
// (reports/flux-map-curves.ts) on the hot corner's machine model, the one the envelope is solved on.
import { memo, useMemo, useRef } from 'react';
import type { Data, Layout } from 'plotly.js-dist-min';
import type { ResolvedProject } from '../../../../core/project/project';
import { fluxMapCurves } from '../../../../core/reports/flux-map-curves';
import { CURVE, Plot, readTheme } from '../../components/Plot';
import { num } from '../../components/format';
import { exportPlotImage } from '../../components/image-export';
import { useExporter } from '../../state/exporter';
import { fluxMapOf } from './flux-map-data';
import { fluxMapFigures, inductanceRows } from './flux-map-figures';

/** One figure on a card, with its own PNG and SVG export (named fluxmap-<name>). */
function FigureCard({ title, name, fig, height, project, defer }: { title: string; name: string; fig: { data: Data[]; layout: Layout }; height: number; project: ResolvedProject; defer?: boolean }) {
  const exporter = useExporter();
  const el = useRef<HTMLDivElement | null>(null);
  const save = (format: 'png' | 'svg') => {
    if (el.current) void exportPlotImage(el.current, format, `fluxmap-${name}`, project, exporter);
  };
  return (
    <div className="card">
      <div className="toolbar no-print">
        <h4 style={{ margin: 0, flex: 1 }}>{title}</h4>
        <button className="btn small" onClick={() => save('png')} data-testid={`fluxmap-${name}-png`}>PNG</button>
        <button className="btn small" onClick={() => save('svg')} data-testid={`fluxmap-${name}-svg`}>SVG</button>
      </div>
      <Plot data={fig.data} layout={fig.layout} height={height} testId={`fluxmap-${name}-plot`} elRef={(e) => (el.current = e)} defer={defer} />
    </div>
  );
}

export const FluxMapView = memo(function FluxMapView({ project, theme }: { project: ResolvedProject; theme: 'light' | 'dark' }) {
  const map = fluxMapOf(project);
  const computed = useMemo(() => {
    if (!map) return { curves: null, error: null };
    try {
      return { curves: fluxMapCurves(project.models.hot, project.peak.Imax), error: null as string | null };
    } catch (e) {
      return { curves: null, error: `The map's curves could not be computed: ${e instanceof Error ? e.message : String(e)}` };
    }
  }, [project, map]);
  const figs = useMemo(() => (computed.curves ? fluxMapFigures(computed.curves, map, readTheme(), CURVE[theme]) : null), [computed, map, theme]);
  if (!map) return <div className="empty" data-testid="view-fluxmap">This project has no flux map (motor.fluxMap): its machine has constant Ld, Lq and ψm.</div>;
  const c = computed.curves;
  const peak = c ? c.mtpa.current_A.length - 1 : 0;
  return (
    <div data-testid="view-fluxmap">
      <div className="key" data-testid="fluxmap-conditions">
        <span>
          Hot corner as the envelope uses it: winding at {project.conditions.windingTemp_C} °C, magnet at {project.conditions.magnetTemp_C} °C (the map is
          given at {map.magnetTemp_C} °C; ψd shifted by the magnet's remanence coefficient). Map grid {map.id_A.length} × {map.iq_A.length} points,
          curves up to the peak current {num(project.peak.Imax)} A peak.
        </span>
      </div>
      {computed.error && <div className="finding danger">{computed.error}</div>}
      {figs && c && (
        <div className="cols">
          <div>
            <FigureCard title="d-axis flux against d current, at several q currents" name="psid" fig={figs.psid} height={380} project={project} />
            <FigureCard title="q-axis flux against q current, at several d currents" name="psiq" fig={figs.psiq} height={380} project={project} defer />
          </div>
          <div>
            <FigureCard title="MTPA on the current plane (hot magnet)" name="plane" fig={figs.plane} height={420} project={project} defer />
            <FigureCard title="Inductances along MTPA" name="inductance" fig={figs.inductance} height={340} project={project} defer />
            <div className="card">
              <h4>Inductances at zero and at the peak current</h4>
              <table className="data compact" data-testid="fluxmap-inductance-table">
                <thead>
                  <tr>
                    <th>mH</th>
                    <th className="num">at zero current</th>
                    <th className="num">at {num(c.mtpa.current_A[peak]!)} A peak (MTPA, {num(c.mtpa.torque_Nm[peak]!)} N·m)</th>
                  </tr>
                </thead>
                <tbody>
                  {inductanceRows(c).map((r) => (
                    <tr key={r.label}>
                      <td>{r.label}</td>
                      <td className="num">{r.at0}</td>
                      <td className="num">{r.atPeak}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
              <div className="hint" style={{ fontSize: 12, marginTop: 6 }}>
                Apparent: Ld = (ψd(id, iq) − ψd(0, iq)) / id, Lq = ψq / iq (what a constant-parameter model would take). Incremental: the slopes ∂ψd/∂id and
                ∂ψq/∂iq, what the current controller sees (its gains scale with them).
              </div>
            </div>
          </div>
        </div>
      )}
    </div>
  );
});
