import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  abcToDq,
  abcToDq0AmplitudeInvariant,
  abcToDq0AmplitudeInvariantInto,
  abcToDq0PowerInvariant,
  clarkeAmplitudeInvariant,
  clarkeAmplitudeInvariantInto,
  clarkePowerInvariant,
  dq0ToAbcAmplitudeInvariant,
  dq0ToAbcPowerInvariant,
  dq0ToAbcPowerInvariantInto,
  dqToAbc,
  inverseClarkeAmplitudeInvariant,
  inverseClarkePowerInvariant,
  inversePark,
  inverseParkInto,
  park,
  parkInto,
  powerDq0AmplitudeInvariant,
  powerDq0PowerInvariant,
} from '../src/core/mathematics/transforms';

const TAU = 2 * Math.PI;
const balanced = (A: number, phi: number): [number, number, number] => [
  A * Math.cos(phi),
  A * Math.cos(phi - TAU / 3),
  A * Math.cos(phi + TAU / 3),
];
const finite = fc.double({ min: -1e3, max: 1e3, noNaN: true });
const angle = fc.double({ min: -20, max: 20, noNaN: true });

describe('Clarke definitions', () => {
  it('amplitude-invariant Clarke of unit phase-a pulse', () => {
    // definition on the conventions page: x_alpha = 2/3 (a - b/2 - c/2), x_beta = (b - c)/sqrt3, x0 = (a+b+c)/3
    expect(clarkeAmplitudeInvariant(1, 0, 0)).toEqual([2 / 3, 0, 1 / 3]);
    const [al, be, z] = clarkeAmplitudeInvariant(0, 1, 0);
    expect(al).toBeCloseTo(-1 / 3, 15);
    expect(be).toBeCloseTo(1 / Math.sqrt(3), 15);
    expect(z).toBeCloseTo(1 / 3, 15);
  });

  it('power-invariant Clarke of unit phase-a pulse', () => {
    // sqrt(2/3) [1, -1/2, -1/2; 0, sqrt3/2, -sqrt3/2; 1/sqrt2 ...], common practice (no source)
    const [al, be, z] = clarkePowerInvariant(1, 0, 0);
    expect(al).toBeCloseTo(Math.sqrt(2 / 3), 15);
    expect(be).toBe(0);
    expect(z).toBeCloseTo(1 / Math.sqrt(3), 15);
  });

  it('balanced set: alpha = A cos(phi), beta = A sin(phi), zero = 0', () => {
    const [a, b, c] = balanced(7, 0.4);
    const [al, be, z] = clarkeAmplitudeInvariant(a, b, c);
    expect(al).toBeCloseTo(7 * Math.cos(0.4), 12);
    expect(be).toBeCloseTo(7 * Math.sin(0.4), 12);
    expect(z).toBeCloseTo(0, 12);
  });
});

describe('Park definitions', () => {
  it('rotates alpha-beta into the d-axis frame', () => {
    // x_d = a cos + b sin, x_q = -a sin + b cos (conventions page)
    const [d, q] = park(1, 0, Math.PI / 2);
    expect(d).toBeCloseTo(0, 15);
    expect(q).toBeCloseTo(-1, 15);
    const [d2, q2] = park(Math.cos(0.3), Math.sin(0.3), 0.3);
    expect(d2).toBeCloseTo(1, 15);
    expect(q2).toBeCloseTo(0, 15);
  });

  it('q axis leads d by 90 degrees: dq (0,1) at theta=0 is pure beta', () => {
    const [al, be] = inversePark(0, 1, 0);
    expect(al).toBeCloseTo(0, 15);
    expect(be).toBeCloseTo(1, 15);
  });

  it('a balanced set at the rotor angle maps to pure d of length A', () => {
    const theta = 1.234;
    const [d, q, z] = abcToDq0AmplitudeInvariant(...balanced(10, theta), theta);
    expect(d).toBeCloseTo(10, 12);
    expect(q).toBeCloseTo(0, 12);
    expect(z).toBeCloseTo(0, 12);
  });
});

describe('round trips', () => {
  it('Clarke and inverse, both scalings', () => {
    fc.assert(
      fc.property(finite, finite, finite, (a, b, c) => {
        const r1 = inverseClarkeAmplitudeInvariant(...clarkeAmplitudeInvariant(a, b, c));
        const r2 = inverseClarkePowerInvariant(...clarkePowerInvariant(a, b, c));
        for (const [x, y] of [[r1[0], a], [r1[1], b], [r1[2], c], [r2[0], a], [r2[1], b], [r2[2], c]]) {
          expect(Math.abs(x - y)).toBeLessThan(1e-10);
        }
      }),
    );
  });

  it('Park and inverse', () => {
    fc.assert(
      fc.property(finite, finite, angle, (al, be, th) => {
        const [r0, r1] = inversePark(...park(al, be, th), th);
        expect(Math.abs(r0 - al)).toBeLessThan(1e-10);
        expect(Math.abs(r1 - be)).toBeLessThan(1e-10);
      }),
    );
  });

  it('abc -> dq0 -> abc, both scalings', () => {
    fc.assert(
      fc.property(finite, finite, finite, angle, (a, b, c, th) => {
        const [d, q, z] = abcToDq0AmplitudeInvariant(a, b, c, th);
        const r1 = dq0ToAbcAmplitudeInvariant(d, q, z, th);
        const [dp, qp, zp] = abcToDq0PowerInvariant(a, b, c, th);
        const r2 = dq0ToAbcPowerInvariant(dp, qp, zp, th);
        for (const [x, y] of [[r1[0], a], [r1[1], b], [r1[2], c], [r2[0], a], [r2[1], b], [r2[2], c]]) {
          expect(Math.abs(x - y)).toBeLessThan(1e-9);
        }
      }),
    );
  });
});

