// The sections of the input side, laid out from the project schema's keys (units from KEYS);
// losses, thermal network and duty cycle in their own files.
import { describeLimits } from '../../../../core/drive/current-limits';
import { memo, type ReactNode } from 'react';
import type { ResolvedProject } from '../../../../core/project/project';
import { deriveConstants } from '../../../../core/machine/nameplate';
import type { Draft, Json } from '../../state/draft';
import { editSubtree, getAt } from '../../state/draft';
import { HINTS, NumField, Rows, SelectField, TakenAs, unitOf } from './Inputs';
import { Optional } from './OptionalPart';
import { ControlFields, ScenarioFields } from './ControlScenarioFields';
import { LossesSection } from './LossesSection';
import { ThermalSection } from './ThermalSection';
import { DutyCycleSection } from './DutyCycleSection';
import { Section } from '../../components/Section';
import { useFormStore, useFormValue } from '../../state/form-store';
import { num } from '../../components/format';

type Mode = 'model' | 'datasheet';
const motorMode = (tree: Json): Mode => (getAt(tree, 'nameplate') !== undefined ? 'datasheet' : 'model');

/** A nameplate from model terms, so the user can switch to datasheet entry and keep the motor. */
function nameplateFromModel(m: Record<string, Json>): Json {
  const pp = typeof m.polePairs === 'number' ? m.polePairs : 1;
  const psi = typeof m.psiM === 'number' ? m.psiM : 0.01;
  const c = deriveConstants({ polePairs: pp, Rs: 1, Ld: 1, Lq: 1, psiM: psi });
  const np: Record<string, Json> = {
    poles: 2 * pp,
    R: { value: m.Rs ?? 0.1, basis: 'phase', temp_C: 20 },
    Ld: { value: m.Ld ?? 1e-3, basis: 'phase' },
    Lq: { value: m.Lq ?? m.Ld ?? 1e-3, basis: 'phase' },
    Ke: { value: Number(c.Ke_VLLrms_per_krpm.toPrecision(6)), unit: 'V_LL_rms/krpm', temp_C: 20 },
    inertia: m.inertia ?? 1e-3,
  };
  if (m.viscousFriction !== undefined) np.viscousFriction = m.viscousFriction;
  if (m.coulombFriction !== undefined) np.coulombFriction = m.coulombFriction;
  return np;
}

function modelFromResolved(p: ResolvedProject | null, tree: Json): Json {
  const np = (getAt(tree, 'nameplate') ?? {}) as Record<string, Json>;
  const m = p?.machine20;
  const mech = p?.mechanics;
  return {
    polePairs: m?.polePairs ?? (typeof np.poles === 'number' ? np.poles / 2 : 1),
    Rs: m ? Number(m.Rs.toPrecision(6)) : 0.1,
    Ld: m ? Number(m.Ld.toPrecision(6)) : 1e-3,
    Lq: m ? Number(m.Lq.toPrecision(6)) : 1e-3,
    psiM: m ? Number(m.psiM.toPrecision(6)) : 0.01,
    inertia: mech?.inertia ?? (np.inertia as number) ?? 1e-3,
    viscousFriction: mech?.viscousFriction ?? 0,
    coulombFriction: mech?.coulombFriction ?? 0,
  };
}

function switchMode(d: Draft, to: Mode, resolved: ResolvedProject | null): Draft {
  if (to === 'datasheet') {
    const m = (getAt(d.tree, 'motor') ?? {}) as Record<string, Json>;
    const next = editSubtree(d, 'motor', undefined);
    return editSubtree(next, 'nameplate', nameplateFromModel(m));
  }
  const model = modelFromResolved(resolved, d.tree);
  const next = editSubtree(d, 'nameplate', undefined);
  return editSubtree(next, 'motor', model);
}

const BASIS: Array<[string, string]> = [
  ['phase', 'per phase'],
  ['line-to-line', 'line-to-line'],
];
const CURRENT_BASIS: Array<[string, string]> = [
  ['rms', 'rms'],
  ['peak', 'peak'],
];

