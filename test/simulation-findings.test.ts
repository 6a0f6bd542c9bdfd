import { describe, expect, it } from 'vitest';
import { currentAboveLimit, simulationFindings, CURRENT_OVER_LIMIT_TOLERANCE } from '../src/core/simulation/simulation-findings';
import type { SimulationResult } from '../src/core/simulation/simulation-result';
import type { SimulationSetup } from '../src/core/simulation/simulation-setup';
import { TRACE_NAMES } from '../src/core/simulation/simulation-result';

const traces = (speedRef: number, speed: number) => Object.fromEntries(TRACE_NAMES.map((n) => [n, Float64Array.of(n === 'speedRef_rpm' ? speedRef : n === 'speed_rpm' ? speed : 0)])) as SimulationResult['traces'];
const result = (peak: number, over: Partial<SimulationResult> = {}): SimulationResult => ({
  metrics: { finalSpeed_rpm: 0, speedOvershoot_pct: null, riseTime_s: null, settlingTime_s: null, loadStepDip_rpm: null, loadStepRecovery_s: null, peakCurrent_A: peak, rmsCurrent_A: 1, voltageSaturation_s: 0, energyFromBus_J: 0, steadyStateError_rpm: null },
  loadSteps: [], traces: traces(1000, 1000), events: [], stats: { controlSteps: 1, rhsEvaluations: 6, evaluationsPerPeriod: 6, wall_s: 0, setup_s: 0, run_s: 0 }, ...over,
});
const setup = { Imax: 100, controller: { Ts: 1e-4, delaySamples: 1, mode: 'speed' }, currentLimitField: 'inverter.Imax' } as unknown as SimulationSetup;

// common practice (no source): a peak above the limit by more than round-off is worth a warning
describe('simulation findings', () => {
  it('a peak 5 % above the limit is named with its field, in A peak and A rms', () => {
    const f = currentAboveLimit(result(105, { peakCurrentAt: { t_s: 0.01, reference_A: 100, sinceVoltageLimit_s: Infinity } }), setup)!;
    expect(f.code).toBe('current-above-limit');
    expect(f.field).toBe('inverter.Imax');
    expect(f.message).toMatch(/reached 105\.0 A peak \(74\.25 A rms\) at 10\.00 ms, 5\.0 % above the peak limit 100\.0 A peak/);
    expect(f.message).toMatch(/acts 1 period late/);
  });
  it('within the round-off tolerance, or a stopped run: none', () => {
    expect(currentAboveLimit(result(100 * (1 + CURRENT_OVER_LIMIT_TOLERANCE / 2)), setup)).toBeNull();
    expect(currentAboveLimit(result(200, { diagnostic: 'diverged' }), setup)).toBeNull();
  });
  it('a stop, an unreached speed and voltage saturation are findings', () => {
    const r = result(50, { traces: traces(1000, 900), metrics: { ...result(50).metrics, voltageSaturation_s: 0.0123 } });
    expect(simulationFindings(r, setup).map((f) => f.code)).toEqual(['speed-not-reached', 'voltage-saturation']);
    expect(simulationFindings(result(50, { diagnostic: 'stopped' }), setup).map((f) => f.code)).toEqual(['simulation-stopped']);
  });
});
