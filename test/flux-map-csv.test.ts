// A flux map from a long-format CSV: one row per point, columns named by the user, rms or peak
// currents. Common practice (no source): a sinusoidal phase current's peak is √2 times its rms.
import { describe, expect, it } from 'vitest';
import { fluxMapFromCsv } from '../src/core/reports/flux-map-csv';
import { messageOf } from './helpers';

const COLS = { id: 'Id [A]', iq: 'Iq [A]', psid: 'Psi_d [Wb]', psiq: 'Psi_q [Wb]' };

/** A 3 x 2 map, rows in any order, psi_d = 1e-3 id + 0.05, psi_q = 2e-3 iq. */
function csv(rows = [[-10, 0], [0, 0], [10, 0], [-10, 5], [0, 5], [10, 5]]): string {
  return ['"Id [A]",Iq [A],Psi_d [Wb],Psi_q [Wb],T [Nm]', ...rows.reverse().map(([id, iq]) => `${id},${iq},${Number((1e-3 * id! + 0.05).toPrecision(12))},${Number((2e-3 * iq!).toPrecision(12))},0`)].join('\r\n') + '\r\n';
}

describe('fluxMapFromCsv', () => {
  it('builds the grid (sorted, rows in any order) and keeps peak currents as they are', () => {
    const m = fluxMapFromCsv(csv(), { columns: COLS, current: 'peak', magnetTemp_C: 60 });
    expect(m).toEqual({
      magnetTemp_C: 60,
      id_A: [-10, 0, 10],
      iq_A: [0, 5],
      psid_Wb: [[0.04, 0.04], [0.05, 0.05], [0.06, 0.06]],
      psiq_Wb: [[0, 0.01], [0, 0.01], [0, 0.01]],
    });
  });

  it('rms currents are multiplied by √2, fluxes left as they are', () => {
    const m = fluxMapFromCsv(csv(), { columns: COLS, current: 'rms', magnetTemp_C: 20 });
    expect(m.id_A).toEqual([-10 * Math.SQRT2, 0, 10 * Math.SQRT2]);
    expect(m.iq_A).toEqual([0, 5 * Math.SQRT2]);
    expect(m.psid_Wb[2]).toEqual([0.06, 0.06]);
  });

  it('a missing point is named; a repeated point names both rows; a column not in the header names the option', () => {
    expect(messageOf(() => fluxMapFromCsv(csv([[-10, 0], [0, 0], [10, 0], [-10, 5], [10, 5]]), { columns: COLS, current: 'peak', magnetTemp_C: 20 }))).toBe(
      'CSV has no point at id 0, iq 5 (peak): the map must be a full rectangular grid, every id value with every iq value (3 x 2 points, 5 given)',
    );
    expect(messageOf(() => fluxMapFromCsv(csv([[-10, 0], [0, 0], [10, 0], [-10, 5], [0, 5], [10, 5], [0, 5]]), { columns: COLS, current: 'peak', magnetTemp_C: 20 }))).toMatch(
      /^CSV row \d repeats the point id 0, iq 5 of row \d \(each point once\)$/,
    );
    expect(messageOf(() => fluxMapFromCsv(csv(), { columns: { ...COLS, psiq: 'psiq' }, current: 'peak', magnetTemp_C: 20 }))).toBe(
      "--psiq 'psiq' is not a column of the CSV header (columns: 'Id [A]', 'Iq [A]', 'Psi_d [Wb]', 'Psi_q [Wb]', 'T [Nm]')",
    );
  });

  it('a cell that is not a number names its row and column', () => {
    const text = csv().replace('\r\n10,5,', '\r\n10,five,');
    expect(messageOf(() => fluxMapFromCsv(text, { columns: COLS, current: 'peak', magnetTemp_C: 20 }))).toBe("CSV row 2 column 'Iq [A]' (--iq) must be a number (got 'five')");
  });
});
