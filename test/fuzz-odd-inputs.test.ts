// Physically odd but legal inputs: every command finishes with finite numbers, and the project
// says what is odd as a finding (not a crash, not a refusal).
import { describe, expect, it } from 'vitest';
import { runCase, DEMOS, COMMAND_NAMES, type Outcome } from '../trust/fuzz-cases';
import { resolveProject } from '../src/core/project/project';
import { parseProject } from '../src/core/project/schema';
import { tuneFromProject } from '../src/core/project/tuning-from-project';
import { runSimulation } from '../src/core/simulation/simulate';
import { simulationFromProject } from '../src/core/project/simulation-from-project';
import { computeEnvelope } from '../src/core/steady-state/envelope';
import { InputError } from '../src/core/base/errors';

type Json = Record<string, any>;
// the 48 V demo with the true rotor angle (control.angle ideal): these checks are about odd machines, not the angle source
const spm = (): Json => {
  const o = structuredClone(DEMOS['demo-spm-48v']) as Json;
  (o.control as Json).angle = { source: 'ideal' };
  return o;
};
const withMotor = (patch: Json, base: Json = spm()): Json => ({ ...base, motor: { ...base.motor, ...patch } });
const resolve = (j: Json) => resolveProject(parseProject(j));
const codes = (j: Json): string[] => resolve(j).findings.map((f) => f.code);

async function everyCommand(j: Json): Promise<Record<string, Outcome['kind']>> {
  const out: Record<string, Outcome['kind']> = {};
  for (const command of COMMAND_NAMES) {
    const flags = command === 'point' ? ['--speed', '2000', '--torque', '3'] : command === 'envelope' ? ['--points', '40'] : [];
    const r = await runCase({ input: { value: j }, command, flags });
    if (r.kind === 'failure') throw new Error(r.why);
    out[command] = r.kind;
  }
  return out;
}
const ALL_OK = Object.fromEntries(COMMAND_NAMES.map((c) => [c, 'ok']));

describe('odd but legal machines: findings, not crashes', () => {
  it('Rs = 0 is accepted, said to be a lossless winding, and every command gives finite numbers', async () => {
    const j = withMotor({ Rs: 0 });
    expect(codes(j)).toContain('lossless-winding');
    expect(await everyCommand(j)).toEqual(ALL_OK);
  });

  it('Rs = 0: the internal-model current PI has Ki = 0 and the tuning says so', () => {
    const r = tuneFromProject(resolve(withMotor({ Rs: 0 })));
    // internal-model tuning Ki = Rs * omega_c: common practice (no source)
    expect(r.current.Ki).toBe(0);
    expect(r.current.Kp).toBeCloseTo(4.5e-5 * 2 * Math.PI * 1000, 9);
    expect(r.warnings.map((w) => w.code)).toContain('current-integral-zero');
  });

  it('psiM = 0 with Ld != Lq is a reluctance machine: finding, every command finite, envelope torque from saliency alone', async () => {
    const j = withMotor({ psiM: 0, Ld: 4.5e-5, Lq: 1.35e-4 });
    const p = resolve(j);
    expect(p.findings.map((f) => f.code)).toContain('reluctance-machine');
    expect(p.findings.find((f) => f.code === 'reluctance-machine')!.message).toMatch(/back-EMF checks do not apply/);
    expect(await everyCommand(j)).toEqual(ALL_OK);
    const env = computeEnvelope(p.hot, p.peak, { points: 20 });
    // MTPA of a pure reluctance machine at 45°: T = 1.5 p (Ld - Lq) id iq = 0.75 p (Lq - Ld) I² (from memory)
    expect(env.torque[0]).toBeCloseTo(0.75 * 5 * (1.35e-4 - 4.5e-5) * 200 * 200, 6);
  });

  it('psiM = 0 with Ld = Lq makes no torque at all: one InputError naming motor.psiM', () => {
    expect(() => resolve(withMotor({ psiM: 0 }))).toThrow(InputError);
    try {
      resolve(withMotor({ psiM: 0 }));
    } catch (e) {
      expect((e as InputError).field).toBe('motor.psiM');
    }
  });

  it('Ld > Lq (inverse saliency) is said so, and every command gives finite numbers', async () => {
    const j = withMotor({ Ld: 1.2e-4, Lq: 4.5e-5 });
    expect(codes(j)).toContain('inverse-saliency');
    expect(await everyCommand(j)).toEqual(ALL_OK);
  });

  it('a bus too low for any requirement is a warning naming inverter.Vdc, and every command still runs', async () => {
    const j = spm();
    j.inverter = { ...j.inverter, Vdc: 1, deviceDrop: 0 };
    const p = resolve(j);
    const f = p.findings.find((x) => x.code === 'bus-reaches-no-requirement');
    expect(f?.field).toBe('inverter.Vdc');
    expect(await everyCommand(j)).toEqual(ALL_OK);
  });

  it('a current limit below the no-load friction torque is a warning naming inverter.Imax, and every command still runs', async () => {
    const j = withMotor({ coulombFriction: 5 });
    j.inverter = { ...j.inverter, Imax: 10, Icont: 5 };
    // at 10 A the motor makes about 1.5 * 5 * 0.0095 * 10 = 0.7 N·m < 5 N·m friction (from the torque equation)
    expect(codes(j)).toContain('imax-below-friction');
    expect(await everyCommand(j)).toEqual(ALL_OK);
  });

  it('the demos carry none of these findings', () => {
    for (const d of Object.values(DEMOS)) {
      const c = resolve(d as Json).findings.map((f) => f.code);
      for (const odd of ['lossless-winding', 'reluctance-machine', 'inverse-saliency', 'bus-reaches-no-requirement', 'imax-below-friction']) expect(c).not.toContain(odd);
    }
  });

  it('a simulation with Rs = 0 and with psiM = 0 stays finite over the whole scenario', () => {
    for (const patch of [{ Rs: 0 }, { psiM: 0, Lq: 1.35e-4 }]) {
      const j = withMotor(patch);
      delete j.control.speedRamp_rpm_per_s;
      j.scenario = { ...j.scenario, duration_s: 0.05, speedSteps: [{ t_s: 0.005, speed_rpm: 2000 }], loadSteps: [{ t_s: 0.03, torque_Nm: 2 }] };
      const r = runSimulation(simulationFromProject(resolve(j)));
      expect(r.diagnostic).toBeUndefined();
      expect(r.stats.controlSteps).toBe(1000);
      for (const a of Object.values(r.traces)) for (const x of a) expect(Number.isFinite(x)).toBe(true);
      expect(Math.abs(r.metrics.finalSpeed_rpm! - 2000)).toBeLessThan(100);
    }
  });
});
