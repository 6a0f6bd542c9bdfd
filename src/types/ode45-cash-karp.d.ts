declare module 'ode45-cash-karp' {
  export type Deriv = (dydt: Float64Array | number[], y: Float64Array | number[], t: number) => void;
  export interface Ode45Options {
    /** target error level, default 1e-8 */
    tol?: number;
    maxIncreaseFactor?: number;
    maxDecreaseFactor?: number;
    dtMinMag?: number;
    dtMaxMag?: number;
    /** normalising factor for the error of component i; y and dydt are that component's values */
    errorScaleFunction?: (i: number, dt: number, y: number, dydt: number) => number;
    errorReduceFunction?: (i: number, accumulatedError: number, errorEstimate: number) => number;
    errorPostFunction?: (accumulatedError: number) => number;
    verbose?: boolean;
  }
  export interface Ode45Integrator extends Ode45Options {
    n: number;
    y: Float64Array | number[];
    t: number;
    dt: number;
    deriv: Deriv;
    step(tLimit?: number): boolean;
    steps(n: number, tLimit?: number): boolean;
  }
  function ode45(y0: Float64Array | number[], deriv: Deriv, t0: number, dt0: number, options?: Ode45Options): Ode45Integrator;
  export default ode45;
}
