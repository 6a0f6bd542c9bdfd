import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { loadProject, loadProjectJson } from '../src/core/project/project';
import { comparisonSpeedMax, variantSteady } from '../src/core/reports/variant-comparison';
import { cell, comparisonTable, DASH, requirementKeys, verdictCell } from '../src/core/reports/variant-table';

const spmText = readFileSync(new URL('../resources/demo-spm-48v.json', import.meta.url), 'utf8');

describe('comparison table', () => {
  it('cells: 4 significant digits, a dash for what is missing (common practice (no source))', () => {
    expect(cell(0.065272)).toBe('0.06527');
    expect(cell(1234.56)).toBe('1235');
    expect(cell(null)).toBe(DASH);
    expect(cell(Number.NaN)).toBe(DASH);
  });

  it('requirement labels are matched across variants, first appearance first; a label repeated in one file is numbered', () => {
    const r = requirementKeys([['a', 'b'], ['b', 'c', 'c']]);
    expect(r.keys).toEqual(['a', 'b', 'c', 'c (2)']);
    expect(r.perVariant).toEqual([['a', 'b'], ['b', 'c', 'c (2)']]);
  });

  it('a point one variant lacks is a dash in its column; a point both have is in the same row (common practice (no source))', () => {
    const base = loadProject(spmText).resolved;
    const f = JSON.parse(spmText);
    // the second variant: the points reordered, one dropped, one added
    f.requirements = [f.requirements[3], f.requirements[1], { label: 'boost', speed_rpm: 1000, torque_Nm: 5 }];
    const other = loadProjectJson(f).resolved;
    const vs = [{ name: 'A', project: base }, { name: 'B', project: other }];
    const top = comparisonSpeedMax(vs);
    const t = comparisonTable(vs.map((v) => variantSteady(v, top, 20)));
    expect(t.columns).toEqual(['A', 'B']);
    const rowOf = (label: string) => t.rows.find((r) => r.label === label)!.cells;
    expect(rowOf('cruise: hot')[0]).toBe(rowOf('cruise: hot')[1]); // the same machine, the same point
    expect(rowOf('cruise: hot')[0]).toMatch(/^met, \+/);
    expect(rowOf('start-up: hot')[1]).toBe(DASH);
    expect(rowOf('boost: cold')[0]).toBe(DASH);
    expect(rowOf('boost: cold')[1]).toMatch(/^met/);
    // every row has one cell per variant
    for (const r of t.rows) expect(r.cells.length).toBe(2);
    // no scenario run given: no load-step rows
    expect(t.rows.some((r) => r.group === 'load steps')).toBe(false);
  });

  it('a verdict names the headroom when met and the shortfall when not', () => {
    const p = loadProject(spmText).resolved;
    const s = variantSteady({ name: 'A', project: p }, comparisonSpeedMax([{ name: 'A', project: p }]), 20);
    const q = s.sizing.hot.points[0]!;
    expect(verdictCell(q)).toBe(`met, +${cell(q.currentHeadroom_A)} A / +${cell(q.voltageHeadroom_V)} V`);
    expect(verdictCell({ ...q, met: false, torqueShortfall_Nm: 1.25, currentHeadroom_A: null, voltageHeadroom_V: null })).toBe('NOT met, 1.25 N·m short');
    expect(verdictCell(undefined)).toBe(DASH);
  });
});

describe('sizing and speed cells in words where there is no number', () => {
  it('a point beyond reach at any current reads "none"; an envelope with torque at every speed reads "unbounded"', () => {
    const f = JSON.parse(spmText);
    // far beyond what 48 V can drive: no current meets it (invented)
    f.requirements = [{ label: 'impossible', speed_rpm: 60000, torque_Nm: 12 }];
    const p = loadProjectJson(f).resolved;
    const s = variantSteady({ name: 'A', project: p }, comparisonSpeedMax([{ name: 'A', project: p }]), 20);
    const t = comparisonTable([s]);
    const rowOf = (label: string) => t.rows.find((r) => r.label === label)!.cells[0];
    expect(s.sizing.hot.minImax).toBeNull();
    expect(rowOf('least Imax hot')).toBe('none');
    // characteristic current psiM/Ld inside the current limit: torque at every speed (Soong and Miller 1994, Field-weakening performance of brushless synchronous AC motor drives)
    expect(s.constantsHot.characteristicCurrent_A).toBeLessThan(p.peak.Imax);
    expect(rowOf('maximum speed hot')).toBe('unbounded');
  });
});