function useCurrentHint(path: string) {
  const b = useFormValue((d) => getAt(d.tree, path + '.basis'));
  return b === 'rms' ? HINTS.peakOfRms : HINTS.rmsOfPeak;
}

function NameplateFields() {
  const surface = useFormValue((d) => getAt(d.tree, 'nameplate.L') !== undefined);
  const ratedHint = useCurrentHint('nameplate.ratedCurrent');
  const peakHint = useCurrentHint('nameplate.peakCurrent');
  return (
    <>
      <NumField path="nameplate.poles" label="Poles" unit="poles" hint={(v) => `= ${num(v / 2)} pole pairs`} />
      <NumField path="nameplate.R.value" label="Resistance" unit="Ω" hint={HINTS.mOhm} />
      <SelectField path="nameplate.R.basis" label="  measured" options={BASIS} />
      <NumField path="nameplate.R.temp_C" label="  at" unit="°C" optional placeholder="20" />
      {surface ? (
        <>
          <NumField path="nameplate.L.value" label="Inductance L" unit="H" hint={HINTS.mH} />
          <SelectField path="nameplate.L.basis" label="  measured" options={BASIS} />
        </>
      ) : (
        <>
          <NumField path="nameplate.Ld.value" label="Ld" unit="H" hint={HINTS.mH} />
          <SelectField path="nameplate.Ld.basis" label="  measured" options={BASIS} />
          <NumField path="nameplate.Lq.value" label="Lq" unit="H" hint={HINTS.mH} />
          <SelectField path="nameplate.Lq.basis" label="  measured" options={BASIS} />
        </>
      )}
      <Optional path="nameplate.Ke" label="Back-EMF constant Ke" blank={{ value: 10, unit: 'V_LL_rms/krpm' }}>
        <NumField path="nameplate.Ke.value" label="Ke" unit="(unit below)" />
        <SelectField
          path="nameplate.Ke.unit"
          label="  unit"
          options={[
            ['V_LL_rms/krpm', 'V line-line rms / 1000 rpm'],
            ['V_LL_peak/krpm', 'V line-line peak / 1000 rpm'],
            ['V_ph_peak*s/rad', 'V phase peak · s / rad (elec.)'],
          ]}
        />
        <NumField path="nameplate.Ke.temp_C" label="  at" unit="°C" optional placeholder="20" />
      </Optional>
      <Optional path="nameplate.Kt" label="Torque constant Kt" blank={{ value: 1, unit: 'Nm/A_rms' }}>
        <NumField path="nameplate.Kt.value" label="Kt" unit="(unit below)" />
        <SelectField
          path="nameplate.Kt.unit"
          label="  unit"
          options={[
            ['Nm/A_rms', 'N·m per A rms'],
            ['Nm/A_peak', 'N·m per A peak'],
          ]}
        />
      </Optional>
      <Optional path="nameplate.ratedCurrent" label="Rated current" blank={{ value: 10, basis: 'rms' }}>
        <NumField path="nameplate.ratedCurrent.value" label="Rated current" unit="A" hint={ratedHint} />
        <SelectField path="nameplate.ratedCurrent.basis" label="  given as" options={CURRENT_BASIS} />
      </Optional>
      <Optional path="nameplate.peakCurrent" label="Peak current" blank={{ value: 30, basis: 'rms' }}>
        <NumField path="nameplate.peakCurrent.value" label="Peak current" unit="A" hint={peakHint} />
        <SelectField path="nameplate.peakCurrent.basis" label="  given as" options={CURRENT_BASIS} />
      </Optional>
      <NumField path="nameplate.ratedSpeed_rpm" label="Rated speed" unit="rpm" optional />
      <NumField path="nameplate.ratedTorque_Nm" label="Rated torque" unit="N·m" optional />
      <NumField path="nameplate.maxSpeed_rpm" label="Max speed" unit="rpm" optional />
      <NumField path="nameplate.inertia" label="Rotor inertia" unit="kg·m²" hint={HINTS.kgcm2} />
      <NumField path="nameplate.viscousFriction" label="Viscous friction" unit="N·m·s/rad" optional />
      <NumField path="nameplate.coulombFriction" label="Coulomb friction" unit="N·m" optional />
    </>
  );
}

