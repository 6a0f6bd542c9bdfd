import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { loadProjectText } from '../src/core/project/project';
import { tuningInputFromProject, tuningInputFor, tuneFromProject } from '../src/core/project/tuning-from-project';
import { defaultControl } from '../src/core/project/schema';

const demo = (f: string): any => JSON.parse(readFileSync(resolve(__dirname, '..', 'resources', `${f}.json`), 'utf8'));

// The defaults are the schema's (common practice, no source): fCtrl 10 kHz, one sample of delay,
// current bandwidth fCtrl/20, speed bandwidth a tenth of it.
describe('tuning input of a project', () => {
  it('a file without a control section gets the schema defaults', () => {
    const o = demo('demo-servo-axis');
    delete o.control;
    const p = loadProjectText(JSON.stringify(o));
    const inp = tuningInputFromProject(p);
    expect(inp.fCtrl_Hz).toBe(10000);
    expect(inp.delaySamples).toBe(1);
    expect(inp.speedLoopDivider).toBe(1);
    expect(inp.current).toEqual({ bandwidth_Hz: 500 });
    expect(inp.speed).toEqual({ method: 'bandwidth', bandwidth_Hz: 50 });
    expect(inp).toEqual(tuningInputFor(p, defaultControl(), p.file.scenario?.loadInertia ?? 0));
    expect(inp.machine).toBe(p.models.hot); // the hot machine, as the model the solvers are given
  });
  it('the file\'s gains and load inertia are taken as given', () => {
    const o = demo('demo-servo-axis');
    o.control = { currentKp: 3, currentKi: 300, speedKp: 0.2, speedKi: 4, delaySamples: 2 };
    const p = loadProjectText(JSON.stringify(o));
    const inp = tuningInputFromProject(p);
    expect(inp.current).toEqual({ Kp: 3, Ki: 300 });
    expect(inp.speed).toEqual({ Kp: 0.2, Ki: 4 });
    expect(inp.delaySamples).toBe(2);
    expect(inp.inertia).toBe(p.mechanics.inertia + (o.scenario?.loadInertia ?? 0));
    expect(tuneFromProject(p).current.Kp).toBe(3);
  });
});
