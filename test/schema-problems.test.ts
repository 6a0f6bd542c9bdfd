// Problems of a project file in our words (src/core/project/schema-problems.ts): header and list
// checks before the schema, zod issues phrased with the units of KEYS. Messages: our own phrasing
// (common practice (no source)).
import { describe, expect, it } from 'vitest';
import { CHOOSE_ONE, headerProblem, listCapProblem, problemsOf } from '../src/core/project/schema-problems';
import { projectSchema } from '../src/core/project/schema';

const minimal = (): Record<string, any> => ({
  format: 'torquewise-project',
  version: 1,
  motor: { polePairs: 4, Rs: 0.05, Ld: 1e-4, Lq: 1.2e-4, psiM: 0.01, inertia: 1e-4 },
  inverter: { Vdc: 48, Imax: 100, Icont: 50 },
});

const problems = (j: unknown) => {
  const r = projectSchema.safeParse(j);
  return r.success ? [] : problemsOf(r.error.issues, j);
};

describe('headerProblem', () => {
  it('a file that is not an object, of another format, of a newer or a wrong version', () => {
    expect(headerProblem([])).toEqual({ path: 'file', message: 'must be a JSON object { ... }' });
    expect(headerProblem({ format: 'x', version: 1 })).toEqual({ path: 'format', message: 'must be "torquewise-project" (this is not a Torquewise project file)' });
    expect(headerProblem({ format: 'torquewise-project', version: 3 })).toEqual({ path: 'version', message: 'is 3: the file was written by a newer Torquewise (version 3); this one reads version 1' });
    expect(headerProblem({ format: 'torquewise-project', version: '1' })).toEqual({ path: 'version', message: 'must be 1' });
    expect(headerProblem(minimal())).toBeNull();
  });
});

describe('listCapProblem', () => {
  it('names the first list above 1000 entries and its length, reading no entry', () => {
    const j = minimal();
    j['scenario'] = { duration_s: 1, loadSteps: new Array(1001) };
    expect(listCapProblem(j)).toEqual({ path: 'scenario.loadSteps', message: 'must have at most 1000 entries (it has 1001)' });
    j['scenario'].loadSteps = new Array(1000);
    expect(listCapProblem(j)).toBeNull();
  });
});

describe('problemsOf', () => {
  it('a bound says the unit of the key, an array element by its index', () => {
    const j = minimal();
    j['motor'].Ld = 0;
    j['requirements'] = [{ label: 'a', speed_rpm: 1, torque_Nm: 1 }, { label: 'b', speed_rpm: -1, torque_Nm: 1 }];
    expect(problems(j)).toEqual([
      { path: 'motor.Ld', message: 'must be >= 1e-9 H' },
      { path: 'requirements[1].speed_rpm', message: 'must be >= 0 rpm' },
    ]);
  });

  it('a missing key says what it is and its unit; an unknown key lists the known ones', () => {
    const j = minimal();
    delete j['inverter'].Vdc;
    j['inverter'].Vbus = 48;
    expect(problems(j)).toEqual([
      { path: 'inverter.Vdc', message: 'is required (DC-bus voltage in V)' },
      { path: 'inverter.Vbus', message: 'is not a known key (known here: Vdc, Imax, Icont, modulation, voltageUtilization, deviceDrop)' },
    ]);
  });

  it('a current with a basis outside the nameplate: in A peak, and what an rms value would be', () => {
    const j = minimal();
    j['inverter'].Imax = { value: 10, basis: 'rms' };
    expect(problems(j)[0]!.message).toMatch(/^must be a plain number in A peak \(10 A rms = 14\.14 A peak\): /);
  });

  it('motor and nameplate together: choose one, first', () => {
    const j = minimal();
    j['nameplate'] = { poles: 3 };
    const p = problems(j);
    expect(p[0]).toEqual({ path: 'nameplate', message: CHOOSE_ONE });
    expect(p.length).toBeGreaterThan(1);
  });
});
