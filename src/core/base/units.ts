/** Unit conversions used at the edges (files, screens, CLI). The engine itself is SI. */
export const RPM_TO_RAD_S = (2 * Math.PI) / 60;
export const RAD_S_TO_RPM = 60 / (2 * Math.PI);
export const SQRT2 = Math.SQRT2;
export const SQRT3 = Math.sqrt(3);

export const rpmToRadS = (rpm: number): number => rpm * RPM_TO_RAD_S;
export const radSToRpm = (w: number): number => w * RAD_S_TO_RPM;
/** peak of a sinusoid from its rms value */
export const rmsToPeak = (x: number): number => x * SQRT2;
export const peakToRms = (x: number): number => x / SQRT2;
