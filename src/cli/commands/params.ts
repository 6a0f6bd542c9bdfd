import type { Command } from '../command';
import { deriveConstants } from '../../core/machine/nameplate';
import { safetyReport } from '../../core/steady-state/safety';
import { projectSpeedRange } from '../../core/reports/speed-range';
import { table, fmt } from '../table';
import { peakToRms, radSToRpm } from '../../core/base/units';
import { describeLimit } from '../../core/drive/current-limits';
import { fieldPhrase, findingLine } from '../../core/reports/phrases';
import { mapInductances } from '../../core/project/flux-map-resolve';

export const paramsCommand: Command = {
  name: 'params',
  summary: 'derived dq model (20 °C, hot, cold), what each input was taken to mean, findings',
  usage: 'params <project.json> [--json]',
  flags: {},
  run(p) {
    const corners = { '20C': p.machine20, hot: p.hot, cold: p.cold };
    const derived = Object.fromEntries(Object.entries(corners).map(([k, m]) => [k, { model: m, ...deriveConstants(m) }]));
    // Rs = 0 (lossless winding): the electrical time constants are unbounded; the document says null
    const tau = (x: number): number | null => (Number.isFinite(x) ? x : null);
    const jsonCorner = (k: string) => ({ ...derived[k]!, tauD_s: tau(derived[k]!.tauD_s), tauQ_s: tau(derived[k]!.tauQ_s) });
    const { safetySpeed } = projectSpeedRange(p);
    const safety = safetyReport(p.models.cold, p.inverter, safetySpeed, p.rated.maxSpeed_rad_s !== undefined);
    const findings = [...p.findings, ...safety.findings];
    // a flux-map motor: its inductances at zero and at the peak current (20 °C; the magnet's shift leaves them as they are)
    const map = p.file.motor?.fluxMap !== undefined ? mapInductances(p.models.at20, p.peak.Imax) : null;
    const json = {
      name: p.name,
      model: p.machine20,
      mechanics: p.mechanics,
      hot: jsonCorner('hot'),
      cold: jsonCorner('cold'),
      at20C: jsonCorner('20C'),
      conditions: p.conditions,
      limits: { peak: p.peak, continuous: p.continuous },
      // the effective current limits (the weaker of motor and inverter) and which rating binds each
      currentLimits: p.currentLimits,
      interpretation: p.interpretation,
      safety,
      findings,
      ...(map ? { fluxMapInductances: map } : {}),
    };
    const rows: Array<[string, string, ...Array<number | string>]> = [];
    const d = derived as Record<string, ReturnType<typeof deriveConstants> & { model: typeof p.hot }>;
    const shown = (x: number): number | string => (Number.isFinite(x) ? x : 'unbounded (Rs = 0)');
    const add = (label: string, unit: string, f: (x: ReturnType<typeof deriveConstants> & { model: typeof p.hot }) => number) =>
      rows.push([label, unit, shown(f(d['20C']!)), shown(f(d['cold']!)), shown(f(d['hot']!))]);
    add('pole pairs', '-', (x) => x.model.polePairs);
    add('Rs', 'ohm/phase', (x) => x.model.Rs);
    add('Ld', 'mH', (x) => x.model.Ld * 1e3);
    add('Lq', 'mH', (x) => x.model.Lq * 1e3);
    add('psiM', 'mWb peak', (x) => x.model.psiM * 1e3);
    add('Kt', 'N·m/A peak', (x) => x.Kt_Nm_per_Apeak);
    add('Kt', 'N·m/A rms', (x) => x.Kt_Nm_per_Arms);
    add('Ke', 'V LL rms/krpm', (x) => x.Ke_VLLrms_per_krpm);
    add('char. current', 'A peak', (x) => x.characteristicCurrent_A);
    add('char. current', 'A rms', (x) => peakToRms(x.characteristicCurrent_A));
    add('saliency Lq/Ld', '-', (x) => x.saliency);
    add('tau_d', 'ms', (x) => x.tauD_s * 1e3);
    add('tau_q', 'ms', (x) => x.tauQ_s * 1e3);
    const lines = [
      `${p.name}`,
      '',
      ...table(['quantity', 'unit', '20 °C', `cold ${p.conditions.coldTemp_C} °C`, `hot ${p.conditions.windingTemp_C}/${p.conditions.magnetTemp_C} °C`], rows),
      '',
      `limits: Vmax ${fmt(p.peak.Vmax)} V peak phase (${p.inverter.modulation}, Vdc ${fmt(p.inverter.Vdc)} V); ` +
        `current ${describeLimit('peak', p.currentLimits.peak)}, ${describeLimit('continuous', p.currentLimits.continuous)}`,
      `  (inverter Imax ${fmt(p.inverter.Imax)} A peak, Icont ${fmt(p.inverter.Icont)} A peak` +
        `${p.currentLimits.peak.motor_A !== undefined ? `; motor peak ${fmt(p.currentLimits.peak.motor_A)} A peak` : ''}` +
        `${p.currentLimits.continuous.motor_A !== undefined ? `; motor rated ${fmt(p.currentLimits.continuous.motor_A)} A peak` : ''})`,
      ...(map
        ? [
            '',
            'flux map inductances (20 °C; apparent = flux / current from the flux at zero current, incremental = d flux / d current):',
            ...table(['axis', 'current A peak', 'apparent mH', 'incremental mH'], [
              ...map.d.map((x): [string, number, number, number] => ['d', x.current_A, x.apparent_H * 1e3, x.incremental_H * 1e3]),
              ...map.q.map((x): [string, number, number, number] => ['q', x.current_A, x.apparent_H * 1e3, x.incremental_H * 1e3]),
            ]),
          ]
        : []),
      '',
      'inputs taken to mean:',
      ...(p.interpretation.length ? p.interpretation.map((i) => `  ${fieldPhrase(i.field)}: ${i.given} -> ${i.takenAs}`) : [p.file.motor?.fluxMap !== undefined ? '  (flux map given directly)' : '  (model terms given directly)']),
      '',
      `safety: open-circuit back-EMF ${fmt(safety.backEmfLineLinePeak_V)} V LL peak at ${fmt(radSToRpm(safetySpeed))} rpm (cold magnet) vs Vdc ${fmt(p.inverter.Vdc)} V; ` +
        `uncontrolled-generator speed ${safety.uncontrolledGeneratorSpeed_rad_s === null ? 'none (no magnet flux)' : fmt(radSToRpm(safety.uncontrolledGeneratorSpeed_rad_s)) + ' rpm'}`,
      '',
      'findings:',
      ...(findings.length ? findings.map((f) => `  ${findingLine(f)}`) : ['  none']),
      '',
      safety.caution,
    ];
    return { json, lines };
  },
};
