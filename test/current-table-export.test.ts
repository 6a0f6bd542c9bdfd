import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { loadProjectText } from '../src/core/project/project';
import { currentTableInputs, currentTableJson, currentTableAbout } from '../src/core/reports/current-table-export';
import { buildCurrentTable } from '../src/core/control/current-table';
import { currentTableBound } from '../src/core/control/current-table-bound';
import { projectSpeedRange } from '../src/core/reports/speed-range';

const p = loadProjectText(readFileSync(join(__dirname, '..', 'resources', 'demo-servo-axis.json'), 'utf8'));

describe('current table from a project', () => {
  it('normalises by the effective bus (Vdc - 2 drops), spans the project speed range, takes the corners asked', () => {
    const a = currentTableInputs(p, { speedPoints: 5, torquePoints: 4, corners: 'both', minLoss: false });
    expect(a.spec.bus_V).toBe(320 - 2 * 1.5);
    expect(a.spec.xMax).toBeCloseTo((4 * projectSpeedRange(p).speedMax) / 317, 12);
    expect(a.corners.map((c) => c.name)).toEqual(['hot', 'cold']);
    expect(a.Rs).toEqual([p.hot.Rs, p.cold.Rs]);
    expect(a.spec.minLoss).toBeUndefined();
    const b = currentTableInputs(p, { speedPoints: 5, torquePoints: 4, corners: 'cold', minLoss: true, speedMax_rad_s: 300 });
    expect(b.corners.map((c) => c.name)).toEqual(['cold']);
    expect(b.spec.xMax).toBeCloseTo((4 * 300) / 317, 12);
    expect(b.spec.minLoss?.Vdc).toBe(320);
    const t = buildCurrentTable(b.corners, b.spec);
    const j = currentTableJson(t, currentTableAbout(p, b, currentTableBound(t, [b.corners[0]!.model]), '2026-01-02'));
    expect(j.corners[0]!.id_A).toHaveLength(5);
    expect(j.corners[0]!.id_A[0]).toHaveLength(7);
    expect(j.control).toBe('min-loss');
    expect(j.bus.effective_V).toBe(317);
  });
});