/** A flux map's grid size and magnet temperature, as text (null without a map). */
function mapSummary(tree: Json): string | null {
  const m = getAt(tree, 'motor.fluxMap') as { id_A?: unknown; iq_A?: unknown; magnetTemp_C?: unknown } | undefined;
  if (!m || typeof m !== 'object') return null;
  const n = (x: unknown): number => (Array.isArray(x) ? x.length : 0);
  return `${n(m.id_A)} × ${n(m.iq_A)} points, magnet at ${typeof m.magnetTemp_C === 'number' ? m.magnetTemp_C : '?'} °C`;
}

function ModelFields() {
  const map = useFormValue((d) => mapSummary(d.tree));
  return (
    <>
      <NumField path="motor.polePairs" label="Pole pairs p" unit="pairs" hint={(v) => `= ${num(2 * v)} poles`} />
      <NumField path="motor.Rs" label="Rs (20 °C)" unit="Ω/phase" hint={HINTS.mOhm} />
      {map !== null ? (
        <div className="hint" style={{ fontSize: 12, margin: '4px 0 6px' }} data-testid="flux-map-given">
          Ld, Lq and ψm: from the flux map ({map}), kept as the file gives it; its curves are in the Flux map tab. Import another with the command line's import-flux-map.
        </div>
      ) : (
        <>
          <NumField path="motor.Ld" label="Ld" unit="H" hint={HINTS.mH} />
          <NumField path="motor.Lq" label="Lq" unit="H" hint={HINTS.mH} />
          <NumField path="motor.psiM" label="ψm (20 °C)" unit="Wb peak" hint={HINTS.mWb} />
        </>
      )}
      <NumField path="motor.inertia" label="Rotor inertia" unit="kg·m²" hint={HINTS.kgcm2} />
      <NumField path="motor.viscousFriction" label="Viscous friction" unit="N·m·s/rad" optional />
      <NumField path="motor.coulombFriction" label="Coulomb friction" unit="N·m" optional />
      <NumField path="motor.ratedCurrent" label="Rated current" unit={unitOf('motor.ratedCurrent')} optional hint={HINTS.rmsOfPeak} />
      <NumField path="motor.peakCurrent" label="Peak current" unit={unitOf('motor.peakCurrent')} optional hint={HINTS.rmsOfPeak} />
    </>
  );
}

function DerivedModel({ p }: { p: ResolvedProject | null }) {
  if (!p) return null;
  const m = p.machine20;
  const c = deriveConstants(m);
  return (
    <div className="hint" style={{ fontSize: 12, marginTop: 6 }} data-testid="derived-model">
      <strong>{p.models.at20.linear === null ? 'dq terms at zero current, from the flux map (20 °C):' : 'dq model at 20 °C:'}</strong> p = {m.polePairs}, Rs = {num(m.Rs * 1e3)} mΩ, Ld = {num(m.Ld * 1e3)} mH, Lq = {num(m.Lq * 1e3)} mH,
      ψm = {num(m.psiM * 1e3)} mWb; Kt = {num(c.Kt_Nm_per_Arms)} N·m/A rms ({num(c.Kt_Nm_per_Apeak)} N·m/A peak), Ke = {num(c.Ke_VLLrms_per_krpm)} V
      line-line rms per 1000 rpm
    </div>
  );
}

