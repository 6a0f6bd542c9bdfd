// The envelope as CSV (src/core/reports/envelope-csv.ts): the command line's naming and the app's.
// CSV: Shafranovich (2005), RFC 4180 (quoted text, CRLF). rms = peak / sqrt(2) for a sinusoid, and
// rpm = rad/s * 60 / (2 pi): common practice (no source).
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { ENVELOPE_CSV_HEADERS, envelopeCsv, envelopeRegionAt } from '../src/core/reports/envelope-csv';
import { parseCsv } from '../src/core/reports/csv';
import type { Envelope } from '../src/core/steady-state/envelope';
import { computeEnvelope } from '../src/core/steady-state/envelope';
import { loadProjectText } from '../src/core/project/project';

// two invented points: 100 rad/s (954.9296586 rpm) in MTPA, and one beyond the maximum speed
const env = {
  speed: Float64Array.from([100, 200]),
  torque: Float64Array.from([2, 0]),
  power: Float64Array.from([200, 0]),
  id: Float64Array.from([-3, 0]),
  iq: Float64Array.from([4, 0]),
  current: Float64Array.from([5, 0]),
  voltage: Float64Array.from([20, 30]),
  region: ['mtpa', 'mtpa'],
  feasible: Uint8Array.from([1, 0]),
} as unknown as Envelope;

describe('envelope CSV', () => {
  it("the command line's naming: header and rows, numbers at 10 significant digits", () => {
    expect(envelopeCsv([{ key: 'x', env }])).toBe(
      '"speed_rpm","torque_Nm","power_W","id_A","iq_A","current_A_peak","current_A_rms","voltage_V_peak_phase","region"\r\n' +
        '954.9296586,2,200,-3,4,5,3.535533906,20,"mtpa"\r\n' +
        '1909.859317,0,0,0,0,0,0,30,"beyond-max-speed"\r\n',
    );
  });

  it("the app's naming: comment rows, a curve column first, voltage_V", () => {
    const text = envelopeCsv([{ key: 'peak-hot-motoring', env }, { key: '=cold', env }], { comments: ['# project: a, "b"'], naming: 'app' });
    const rows = parseCsv(text);
    expect(rows[0]).toEqual(['# project: a, "b"']);
    expect(rows[1]).toEqual(['curve', 'speed_rpm', 'torque_Nm', 'power_W', 'id_A', 'iq_A', 'current_A_peak', 'current_A_rms', 'voltage_V', 'region']);
    expect(rows.slice(2).map((r) => r[0])).toEqual(['peak-hot-motoring', 'peak-hot-motoring', "'=cold", "'=cold"]);
    expect(rows[3]).toEqual(['peak-hot-motoring', '1909.859317', '0', '0', '0', '0', '0', '0', '30', 'beyond-max-speed']);
  });

  it('the two namings differ in the curve column and the voltage name only', () => {
    expect(ENVELOPE_CSV_HEADERS.app.slice(1).map((h) => (h === 'voltage_V' ? 'voltage_V_peak_phase' : h))).toEqual([...ENVELOPE_CSV_HEADERS.cli]);
  });

  it('a region beyond the maximum speed; the rows of a computed envelope agree with the engine', () => {
    expect(envelopeRegionAt(env, 0)).toBe('mtpa');
    expect(envelopeRegionAt(env, 1)).toBe('beyond-max-speed');
    const rp = loadProjectText(readFileSync(join(__dirname, '..', 'resources', 'demo-servo-axis.json'), 'utf8'));
    const e = computeEnvelope(rp.hot, rp.peak, { points: 7 });
    const rows = parseCsv(envelopeCsv([{ key: 'k', env: e }])).slice(1);
    expect(rows).toHaveLength(7);
    for (let k = 0; k < 7; k++) {
      expect(Number(rows[k]![1])).toBeCloseTo(e.torque[k]!, 6);
      expect(Number(rows[k]![6])).toBeCloseTo(e.current[k]! / Math.SQRT2, 6);
    }
  });
});
