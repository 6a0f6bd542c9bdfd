// The controller's and the scenario's fields of the input side.
import { BoolField, NumField, Rows, SelectField } from './Inputs';

export function ControlFields() {
  return (
    <>
      <SelectField
        path="control.mode"
        label="Mode"
        optional
        options={[
          ['speed', 'speed control'],
          ['torque', 'torque control'],
          ['current-step', 'current step, locked rotor'],
        ]}
      />
      <NumField path="control.fCtrl_Hz" label="Control rate" unit="Hz" optional placeholder="10000" />
      <NumField path="control.delaySamples" label="Delay" unit="periods" optional placeholder="1" />
      <NumField path="control.currentBandwidth_Hz" label="Current bandwidth" unit="Hz" optional />
      <NumField path="control.currentKp" label="  or current Kp" unit="V/A" optional />
      <NumField path="control.currentKi" label="  and Ki" unit="V/(A·s)" optional />
      <NumField path="control.speedBandwidth_Hz" label="Speed bandwidth" unit="Hz" optional />
      <NumField path="control.speedKp" label="  or speed Kp" unit="N·m·s/rad" optional />
      <NumField path="control.speedKi" label="  and Ki" unit="N·m/rad" optional />
      <SelectField
        path="control.speedTuning.method"
        label="Speed tuning"
        optional
        options={[
          ['symmetric-optimum', 'symmetric optimum'],
          ['bandwidth', 'from bandwidth'],
        ]}
      />
      <NumField path="control.speedTuning.a" label="  spacing a" unit="–" optional placeholder="2" />
      <SelectField
        path="control.antiWindup"
        label="Anti-windup"
        optional
        options={[
          ['clamping', 'clamping'],
          ['back-calculation', 'back-calculation'],
        ]}
      />
      <BoolField path="control.decoupling" label="Decoupling + EMF feed-fwd" />
      <BoolField path="control.speedPrefilter" label="Speed reference prefilter" />
      <NumField path="control.speedRamp_rpm_per_s" label="Speed ramp" unit="rpm/s" optional placeholder="none" />
      <NumField path="control.speedLoopDivider" label="Speed loop every" unit="periods" optional placeholder="1" />
    </>
  );
}

export function ScenarioFields() {
  return (
    <>
      <NumField path="scenario.duration_s" label="Duration" unit="s" />
      <NumField path="scenario.initialSpeed_rpm" label="Initial speed" unit="rpm" optional placeholder="0" />
      <NumField path="scenario.loadInertia" label="Load inertia" unit="kg·m²" optional placeholder="0" />
      <div className="label" style={{ margin: '6px 0 2px', fontSize: 12 }}>Speed reference steps</div>
      <Rows
        path="scenario.speedSteps"
        columns={[
          { key: 't_s', label: 't, s' },
          { key: 'speed_rpm', label: 'speed, rpm' },
        ]}
        blank={{ t_s: 0, speed_rpm: 1000 }}
        addLabel="speed step"
      />
      <div className="label" style={{ margin: '6px 0 2px', fontSize: 12 }}>Load torque steps</div>
      <Rows
        path="scenario.loadSteps"
        columns={[
          { key: 't_s', label: 't, s' },
          { key: 'torque_Nm', label: 'load, N·m' },
        ]}
        blank={{ t_s: 0, torque_Nm: 1 }}
        addLabel="load step"
      />
      <div className="label" style={{ margin: '6px 0 2px', fontSize: 12 }}>Torque reference steps (torque mode)</div>
      <Rows
        path="scenario.torqueSteps"
        columns={[
          { key: 't_s', label: 't, s' },
          { key: 'torque_Nm', label: 'torque, N·m' },
        ]}
        blank={{ t_s: 0, torque_Nm: 1 }}
        addLabel="torque step"
      />
    </>
  );
}
