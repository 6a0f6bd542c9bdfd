// The flux-map view's data path: whether a project carries a map, the curves the core computes on
// the project's model, and the figures built from them (axes labelled with units, theme colours);
// and the current plane of the envelope view drawn through the model.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadProjectText, type ResolvedProject } from '../src/core/project/project';
import { FluxMapModel, type FluxMapData } from '../src/core/machine/flux-map';
import { fluxMapCurves } from '../src/core/reports/flux-map-curves';
import { fluxMapOf, isFluxMapData } from '../src/renderer/src/views/flux-map/flux-map-data';
import { familyColours, fluxMapFigures, inductanceRows } from '../src/renderer/src/views/flux-map/flux-map-figures';
import { CURVE, type PlotTheme } from '../src/renderer/src/components/plot-style';
import { planeCurves } from '../src/renderer/src/state/compute';
import { withApparentTerms } from '../src/core/project/flux-map-resolve';

const demo = (name: string): ResolvedProject => loadProjectText(readFileSync(join(__dirname, '..', 'resources', name), 'utf8'));
const theme: PlotTheme = { ink: '#111111', muted: '#666666', line: '#dddddd', panel: '#ffffff', bg: '#f5f5f5', ok: '#2e7d32', bad: '#b3261e', dark: false };

/** The demo's hot machine tabulated (constant Ld, Lq, psiM) over |i| <= 1.5 Imax, iq >= 0, and handed to the project as its map. */
function withConstantMap(p: ResolvedProject): { project: ResolvedProject; map: FluxMapData } {
  const h = p.hot;
  const span = 1.5 * p.peak.Imax;
  const ids = Array.from({ length: 13 }, (_, k) => -span + (2 * span * k) / 12);
  const iqs = Array.from({ length: 7 }, (_, k) => (span * k) / 6);
  const map: FluxMapData = {
    magnetTemp_C: p.conditions.magnetTemp_C,
    id_A: ids,
    iq_A: iqs,
    psid_Wb: ids.map((id) => iqs.map(() => h.Ld * id + h.psiM)),
    psiq_Wb: ids.map(() => iqs.map((iq) => h.Lq * iq)),
  };
  const model = new FluxMapModel(map, h.polePairs, h.Rs);
  const file = { ...p.file, motor: { ...p.file.motor!, fluxMap: map } } as ResolvedProject['file'];
  return { project: { ...p, file, models: { ...p.models, hot: withApparentTerms(model, h) } }, map };
}

describe('which projects have a flux-map view', () => {
  it('no demo of constant parameters carries a map: the tab stays hidden', () => {
    // common practice (no source): a view with nothing to show is not offered
    for (const f of ['demo-ipm-traction.json', 'demo-servo-axis.json', 'demo-spm-48v.json']) expect(fluxMapOf(demo(f)), f).toBeNull();
    expect(fluxMapOf(null)).toBeNull();
  });

  it('a project with motor.fluxMap is found; a malformed map is not taken for one', () => {
    // common practice (no source): the guard checks the shape the file format states (issue 11)
    const { project, map } = withConstantMap(demo('demo-ipm-traction.json'));
    expect(fluxMapOf(project)).toBe(map);
    expect(isFluxMapData({ ...map, psid_Wb: map.psid_Wb.slice(1) })).toBe(false);
    expect(isFluxMapData({ ...map, psiq_Wb: map.psiq_Wb.map((r, i) => (i === 2 ? r.slice(1) : r)) })).toBe(false);
    expect(isFluxMapData({ ...map, id_A: [0] , psid_Wb: [map.psid_Wb[0]], psiq_Wb: [map.psiq_Wb[0]] })).toBe(false);
    expect(isFluxMapData({ ...map, iq_A: map.iq_A.map((x, i) => (i === 1 ? Number.NaN : x)) })).toBe(false);
    expect(isFluxMapData({ ...map, magnetTemp_C: undefined })).toBe(false);
  });
});