export const InputPanel = memo(function InputPanel({ resolved, marks }: { resolved: ResolvedProject | null; marks: ReactNode[] }) {
  const store = useFormStore();
  const mode = useFormValue((d) => motorMode(d.tree));
  const control = useFormValue((d) => getAt(d.tree, 'control') !== undefined);
  const scenario = useFormValue((d) => getAt(d.tree, 'scenario') !== undefined);
  return (
    <>
      <Section
        title="Motor"
        testId="sec-motor"
        right={
          <span className="seg" role="group" aria-label="Motor entered as">
            {(['model', 'datasheet'] as const).map((m) => (
              <button
                key={m}
                aria-pressed={mode === m}
                data-testid={`motor-mode-${m}`}
                onClick={() => mode !== m && store.update((d) => switchMode(d, m, resolved))}
              >
                {m === 'model' ? 'model terms' : 'datasheet terms'}
              </button>
            ))}
          </span>
        }
      >
        {mode === 'datasheet' ? <NameplateFields /> : <ModelFields />}
        <DerivedModel p={resolved} />
        {resolved && <TakenAs items={resolved.interpretation} />}
      </Section>

      <Section title="Inverter" testId="sec-inverter">
        <NumField path="inverter.Vdc" label="DC bus Vdc" unit="V" />
        <NumField path="inverter.Imax" label="Peak current Imax" unit={unitOf('inverter.Imax')} hint={HINTS.rmsOfPeak} />
        <NumField path="inverter.Icont" label="Continuous Icont" unit={unitOf('inverter.Icont')} hint={HINTS.rmsOfPeak} />
        <SelectField
          path="inverter.modulation"
          label="Modulation"
          optional
          options={[
            ['sinusoidal', 'sinusoidal PWM (Vdc/2)'],
            ['svpwm', 'SVPWM linear (Vdc/√3)'],
            ['six-step', 'six-step (2·Vdc/π)'],
          ]}
        />
        <NumField path="inverter.voltageUtilization" label="Voltage utilisation" unit="0..1" optional placeholder="1" hint={HINTS.pct} />
        <NumField path="inverter.deviceDrop" label="Device drop" unit="V/device" optional placeholder="0" />
        {resolved && (
          <div className="hint" style={{ fontSize: 12 }}>
            Vmax = {num(resolved.peak.Vmax)} V peak phase ({num(resolved.peak.Vmax * Math.sqrt(1.5))} V line-line rms)
            <br />
            <span data-testid="current-limits">{describeLimits(resolved.currentLimits)}</span>
          </div>
        )}
      </Section>

      <Section title="Temperatures" testId="sec-temps">
        <NumField path="conditions.windingTemp_C" label="Winding, hot" unit="°C" optional placeholder="20" />
        <NumField path="conditions.magnetTemp_C" label="Magnet, hot" unit="°C" optional placeholder="20" />
        <NumField path="conditions.coldTemp_C" label="Cold corner" unit="°C" optional placeholder="20" />
        <NumField path="conditions.magnetTempCoeff" label="Remanence coeff." unit="1/K" optional placeholder="-0.0012" hint={HINTS.perK} />
      </Section>

      <Section title="Control" testId="sec-control">
        {!control ? (
          <button className="btn small" onClick={() => store.update((d) => editSubtree(d, 'control', { mode: 'speed', currentBandwidth_Hz: 1000, speedBandwidth_Hz: 50 }))}>
            + add a controller
          </button>
        ) : (
          <ControlFields />
        )}
      </Section>

      <Section title="Scenario" testId="sec-scenario">
        {!scenario ? (
          <button
            className="btn small"
            onClick={() =>
              store.update((d) =>
                editSubtree(d, 'scenario', { duration_s: 0.5, speedSteps: [{ t_s: 0.01, speed_rpm: 1000 }], loadSteps: [{ t_s: 0.25, torque_Nm: 1 }] }),
              )
            }
          >
            + add a scenario
          </button>
        ) : (
          <ScenarioFields />
        )}
      </Section>

      <Section title="Requirement points" testId="sec-requirements">
        <Rows
          path="requirements"
          columns={[
            { key: 'label', label: 'label', kind: 'text' },
            { key: 'speed_rpm', label: 'speed, rpm' },
            { key: 'torque_Nm', label: 'torque, N·m' },
            { key: 'duty', label: 'duty', kind: 'select', options: [['peak', 'peak'], ['continuous', 'continuous']] },
          ]}
          blank={{ label: 'new point', speed_rpm: 1000, torque_Nm: 1 }}
          addLabel="requirement point"
          marks={marks}
        />
      </Section>

      <LossesSection psiM={resolved ? resolved.machine20.psiM : null} />
      <ThermalSection />
      <DutyCycleSection />
    </>
  );
});
