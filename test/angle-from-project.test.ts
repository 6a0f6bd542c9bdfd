// The project adapter of control.angle (src/core/project/angle-from-project.ts) and its way into the
// simulation setup. Defaults: issue 15 of this project; the resolver's pole-pair rule: common
// practice (no source): a resolver of pr pole pairs gives the mechanical angle modulo 2 pi / pr, so
// the motor's electrical angle (p times the mechanical) is known only when pr divides p.
import { describe, expect, it } from 'vitest';
import { demoJson, messageOf } from './helpers';
import { angleFromProject } from '../src/core/project/angle-from-project';
import { loadProjectText } from '../src/core/project/project';
import { simulationFromProject } from '../src/core/project/simulation-from-project';

describe('angleFromProject', () => {
  it('absent: ideal; a section as parsed passes through', () => {
    expect(angleFromProject(undefined, 4)).toEqual({ source: 'ideal' });
    expect(angleFromProject({}, 4)).toEqual({ source: 'ideal' });
    const enc = { source: 'encoder' as const, linesPerRev: 1000, speedWindowPeriods: 2, speedFilter_Hz: 50, offset_deg: 1 };
    expect(angleFromProject({ angle: enc }, 4)).toEqual(enc);
  });
  it('a resolver whose pole pairs do not divide the motor\'s is refused, naming the field', () => {
    const res = { source: 'resolver' as const, bandwidth_Hz: 300, damping: 0.707, polePairs: 3 };
    expect(messageOf(() => angleFromProject({ angle: res }, 4))).toBe("control.angle.polePairs must divide the motor's pole pairs (4): the resolver's angle must give the motor's electrical angle");
    expect(angleFromProject({ angle: { ...res, polePairs: 2 } }, 4)).toMatchObject({ source: 'resolver', polePairs: 2 });
  });
  it('a section changed after parsing is checked as the file is', () => {
    expect(messageOf(() => angleFromProject({ angle: { source: 'encoder', linesPerRev: 0, speedWindowPeriods: 4, speedFilter_Hz: 0, offset_deg: 0 } }, 4))).toMatch(/^control\.angle\.linesPerRev must be >= 1/);
  });
});

describe('the simulation setup carries the angle source', () => {
  it('ideal (absent): no angle in the setup, as before; an encoder: its specification', () => {
    const o = demoJson('demo-servo-axis');
    delete o.control.angle; // the demo carries an encoder: the section left out
    expect('angle' in simulationFromProject(loadProjectText(JSON.stringify(o)))).toBe(false);
    o.control.angle = { source: 'ideal' };
    expect('angle' in simulationFromProject(loadProjectText(JSON.stringify(o)))).toBe(false);
    o.control.angle = { source: 'encoder', linesPerRev: 2500 };
    expect(simulationFromProject(loadProjectText(JSON.stringify(o))).angle).toEqual({ source: 'encoder', linesPerRev: 2500, speedWindowPeriods: 4, speedFilter_Hz: 0, offset_deg: 0 });
    o.control.angle = { source: 'resolver', polePairs: 3 };
    expect(messageOf(() => simulationFromProject(loadProjectText(JSON.stringify(o))))).toMatch(/^control\.angle\.polePairs must divide the motor's pole pairs \(4\)/);
  });
});