describe('the flux-map figures of a map tabulated from constant Ld, Lq, psiM', () => {
  const { project, map } = withConstantMap(demo('demo-ipm-traction.json'));
  const h = project.hot;
  const c = fluxMapCurves(project.models.hot, project.peak.Imax);
  const figs = fluxMapFigures(c, map, theme, CURVE.light);
  const title = (a: unknown): string => ((a as { title: { text: string } }).title.text);

  it('psi_d against id: one straight line of slope Ld per q current, in mWb, axes labelled with units', () => {
    // Krause, Wasynczuk and Sudhoff (2002), Analysis of Electric Machinery and Drive Systems, ch. 5: psi_d = Ld id + psiM
    const f = figs.psid;
    expect(title(f.layout.xaxis)).toBe('id, A peak');
    expect(title(f.layout.yaxis)).toBe('ψd, mWb peak');
    expect(f.data.length).toBe(5);
    f.data.forEach((tr, i) => {
      const t = tr as { x: number[]; y: number[]; name: string; line: { color: string } };
      expect(t.line.color).toBe(familyColours(CURVE.light)[i]);
      expect(t.name).toBe(`iq = ${Number((0.25 * i * project.peak.Imax).toPrecision(3))} A`);
      for (let k = 1; k < t.x.length; k++) expect((t.y[k]! - t.y[0]!) / (t.x[k]! - t.x[0]!)).toBeCloseTo(h.Ld * 1e3, 9);
      expect(t.y[30]!).toBeCloseTo(h.psiM * 1e3, 9); // id = 0 at the middle of 61 points
    });
  });

  it('psi_q against iq: straight lines of slope Lq through zero at every d current', () => {
    // same source: psi_q = Lq iq
    const f = figs.psiq;
    expect(title(f.layout.xaxis)).toBe('iq, A peak');
    expect(title(f.layout.yaxis)).toBe('ψq, mWb peak');
    for (const tr of f.data) {
      const t = tr as { x: number[]; y: number[] };
      t.x.forEach((iq, k) => expect(t.y[k]).toBeCloseTo(h.Lq * iq * 1e3, 9));
    }
  });

  it('inductances along MTPA are flat at Ld and Lq (mH), apparent on incremental, the cross term zero', () => {
    // same source: constant parameters
    const f = figs.inductance;
    expect(title(f.layout.xaxis)).toBe('current |i| along MTPA, A peak');
    expect(title(f.layout.yaxis)).toBe('inductance, mH');
    const byName = Object.fromEntries(f.data.map((tr) => [(tr as { name: string }).name, (tr as { y: number[] }).y]));
    for (const [n, v] of [['Ld apparent', h.Ld], ['Ld incremental', h.Ld], ['Lq apparent', h.Lq], ['Lq incremental', h.Lq], ['Ldq incremental (cross)', 0]] as const) {
      for (const y of byName[n]!) expect(y).toBeCloseTo(v * 1e3, 9);
    }
    const rows = inductanceRows(c);
    expect(rows.map((r) => r.label)).toEqual(['Ld apparent', 'Ld incremental', 'Lq apparent', 'Lq incremental']);
    expect(Number(rows[0]!.at0)).toBeCloseTo(h.Ld * 1e3, 2);
    expect(Number(rows[3]!.atPeak)).toBeCloseTo(h.Lq * 1e3, 2);
  });

  it('the plane: torque contours, the current limit, the MTPA of the closed form and the map points inside the view', () => {
    // Morimoto, Takeda, Hirasa, Taniguchi (1990), IEEE Trans. Ind. Appl. 26(5): MTPA id = (psiM - sqrt(psiM² + 8 (Lq-Ld)² I²)) / (4 (Lq-Ld))
    const f = figs.plane;
    expect(title(f.layout.xaxis)).toBe('id, A peak');
    expect(title(f.layout.yaxis)).toBe('iq, A peak');
    const names = f.data.map((tr) => (tr as { name: string }).name);
    expect(names).toEqual(['map points', 'constant torque, N·m', `|i| = ${Number(project.peak.Imax.toPrecision(3))} A peak`, 'MTPA']);
    const mtpa = f.data[3] as { x: number[]; y: number[]; line: { color: string } };
    expect(mtpa.line.color).toBe(CURVE.light.mtpa);
    const I = project.peak.Imax, dL = h.Lq - h.Ld;
    const id = (h.psiM - Math.sqrt(h.psiM ** 2 + 8 * dL * dL * I * I)) / (4 * dL);
    expect(mtpa.x.at(-1)!).toBeCloseTo(id, 4);
    expect(mtpa.y.at(-1)!).toBeCloseTo(Math.sqrt(I * I - id * id), 4);
    const pts = f.data[0] as { x: number[]; y: number[] };
    for (let k = 0; k < pts.x.length; k++) {
      expect(pts.x[k]!).toBeGreaterThanOrEqual(-I);
      expect(pts.x[k]!).toBeLessThanOrEqual(0.25 * I);
      expect(pts.y[k]!).toBeLessThanOrEqual(I);
    }
    expect(pts.x.length).toBeGreaterThan(0);
  });
});