describe('scaling of a balanced set', () => {
  it('|dq| = A amplitude-invariant, sqrt(3/2) A power-invariant', () => {
    // conventions page; power-invariant factor sqrt(3/2), common practice (no source)
    fc.assert(
      fc.property(fc.double({ min: 0.01, max: 1e3, noNaN: true }), angle, angle, (A, phi, th) => {
        const abc = balanced(A, phi);
        const [d, q] = abcToDq0AmplitudeInvariant(...abc, th);
        const [dp, qp] = abcToDq0PowerInvariant(...abc, th);
        expect(Math.hypot(d, q) / A).toBeCloseTo(1, 12);
        expect(Math.hypot(dp, qp) / A).toBeCloseTo(Math.sqrt(1.5), 12);
      }),
    );
  });
});

describe('power', () => {
  it('p = 1.5 (vd id + vq iq) + 3 v0 i0 = va ia + vb ib + vc ic (amplitude-invariant)', () => {
    // instantaneous three-phase power in the amplitude-invariant frame, common practice (no source)
    fc.assert(
      fc.property(finite, finite, finite, finite, finite, finite, angle, (va, vb, vc, ia, ib, ic, th) => {
        const [vd, vq, v0] = abcToDq0AmplitudeInvariant(va, vb, vc, th);
        const [id, iq, i0] = abcToDq0AmplitudeInvariant(ia, ib, ic, th);
        const pAbc = va * ia + vb * ib + vc * ic;
        expect(Math.abs(powerDq0AmplitudeInvariant(vd, vq, v0, id, iq, i0) - pAbc)).toBeLessThan(1e-6 * (1 + Math.abs(pAbc)));
      }),
    );
  });

  it('p = vd id + vq iq + v0 i0 = va ia + vb ib + vc ic (power-invariant)', () => {
    // orthogonal transform preserves the dot product, common practice (no source)
    fc.assert(
      fc.property(finite, finite, finite, finite, finite, finite, angle, (va, vb, vc, ia, ib, ic, th) => {
        const [vd, vq, v0] = abcToDq0PowerInvariant(va, vb, vc, th);
        const [id, iq, i0] = abcToDq0PowerInvariant(ia, ib, ic, th);
        const pAbc = va * ia + vb * ib + vc * ic;
        expect(Math.abs(powerDq0PowerInvariant(vd, vq, v0, id, iq, i0) - pAbc)).toBeLessThan(1e-6 * (1 + Math.abs(pAbc)));
      }),
    );
  });

  it('balanced worked example: 100 V peak, 10 A peak in phase gives 1500 W', () => {
    // P = 3 Vrms Irms cos(phi) = 1.5 Vpk Ipk, common practice (no source)
    const th = 0.7;
    const [vd, vq] = abcToDq0AmplitudeInvariant(...balanced(100, th + 0.2), th);
    const [id, iq] = abcToDq0AmplitudeInvariant(...balanced(10, th + 0.2), th);
    expect(powerDq0AmplitudeInvariant(vd, vq, 0, id, iq, 0)).toBeCloseTo(1500, 9);
  });
});

describe('out-parameter forms', () => {
  it('write at the offset, leave the rest, match the allocating forms', () => {
    const out = new Float64Array(8).fill(-99);
    dqToAbc(3, -4, 0.9, out, 2);
    const ref = dq0ToAbcAmplitudeInvariant(3, -4, 0, 0.9);
    expect([out[2], out[3], out[4]]).toEqual(ref);
    expect(out[0]).toBe(-99);
    expect(out[1]).toBe(-99);
    expect(out[5]).toBe(-99);
    abcToDq(out[2], out[3], out[4], 0.9, out, 5);
    expect(out[5]).toBeCloseTo(3, 12);
    expect(out[6]).toBeCloseTo(-4, 12);
    expect(out[7]).toBe(-99);

    const o3 = new Float64Array(3);
    clarkeAmplitudeInvariantInto(1, 2, 3, o3);
    expect(Array.from(o3)).toEqual(clarkeAmplitudeInvariant(1, 2, 3));
    abcToDq0AmplitudeInvariantInto(1, 2, 3, 0.5, o3);
    expect(Array.from(o3)).toEqual(abcToDq0AmplitudeInvariant(1, 2, 3, 0.5));
    dq0ToAbcPowerInvariantInto(1, 2, 3, 0.5, o3);
    expect(Array.from(o3)).toEqual(dq0ToAbcPowerInvariant(1, 2, 3, 0.5));
    const o2 = new Float64Array(2);
    parkInto(1, 2, 0.5, o2);
    expect(Array.from(o2)).toEqual(park(1, 2, 0.5));
    inverseParkInto(1, 2, 0.5, o2);
    expect(Array.from(o2)).toEqual(inversePark(1, 2, 0.5));
  });
});
