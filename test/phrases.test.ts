import { describe, expect, it } from 'vitest';
import { fieldPhrase, findingLine, limitPhrase, notReachablePhrase, plainMessage, regionPhrase, severityPhrase } from '../src/core/reports/phrases';
import { KEYS } from '../src/core/project/schema';

describe('plain phrases for codes and paths', () => {
  it('limits and regions in words, never the code', () => {
    expect(limitPhrase('beyond-mtpv')).toBe('beyond the maximum-torque-per-volt limit');
    expect(limitPhrase('current-and-voltage')).toBe('both the current and the voltage limit');
    expect(notReachablePhrase('beyond-mtpv')).toBe('not reachable: beyond the maximum-torque-per-volt limit');
    expect(notReachablePhrase('voltage')).toBe('not reachable: held by the voltage limit');
    expect(regionPhrase('field-weakening')).toBe('field weakening');
    expect(regionPhrase('mtpv')).toBe('maximum torque per volt (MTPV)');
    expect(severityPhrase('warning')).toBe('caution');
    for (const c of ['none', 'current', 'voltage', 'current-and-voltage', 'beyond-mtpv']) expect(limitPhrase(c)).not.toContain('-mtpv');
  });

  it('project paths as the input they name', () => {
    expect(fieldPhrase('inverter.Imax')).toBe('inverter peak current');
    expect(fieldPhrase('nameplate.Kt')).toBe('torque constant Kt');
    expect(fieldPhrase('nameplate.Ke.temp_C')).toBe('back-EMF constant Ke temperature');
    expect(fieldPhrase('nameplate.R.value')).toBe('winding resistance');
    expect(fieldPhrase('requirements.2.speed_rpm')).toBe('requirement point 3 speed');
    expect(fieldPhrase('scenario.loadSteps.0.torque_Nm')).toBe('load torque step 1 torque');
    expect(fieldPhrase('losses.inverter.EonEoff_J')).toBe('switch turn-on and turn-off energy');
    expect(fieldPhrase('losses.iron.kh')).toBe('iron hysteresis loss coefficient');
    expect(fieldPhrase('losses.windage')).toBe('motor windage');
    expect(fieldPhrase('no.such.path')).toBe('no.such.path');
    // every schema key (lists written with []) has words: no dotted path is left on a screen
    for (const k of Object.keys(KEYS)) {
      const p = k.replace(/\[\]/g, '.0');
      expect(fieldPhrase(p), k).not.toMatch(/\.[A-Za-z]/);
    }
  });

  it('messages and finding lines lose their paths', () => {
    expect(plainMessage("Limit inverter.Imax to the motor's peak current")).toBe("Limit the inverter peak current to the motor's peak current");
    expect(plainMessage('lower the gains or raise control.fCtrl_Hz')).toBe('lower the gains or raise the control rate');
    expect(plainMessage('psiM = 0: reluctance machine')).toBe('psiM = 0: reluctance machine');
    expect(findingLine({ severity: 'danger', field: 'inverter.Imax', message: 'too high.' })).toBe('danger, inverter peak current: too high.');
  });
});