describe('the envelope view current plane through the model', () => {
  it('a constant map draws the same MTPA, MTPV and voltage limits as the constant machine', () => {
    // common practice (no source): a map tabulated from constant Ld, Lq, psiM is the same machine,
    // and the generic (numeric) solvers agree with the closed forms
    const p = demo('demo-ipm-traction.json');
    const { project } = withConstantMap(p);
    const w0 = 300;
    const speeds = [2000, 5000];
    const mtpv = Array.from({ length: 6 }, (_, k) => w0 * Math.pow(4, k / 5));
    const a = planeCurves(p.models.hot, p.peak.Vmax, p.peak.Imax, speeds, mtpv);
    const b = planeCurves(project.models.hot, p.peak.Vmax, p.peak.Imax, speeds, mtpv);
    const tol = 1e-6 * p.peak.Imax;
    a.mtpa.id.forEach((x, k) => {
      expect(Math.abs(b.mtpa.id[k]! - x)).toBeLessThan(tol);
      expect(Math.abs(b.mtpa.iq[k]! - a.mtpa.iq[k]!)).toBeLessThan(tol);
    });
    expect(b.mtpv.id.length).toBe(a.mtpv.id.length);
    a.mtpv.id.forEach((x, k) => expect(Math.abs(b.mtpv.id[k]! - x)).toBeLessThan(1e-4 * p.peak.Imax));
    a.ellipses.forEach((el, e) => el.id.forEach((x, k) => {
      expect(Math.abs(b.ellipses[e]!.id[k]! - x)).toBeLessThan(tol);
      expect(Math.abs(b.ellipses[e]!.iq[k]! - el.iq[k]!)).toBeLessThan(tol);
    }));
  });
});

describe('the envelope view current plane of a saturating map', () => {
  // An invented saturating machine (not a product's data): psi_d = psiM + Ld id, psi_q = Lq0 b tanh(iq / b),
  // tabulated on a 41 x 41 grid of iq >= 0 (a q axis that saturates: common practice (no source)).
  const p = demo('demo-ipm-traction.json');
  const h = p.hot, I = p.peak.Imax, b = 0.6 * I;
  const ids = Array.from({ length: 41 }, (_, k) => -2 * I + (2.5 * I * k) / 40);
  const iqs = Array.from({ length: 41 }, (_, k) => (2 * I * k) / 40);
  const map: FluxMapData = {
    magnetTemp_C: 20, id_A: ids, iq_A: iqs,
    psid_Wb: ids.map((id) => iqs.map(() => h.psiM + h.Ld * id)),
    psiq_Wb: ids.map(() => iqs.map((iq) => h.Lq * b * Math.tanh(iq / b))),
  };
  const sat = new FluxMapModel(map, h.polePairs, h.Rs);
  const T0 = 0.8 * sat.torque(-0.3 * I, 0.9 * I);
  const pc = planeCurves(sat, p.peak.Vmax, I, [3000, 6000], [400, 800], { torques: [0.5 * T0, T0], lo: -1.2 * I, hi: 0.25 * I, span: 1.2 * I });

  it('every voltage-limit point has |v| = Vmax and every constant-torque point the torque asked for, on the model', () => {
    // steady state, motor reference direction (Krause, Wasynczuk and Sudhoff (2002), ch. 5): vd = Rs id - we psi_q, vq = Rs iq + we psi_d
    const v = new Float64Array(2);
    for (const el of pc.ellipses) {
      const we = h.polePairs * el.speed_rpm * (Math.PI / 30);
      let found = 0;
      el.id.forEach((id, k) => {
        if (Number.isNaN(id)) return;
        found++;
        sat.steadyVoltage(id, el.iq[k]!, we, v);
        expect(Math.hypot(v[0]!, v[1]!) / p.peak.Vmax).toBeCloseTo(1, 9);
      });
      expect(found).toBeGreaterThan(170);
    }
    for (const line of pc.torque) {
      let found = 0;
      line.id.forEach((id, k) => {
        if (id === null) return;
        found++;
        expect(sat.torque(id, line.iq[k]!) / line.T).toBeCloseTo(1, 9);
      });
      expect(found).toBeGreaterThan(20);
    }
  });

  it('the saturated q axis needs more q current for the same torque than the zero-current terms say', () => {
    // the apparent Lq at iq falls below Lq (tanh(x) < x): a constant-parameter machine overstates the torque per ampere
    const lin = planeCurves(p.models.hot, p.peak.Vmax, I, [], [], { torques: [T0], lo: -1.2 * I, hi: 0.25 * I, span: 1.2 * I });
    const k = 60; // id = -1.2 I + 0.5 (1.45 I) = -0.475 I
    expect(lin.torque[0]!.iq[k]).not.toBeNull();
    expect(pc.torque[1]!.iq[k]!).toBeGreaterThan(lin.torque[0]!.iq[k]! * 1.02);
  });
});
