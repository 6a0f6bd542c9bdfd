import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from './cli-run';

const dir = mkdtempSync(join(tmpdir(), 'tw-size-thermal-'));
const ALPHA_CU = 0.00393; // IEC 60028, annealed copper at 20 °C
const ALPHA_BR = -0.0012; // the schema's default remanence coefficient (NdFeB, from memory)

/** An invented surface-magnet project whose only loss is copper, with a thermal network and a constant duty cycle. */
function project(requirements: unknown[]): string {
  const f = join(dir, `p-${Math.random().toString(36).slice(2)}.json`);
  writeFileSync(f, JSON.stringify({
    format: 'torquewise-project', version: 1, name: 'invented SPM with a thermal network',
    motor: { polePairs: 3, Rs: 0.1, Ld: 0.001, Lq: 0.001, psiM: 0.05, inertia: 0.001 },
    inverter: { Vdc: 300, Imax: 30, Icont: 15, modulation: 'svpwm' },
    conditions: { windingTemp_C: 20, magnetTempCoeff: ALPHA_BR },
    requirements,
    thermal: {
      coolantTemp_C: 40, windingCapacity_J_per_K: 200, windingToStator_K_per_W: 2, statorCapacity_J_per_K: 2000,
      statorToCoolant_K_per_W: 2, windingMax_C: 155, magnetMax_C: 300,
    },
    dutyCycle: { label: 'constant (invented)', t_s: [0, 10], speed_rpm: [1000, 1000], torque_Nm: [2, 2] },
  }));
  return f;
}

describe('size with a thermal network and a duty cycle', () => {
  it('continuous points against the S1 torque in closed form, and the duty cycle\'s least currents', async () => {
    // S1 bound by the winding, copper loss only, Ld = Lq (id = 0): Tw = Tc + P (Rws + Rsc), P = 1.5 Rs(Tw) i^2,
    // the magnet at the stator Ts = Tc + P Rsc, T = 1.5 p psiM(Ts) i (series thermal resistances: common practice (no source))
    const RsHot = 0.1 * (1 + ALPHA_CU * (155 - 20));
    const P = (155 - 40) / 4, i = Math.sqrt(P / (1.5 * RsHot));
    const psi = 0.05 * (1 + ALPHA_BR * (40 + 2 * P - 20));
    const T1 = 1.5 * 3 * psi * i;
    expect(i).toBeLessThan(15); // the winding binds before Icont
    const f = project([
      { label: 'held', speed_rpm: 1000, torque_Nm: 2, duty: 'continuous' },
      { label: 'too much', speed_rpm: 1000, torque_Nm: 2.5, duty: 'continuous' },
      { label: 'peak', speed_rpm: 1000, torque_Nm: 5 },
    ]);
    const r = await runCli('size', f, '--json');
    expect(r.code).toBe(0);
    const doc = JSON.parse(r.out);
    expect(doc.continuousPoints).toHaveLength(2);
    const [held, over] = doc.continuousPoints;
    expect(held.s1Torque_Nm).toBeCloseTo(T1, 5);
    expect(held.s1LimitedBy).toBe('winding');
    expect(held.underS1).toBe(true);
    expect(over.underS1).toBe(false);
    expect(over.windingTemp_C).toBeGreaterThan(155);
    // a constant cycle: its periodic state is the point's coupled steady state (to the 0.1 K stopping rule, about 1e-4 in current)
    expect(doc.dutyCycle.minIcont_A).toBeCloseTo(doc.dutyCycle.minImax_A, 6);
    expect(doc.dutyCycle.minIcont_A / held.current_A).toBeCloseTo(1, 3);
    expect(doc.dutyCycle.verdict.status).toBe('within-limits');
    const text = (await runCli('size', f)).out;
    expect(text).toMatch(/held \(continuous\): under the S1 torque at 1000 rpm/);
    expect(text).toMatch(/too much \(continuous\): ABOVE the S1 torque/);
    expect(text).toMatch(/duty cycle "constant \(invented\)": least continuous current/);
  });
});
