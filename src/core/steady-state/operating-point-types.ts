/** What a steady-state solve returns, and what a requirement asks. */
import type { Duty } from '../drive/current-limit-types';

export type Region = 'mtpa' | 'field-weakening' | 'mtpv';

/** Which limit decides an operating point or a requirement. */
export type LimitedBy = 'none' | 'current' | 'voltage' | 'current-and-voltage' | 'beyond-mtpv';

export interface OperatingPoint {
  feasible: boolean;
  /** mechanical speed, rad/s */
  speed: number;
  /** electromagnetic torque delivered (or, when infeasible, asked for), N·m */
  torque: number;
  id: number;
  iq: number;
  /** |i_dq|, A peak */
  current: number;
  vd: number;
  vq: number;
  /** |v_dq|, V peak phase */
  voltage: number;
  region: Region;
  limitedBy: LimitedBy;
}

export interface Requirement {
  label: string;
  /** mechanical speed, rpm (as in the file) */
  speed_rpm: number;
  /** shaft torque wanted, N·m; negative = generating/braking */
  torque_Nm: number;
  /** which current limit the point is checked against: the peak (default) or the continuous limit */
  duty?: Duty;
}
