// motor.fluxMap in the project file: given instead of Ld, Lq and psiM, each refusal naming the exact
// entry. Common practice (no source): a flux map is a rectangular table on ascending current grids
// whose fluxes rise with their own currents (positive incremental inductances).
import { describe, expect, it } from 'vitest';
import { checkProject, MAX_FLUX_MAP_POINTS, parseProject } from '../src/core/project/schema';
import { messageOf } from './helpers';
import { constProject, mapProject } from './flux-map-fixtures';

const problems = (j: unknown) => checkProject(j);

describe('motor.fluxMap or the constant terms', () => {
  it('a map tabulated on iq >= 0 and one on the full plane are accepted', () => {
    expect(problems(mapProject())).toEqual([]);
    expect(problems(mapProject(true))).toEqual([]);
  });

  it('both given: refused at motor.fluxMap naming the constant terms', () => {
    const j = mapProject();
    j.motor.Ld = 3e-4;
    expect(problems(j)).toEqual([{ path: 'motor.fluxMap', message: 'and motor.Ld are both given: give either the flux map or the constant Ld, Lq and psiM, and remove the other' }]);
  });

  it('neither given: each missing term named, with the flux map as the alternative, alongside other problems', () => {
    const j = constProject();
    delete j.motor.Ld;
    delete j.motor.Lq;
    delete j.motor.psiM;
    j.motor.Rs = -1;
    expect(problems(j)).toEqual([
      { path: 'motor.Rs', message: 'must be >= 0 ohm' },
      { path: 'motor.Ld', message: 'is required (d-axis inductance per phase in H), or give motor.fluxMap instead of Ld, Lq and psiM' },
      { path: 'motor.Lq', message: 'is required (q-axis inductance per phase in H), or give motor.fluxMap instead of Ld, Lq and psiM' },
      { path: 'motor.psiM', message: 'is required (peak magnet flux linkage per phase at 20 °C in Wb), or give motor.fluxMap instead of Ld, Lq and psiM' },
    ]);
  });
});

describe('the table, entry by entry', () => {
  it('not rectangular: the row is named with the count it must have', () => {
    const j = mapProject();
    j.motor.fluxMap.psid_Wb[3].pop();
    expect(problems(j)).toEqual([{ path: 'motor.fluxMap.psid_Wb[3]', message: `has ${j.motor.fluxMap.iq_A.length - 1} entries; it must have one per iq_A entry (${j.motor.fluxMap.iq_A.length})` }]);
    const k = mapProject();
    k.motor.fluxMap.psiq_Wb.pop();
    expect(problems(k)[0]!.path).toBe('motor.fluxMap.psiq_Wb');
    expect(problems(k)[0]!.message).toMatch(/^has 40 rows; it must have one per id_A entry \(41\)$/);
  });

  it('a grid not strictly ascending: the entry is named', () => {
    const j = mapProject();
    j.motor.fluxMap.id_A[5] = j.motor.fluxMap.id_A[4];
    expect(problems(j)[0]).toEqual({ path: 'motor.fluxMap.id_A[5]', message: `must be > id_A[4] (${j.motor.fluxMap.id_A[4]} A): the grid must be strictly ascending` });
  });

  it('a flux that does not rise with its current: the point is named, and where it fails', () => {
    const j = mapProject();
    j.motor.fluxMap.psid_Wb[3][7] = j.motor.fluxMap.psid_Wb[2][7] - 0.001;
    const p = problems(j);
    expect(p[0]!.path).toBe('motor.fluxMap.psid_Wb[3][7]');
    expect(p[0]!.message).toMatch(/^must be > psid_Wb\[2\]\[7\] \(.* Wb\): psi_d must increase with id \(a positive incremental d inductance\)/);
    const k = mapProject();
    k.motor.fluxMap.psiq_Wb[10][4] = k.motor.fluxMap.psiq_Wb[10][3];
    expect(problems(k)[0]!.path).toBe('motor.fluxMap.psiq_Wb[10][4]');
    expect(problems(k)[0]!.message).toMatch(/psi_q must increase with iq \(a positive incremental q inductance\)/);
  });

  it('a non-number entry: named with its unit', () => {
    const j = mapProject();
    j.motor.fluxMap.psiq_Wb[2][1] = 'x';
    expect(problems(j)).toEqual([{ path: 'motor.fluxMap.psiq_Wb[2][1]', message: 'must be a number in Wb' }]);
  });

  it('a grid short of the peak current limit: refused naming the axis and by how much', () => {
    const j = mapProject();
    j.inverter.Imax = 520;
    expect(messageOf(() => parseProject(j))).toBe(
      'motor.fluxMap.id_A covers -500 to 500 A; the map must cover the peak current limit, 520 A (inverter.Imax), from -520 to 520 A: 20 A short at the top, 20 A short at the bottom',
    );
    expect(problems(j).map((p) => p.path)).toEqual(['motor.fluxMap.id_A', 'motor.fluxMap.iq_A']);
    expect(problems(j)[1]!.message).toMatch(/^covers 0 to 500 A \(mirrored to -500 A\); .*: 20 A short at the top$/);
    // the motor's peak current below the inverter's sets the limit
    j.motor.peakCurrent = 480;
    expect(problems(j)).toEqual([]);
  });

  it('more than 101 points along an axis: refused by length before any entry is read', () => {
    const j = mapProject();
    j.motor.fluxMap.id_A = Array.from({ length: 1_000_000 }, () => 'x');
    expect(problems(j)).toEqual([{ path: 'motor.fluxMap.id_A', message: `must have at most ${MAX_FLUX_MAP_POINTS} entries (it has 1000000)` }]);
    const k = mapProject();
    k.motor.fluxMap.psid_Wb[2] = Array.from({ length: 102 }, () => 0);
    expect(problems(k)).toEqual([{ path: 'motor.fluxMap.psid_Wb[2]', message: `must have at most ${MAX_FLUX_MAP_POINTS} entries (it has 102)` }]);
  });
});
