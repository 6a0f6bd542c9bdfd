// The speed range results are drawn over, and the typed top speed of a plot.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { loadProjectText } from '../src/core/project/project';
import { parsePlotTop, PLOT_SPEED_MAX_RPM, projectSpeedRange } from '../src/core/reports/speed-range';
import { baseSpeed } from '../src/core/steady-state/envelope';
import { RPM_TO_RAD_S } from '../src/core/base/units';

const demo = (f: string) => loadProjectText(readFileSync(resolve(__dirname, '..', 'resources', `${f}.json`), 'utf8'));

describe('projectSpeedRange', () => {
  it('reaches every requirement point and the rated maximum speed, and checks safety at the rated maximum', () => {
    for (const f of ['demo-spm-48v', 'demo-ipm-traction', 'demo-servo-axis']) {
      const p = demo(f);
      const r = projectSpeedRange(p);
      for (const q of p.requirements) expect(r.speedMax).toBeGreaterThanOrEqual(1.08 * Math.abs(q.speed_rpm) * RPM_TO_RAD_S * (1 - 1e-12));
      if (p.rated.maxSpeed_rad_s !== undefined) {
        expect(r.safetySpeed).toBe(p.rated.maxSpeed_rad_s);
        expect(r.speedMax).toBeGreaterThanOrEqual(1.05 * p.rated.maxSpeed_rad_s * (1 - 1e-12));
      }
      expect(r.speedMax).toBeGreaterThan(baseSpeed(p.hot, p.peak));
    }
  });

  it('without a rated maximum speed the safety check is made at the top of the range', () => {
    const j = JSON.parse(readFileSync(resolve(__dirname, '..', 'resources', 'demo-spm-48v.json'), 'utf8'));
    if (j.motor) delete j.motor.maxSpeed_rpm;
    if (j.nameplate) delete j.nameplate.maxSpeed_rpm;
    const r = projectSpeedRange(loadProjectText(JSON.stringify(j)));
    expect(r.safetySpeed).toBe(r.speedMax);
  });
});

describe('parsePlotTop', () => {
  it('takes a decimal rpm within (0, 1e6], blank for the project range, and says what is allowed otherwise', () => {
    // common practice (no source): one bound for the CLI flag and the app field
    expect(parsePlotTop('')).toEqual({ rpm: null });
    expect(parsePlotTop(' 12000 ')).toEqual({ rpm: 12000 });
    expect(parsePlotTop('1.5e4')).toEqual({ rpm: 15000 });
    expect(parsePlotTop(String(PLOT_SPEED_MAX_RPM))).toEqual({ rpm: PLOT_SPEED_MAX_RPM });
    expect(parsePlotTop('1e9')).toEqual({ message: 'must be <= 1000000 rpm' });
    expect(parsePlotTop('0')).toEqual({ message: 'must be > 0 rpm' });
    expect(parsePlotTop('-5')).toEqual({ message: 'must be > 0 rpm' });
    expect(parsePlotTop('abc')).toEqual({ message: "must be a number in rpm (got 'abc'), or blank for the project's range" });
    expect(parsePlotTop('0x10')).toHaveProperty('message');
  });
});
