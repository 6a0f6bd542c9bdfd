/**
 * The sample of one control period that the run log and the watchdogs read: the period start, the
 * sampled state and the controller's references, in one typed array the run owns (handing doubles
 * across calls the engine does not inline would box each of them, every period).
 */
export const S_T = 0;
export const S_ID = 1;
export const S_IQ = 2;
export const S_W = 3;
export const S_ID_REF = 4;
export const S_IQ_REF = 5;
export const S_TORQUE_REF = 6;
export const S_SPEED_REF = 7;
export const PERIOD_SAMPLE_SIZE = 8;

/** A period sample from plain values (tests and callers outside the hot loop). */
export function periodSample(t: number, id: number, iq: number, w: number, idRef = 0, iqRef = 0, torqueRef = 0, speedRef = 0): Float64Array {
  return Float64Array.of(t, id, iq, w, idRef, iqRef, torqueRef, speedRef);
}
