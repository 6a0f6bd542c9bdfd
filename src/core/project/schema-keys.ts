/**
 * The project file's format constants and KEYS, the documentation of every key (unit and meaning):
 * the schema describes each number from it and every message takes its unit from it. Paths use
 * `[]` for array elements.
 */
export const PROJECT_FORMAT = 'torquewise-project';
export const PROJECT_VERSION = 1;

/**
 * Largest project file read, in bytes, by the desktop app and the web page alike (a project is a
 * few kB); the web page checks a picked file's size against it before reading it.
 */
export const MAX_PROJECT_BYTES = 16 * 1024 * 1024;

/**
 * Most entries in any one list of a project: requirements, scenario.speedSteps, torqueSteps,
 * loadSteps and loadRamps (a project has a handful of each). A longer list is refused by its
 * length, before any entry is looked at, so a file with a million entries is answered at once.
 */
export const MAX_LIST_ENTRIES = 1000;

/**
 * Most samples of a project's duty cycle (dutyCycle.t_s, speed_rpm, torque_Nm): 83 minutes at 10 ms;
 * a 16 MiB project file holds about this many. Refused by its length before any sample is read.
 */
export const MAX_DUTY_CYCLE_SAMPLES = 500_000;

/** The lists MAX_LIST_ENTRIES applies to, as paths from the project root. */
export const CAPPED_LISTS: readonly (readonly string[])[] = [
  ['requirements'],
  ['scenario', 'speedSteps'],
  ['scenario', 'torqueSteps'],
  ['scenario', 'loadSteps'],
  ['scenario', 'loadRamps'],
];

/** unit ('' = dimensionless or text) and meaning of every key of the project file */
export const KEYS: Readonly<Record<string, { unit: string; doc: string }>> = {
  format: { unit: '', doc: `always "${PROJECT_FORMAT}"` },
  version: { unit: '', doc: `file format version, ${PROJECT_VERSION}` },
  name: { unit: '', doc: 'project name' },
  note: { unit: '', doc: 'free text' },

  motor: { unit: '', doc: 'dq model at 20 °C (give this or nameplate)' },
  'motor.polePairs': { unit: '', doc: 'pole pairs p (not poles)' },
  'motor.Rs': { unit: 'ohm', doc: 'stator resistance per phase (star equivalent) at 20 °C' },
  'motor.Ld': { unit: 'H', doc: 'd-axis inductance per phase' },
  'motor.Lq': { unit: 'H', doc: 'q-axis inductance per phase' },
  'motor.psiM': { unit: 'Wb', doc: 'peak magnet flux linkage per phase at 20 °C' },
  'motor.inertia': { unit: 'kg·m²', doc: 'rotor inertia' },
  'motor.viscousFriction': { unit: 'N·m·s/rad', doc: 'viscous friction B, default 0' },
  'motor.coulombFriction': { unit: 'N·m', doc: 'Coulomb friction, default 0' },
  'motor.maxSpeed_rpm': { unit: 'rpm', doc: 'maximum mechanical speed (safety checks and plot range)' },
  'motor.ratedCurrent': { unit: 'A', doc: "the motor's rated (continuous) phase current, A peak; the continuous limit is the lower of this and inverter.Icont" },
  'motor.peakCurrent': { unit: 'A', doc: "the motor's peak phase current (demagnetisation and heat), A peak; the peak limit is the lower of this and inverter.Imax" },
  'motor.fluxMap': { unit: '', doc: 'measured or computed flux linkages on a grid of dq currents {magnetTemp_C, id_A, iq_A, psid_Wb, psiq_Wb}, given instead of Ld, Lq and psiM' },
  'motor.fluxMap.magnetTemp_C': { unit: '°C', doc: 'magnet temperature of the map' },
  'motor.fluxMap.id_A': { unit: '', doc: 'grid of d-axis current, A peak, strictly ascending, 2 to 101 entries, covering the peak current limit both ways' },
  'motor.fluxMap.id_A[]': { unit: 'A', doc: 'd-axis current (A peak)' },
  'motor.fluxMap.iq_A': { unit: '', doc: 'grid of q-axis current, A peak, strictly ascending, 2 to 101 entries; starting at 0 or above = iq >= 0 only, mirrored (psi_d even, psi_q odd in iq)' },
  'motor.fluxMap.iq_A[]': { unit: 'A', doc: 'q-axis current (A peak)' },
  'motor.fluxMap.psid_Wb': { unit: '', doc: 'd-axis flux linkage per phase, Wb peak: psid_Wb[i][j] at id_A[i], iq_A[j]; one row per id_A entry, one column per iq_A entry; increasing with id' },
  'motor.fluxMap.psid_Wb[]': { unit: '', doc: 'one row of psi_d, at one id_A entry, one value per iq_A entry' },
  'motor.fluxMap.psid_Wb[][]': { unit: 'Wb', doc: 'd-axis flux linkage (Wb peak)' },
  'motor.fluxMap.psiq_Wb': { unit: '', doc: 'q-axis flux linkage per phase, Wb peak: psiq_Wb[i][j] at id_A[i], iq_A[j]; one row per id_A entry, one column per iq_A entry; increasing with iq' },
  'motor.fluxMap.psiq_Wb[]': { unit: '', doc: 'one row of psi_q, at one id_A entry, one value per iq_A entry' },
  'motor.fluxMap.psiq_Wb[][]': { unit: 'Wb', doc: 'q-axis flux linkage (Wb peak)' },

  nameplate: { unit: '', doc: 'motor in datasheet terms (give this or motor)' },
  'nameplate.poles': { unit: '', doc: 'number of magnet poles (even); or polePairs' },
  'nameplate.polePairs': { unit: '', doc: 'pole pairs; or poles' },
  'nameplate.R': { unit: '', doc: 'winding resistance {value, basis, temp_C}' },
  'nameplate.R.value': { unit: 'ohm', doc: 'resistance' },
  'nameplate.R.basis': { unit: '', doc: '"phase" or "line-to-line" (star equivalent = half)' },
  'nameplate.R.temp_C': { unit: '°C', doc: 'temperature of the measurement, default 20' },
  'nameplate.L': { unit: '', doc: 'synchronous inductance of a surface-magnet motor {value, basis}' },
  'nameplate.L.value': { unit: 'H', doc: 'inductance' },
  'nameplate.L.basis': { unit: '', doc: '"phase" or "line-to-line"' },
  'nameplate.Ld': { unit: '', doc: 'd-axis inductance {value, basis}' },
  'nameplate.Ld.value': { unit: 'H', doc: 'inductance' },
  'nameplate.Ld.basis': { unit: '', doc: '"phase" or "line-to-line"' },
  'nameplate.Lq': { unit: '', doc: 'q-axis inductance {value, basis}; missing = surface magnet' },
  'nameplate.Lq.value': { unit: 'H', doc: 'inductance' },
  'nameplate.Lq.basis': { unit: '', doc: '"phase" or "line-to-line"' },
  'nameplate.Ke': { unit: '', doc: 'back-EMF constant {value, unit, temp_C}' },
  'nameplate.Ke.value': { unit: '', doc: 'in the stated unit' },
  'nameplate.Ke.unit': { unit: '', doc: '"V_LL_rms/krpm", "V_LL_peak/krpm" or "V_ph_peak*s/rad" (per electrical rad/s)' },
  'nameplate.Ke.temp_C': { unit: '°C', doc: 'magnet temperature of the measurement, default 20' },
  'nameplate.Kt': { unit: '', doc: 'torque constant {value, unit, temp_C}' },
  'nameplate.Kt.value': { unit: '', doc: 'in the stated unit' },
  'nameplate.Kt.unit': { unit: '', doc: '"Nm/A_rms" or "Nm/A_peak"' },
  'nameplate.Kt.temp_C': { unit: '°C', doc: 'magnet temperature, default that of Ke' },
  'nameplate.ratedCurrent': { unit: '', doc: 'rated phase current {value, basis}' },
  'nameplate.ratedCurrent.value': { unit: 'A', doc: 'current' },
  'nameplate.ratedCurrent.basis': { unit: '', doc: '"rms" or "peak"' },
  'nameplate.peakCurrent': { unit: '', doc: 'peak phase current {value, basis}' },
  'nameplate.peakCurrent.value': { unit: 'A', doc: 'current' },
  'nameplate.peakCurrent.basis': { unit: '', doc: '"rms" or "peak"' },
  'nameplate.ratedSpeed_rpm': { unit: 'rpm', doc: 'rated speed' },
  'nameplate.ratedTorque_Nm': { unit: 'N·m', doc: 'rated torque' },
  'nameplate.maxSpeed_rpm': { unit: 'rpm', doc: 'maximum mechanical speed' },
  'nameplate.inertia': { unit: 'kg·m²', doc: 'rotor inertia' },
  'nameplate.viscousFriction': { unit: 'N·m·s/rad', doc: 'viscous friction, default 0' },
  'nameplate.coulombFriction': { unit: 'N·m', doc: 'Coulomb friction, default 0' },

  inverter: { unit: '', doc: 'the drive' },
  'inverter.Vdc': { unit: 'V', doc: 'DC-bus voltage' },
  'inverter.Imax': { unit: 'A', doc: 'peak phase current limit (A peak)' },
  'inverter.Icont': { unit: 'A', doc: 'continuous phase current limit (A peak), <= Imax' },
  'inverter.modulation': { unit: '', doc: '"sinusoidal", "svpwm" or "six-step"; "svpwm" when not given (with a finding)' },
  'inverter.voltageUtilization': { unit: '', doc: 'fraction of the modulation limit, 0.001 to 1, default 1' },
  'inverter.deviceDrop': { unit: 'V', doc: 'on-state drop per device, default 0' },

  conditions: { unit: '', doc: 'temperatures; when absent every temperature is 20 °C (with a finding)' },
  'conditions.windingTemp_C': { unit: '°C', doc: 'winding temperature, hot corner, 20 when not given (with a finding)' },
  'conditions.magnetTemp_C': { unit: '°C', doc: 'magnet temperature, hot corner, default 20' },
  'conditions.coldTemp_C': { unit: '°C', doc: 'winding and magnet temperature, cold corner (highest back-EMF), 20 when not given (with a finding)' },
  'conditions.magnetTempCoeff': { unit: '/K', doc: 'remanence coefficient, -0.003..0.001, default -0.0012 (sintered NdFeB; SmCo about -0.0004)' },

  requirements: { unit: '', doc: `operating points to meet, at most ${MAX_LIST_ENTRIES}` },
  'requirements[]': { unit: '', doc: '{label, speed_rpm, torque_Nm, duty}' },
  'requirements[].label': { unit: '', doc: 'name of the point' },
  'requirements[].speed_rpm': { unit: 'rpm', doc: 'mechanical speed, >= 0' },
  'requirements[].torque_Nm': { unit: 'N·m', doc: 'torque; negative = braking' },
  'requirements[].duty': { unit: '', doc: '"peak" (default: checked against the peak current limit) or "continuous" (checked against the continuous limit, the lower of inverter.Icont and the motor\'s rated current)' },

  control: { unit: '', doc: 'the drive controller' },
  'control.mode': { unit: '', doc: '"speed", "torque" or "current-step", default "speed"' },
  'control.fCtrl_Hz': { unit: 'Hz', doc: 'control (current-loop) rate, default 10000' },
  'control.delaySamples': { unit: '', doc: 'periods between sampling and applying the voltage, default 1' },
  'control.currentBandwidth_Hz': { unit: 'Hz', doc: 'current-loop bandwidth (or currentKp/currentKi)' },
  'control.currentKp': { unit: 'V/A', doc: 'current PI proportional gain' },
  'control.currentKi': { unit: 'V/(A·s)', doc: 'current PI integral gain' },
  'control.speedBandwidth_Hz': { unit: 'Hz', doc: 'speed-loop bandwidth (or speedKp/speedKi or speedTuning)' },
  'control.speedKp': { unit: 'N·m·s/rad', doc: 'speed PI proportional gain' },
  'control.speedKi': { unit: 'N·m/rad', doc: 'speed PI integral gain' },
  'control.speedTuning': { unit: '', doc: '{method, a}' },
  'control.speedTuning.method': { unit: '', doc: '"symmetric-optimum" or "bandwidth" (bandwidth needs speedBandwidth_Hz)' },
  'control.speedTuning.a': { unit: '', doc: 'symmetric-optimum spacing a > 1, default 2' },
  'control.antiWindup': { unit: '', doc: '"clamping" or "back-calculation", default "clamping"' },
  'control.decoupling': { unit: '', doc: 'dq decoupling and back-EMF feed-forward, default true' },
  'control.speedPrefilter': { unit: '', doc: 'first-order filter on the speed reference with the speed PI time constant Kp/Ki (tames the symmetric optimum overshoot), default false' },
  'control.speedRamp_rpm_per_s': { unit: 'rpm/s', doc: 'speed reference ramp limit; absent = none' },
  'control.speedLoopDivider': { unit: '', doc: 'speed loop runs every N current periods, default 1' },
  'control.pwm': { unit: '', doc: 'how the simulation models the inverter\'s pulse-width modulation {model, fsw_Hz, deadTime_s, modulation, deviceDrop, window_s}; absent = the averaged inverter' },
  'control.pwm.model': { unit: '', doc: '"average" (default: the controller\'s voltage applied as the mean over each period) or "switching" (each carrier period split at the switching instants of the three legs: current ripple, dead time, DC-link current)' },
  'control.pwm.fsw_Hz': { unit: 'Hz', doc: 'carrier (switching) frequency, symmetric carrier with centred pulses; control.fCtrl_Hz when not given; control.fCtrl_Hz must be one (update at the carrier\'s valley) or two times it (valley and peak)' },
  'control.pwm.deadTime_s': { unit: 's', doc: 'dead time between one device of a leg turning off and the other turning on, below a quarter of the carrier period, default 0' },
  'control.pwm.modulation': { unit: '', doc: '"sinusoidal" (sine-triangle), "svpwm" (min-max zero-sequence injection, centred space-vector PWM) or "dpwm1" (discontinuous: the leg of the largest voltage clamped to its rail for 60° around its peak); from inverter.modulation when not given ("six-step" gives "svpwm")' },
  'control.pwm.window_s': { unit: 's', doc: 'the switching model\'s zoom window {from, to}: full-resolution traces at every switching instant from `from` to `to` (at most 200 000 samples); the last two fundamental periods of the run when not given' },
  'control.pwm.window_s.from': { unit: 's', doc: 'start of the switching model\'s zoom window' },
  'control.pwm.window_s.to': { unit: 's', doc: 'end of the switching model\'s zoom window, after its start' },
  'control.pwm.deviceDrop': { unit: 'V', doc: 'on-state drop of a conducting switch or diode, against its current; inverter.deviceDrop when not given' },

  scenario: { unit: '', doc: 'what the simulation does' },
  'scenario.duration_s': { unit: 's', doc: 'simulated time' },
  'scenario.initialSpeed_rpm': { unit: 'rpm', doc: 'speed at t = 0, default 0' },
  'scenario.speedSteps': { unit: '', doc: `speed reference steps [{t_s, speed_rpm}], at most ${MAX_LIST_ENTRIES}` },
  'scenario.speedSteps[]': { unit: '', doc: '{t_s, speed_rpm}' },
  'scenario.speedSteps[].t_s': { unit: 's', doc: 'time of the step' },
  'scenario.speedSteps[].speed_rpm': { unit: 'rpm', doc: 'new speed reference' },
  'scenario.torqueSteps': { unit: '', doc: `torque reference steps (torque mode) [{t_s, torque_Nm}], at most ${MAX_LIST_ENTRIES}` },
  'scenario.torqueSteps[]': { unit: '', doc: '{t_s, torque_Nm}' },
  'scenario.torqueSteps[].t_s': { unit: 's', doc: 'time of the step' },
  'scenario.torqueSteps[].torque_Nm': { unit: 'N·m', doc: 'new torque reference' },
  'scenario.loadSteps': { unit: '', doc: `load torque steps [{t_s, torque_Nm}], at most ${MAX_LIST_ENTRIES}` },
  'scenario.loadSteps[]': { unit: '', doc: '{t_s, torque_Nm}' },
  'scenario.loadSteps[].t_s': { unit: 's', doc: 'time of the step' },
  'scenario.loadSteps[].torque_Nm': { unit: 'N·m', doc: 'new load torque (opposes motoring)' },
  'scenario.loadRamps': { unit: '', doc: `load torque ramps [{t_s, duration_s, torque_Nm}], at most ${MAX_LIST_ENTRIES}` },
  'scenario.loadRamps[]': { unit: '', doc: 'from the load at t_s, linearly to torque_Nm over duration_s' },
  'scenario.loadRamps[].t_s': { unit: 's', doc: 'start of the ramp' },
  'scenario.loadRamps[].duration_s': { unit: 's', doc: 'length of the ramp' },
  'scenario.loadRamps[].torque_Nm': { unit: 'N·m', doc: 'load torque at the end of the ramp' },
  'scenario.loadModel': { unit: '', doc: 'speed-dependent load {kind: "quadratic", k}, T = k omega_m²' },
  'scenario.loadModel.kind': { unit: '', doc: '"quadratic"' },
  'scenario.loadModel.k': { unit: 'N·m·s²/rad²', doc: 'fan or pump coefficient' },
  'scenario.loadInertia': { unit: 'kg·m²', doc: 'inertia of the load, default 0' },
  'scenario.currentStep': { unit: '', doc: 'locked-rotor current step {id_A, iq_A, t_s} (current-step mode)' },
  'scenario.currentStep.id_A': { unit: 'A', doc: 'd-axis current reference after the step (A peak)' },
  'scenario.currentStep.iq_A': { unit: 'A', doc: 'q-axis current reference after the step (A peak)' },
  'scenario.currentStep.t_s': { unit: 's', doc: 'time of the step' },

  losses: { unit: '', doc: 'loss coefficients of the motor and the inverter {iron, windage, inverter}; every part and every coefficient may be left out, and a loss whose coefficients are absent is zero' },
  'losses.iron': { unit: '', doc: 'iron loss of the motor P_fe = kh f psi^beta + ke f² psi², f the electrical frequency, psi the flux-linkage amplitude |psi_dq| (Wb peak), fitted from a no-load loss test {kh, beta, ke}; absent = no iron loss' },
  'losses.iron.kh': { unit: 'W/(Hz·Wb^beta)', doc: 'hysteresis coefficient kh (W per Hz per Wb^beta), >= 0; default 0 (no hysteresis loss)' },
  'losses.iron.beta': { unit: '', doc: 'exponent beta of the flux linkage in the hysteresis term, 1 to 3, default 2' },
  'losses.iron.ke': { unit: 'W/(Hz²·Wb²)', doc: 'eddy-current coefficient ke (W per Hz² per Wb²), >= 0; default 0 (no eddy-current loss)' },
  'losses.windage': { unit: '', doc: 'windage of the rotor, kw omega_m³, besides the friction of the motor section {kw}; absent = no windage' },
  'losses.windage.kw': { unit: 'W·s³/rad³', doc: 'windage coefficient kw (loss kw omega_m³, omega_m the mechanical speed in rad/s), >= 0; default 0 (no windage)' },
  'losses.inverter': { unit: '', doc: 'losses of the two-level three-phase bridge, per switch and its diode (six of each) {Vce0, rce, Vf0, rd, EonEoff_J, Err_J, Vref_V, Iref_A, fsw_Hz}; absent = a lossless inverter' },
  'losses.inverter.Vce0': { unit: 'V', doc: 'on-state threshold voltage of the switch (IGBT Vce0), >= 0; 0 for a MOSFET (rce only); default 0' },
  'losses.inverter.rce': { unit: 'ohm', doc: 'on-state slope resistance of the switch (IGBT rce, MOSFET Rds_on), >= 0; default 0' },
  'losses.inverter.Vf0': { unit: 'V', doc: 'forward threshold voltage of the diode (a MOSFET\'s body diode), >= 0; default 0' },
  'losses.inverter.rd': { unit: 'ohm', doc: 'forward slope resistance of the diode, >= 0; default 0' },
  'losses.inverter.EonEoff_J': { unit: 'J', doc: 'turn-on plus turn-off energy of one switch at Vref_V and Iref_A, >= 0; default 0 (no switching loss)' },
  'losses.inverter.Err_J': { unit: 'J', doc: 'reverse-recovery energy of one diode at Vref_V and Iref_A, >= 0; default 0 (no recovery loss)' },
  'losses.inverter.Vref_V': { unit: 'V', doc: 'DC voltage at which EonEoff_J and Err_J were measured, > 0; required when either is above 0' },
  'losses.inverter.Iref_A': { unit: 'A', doc: 'current at which EonEoff_J and Err_J were measured (A peak), > 0; required when either is above 0' },
  'losses.inverter.fsw_Hz': { unit: 'Hz', doc: 'switching frequency of the bridge, > 0; required when EonEoff_J or Err_J is above 0' },

  thermal: { unit: '', doc: 'lumped thermal network of the motor and the inverter: winding node -- stator node -- coolant, and one junction per switch position -- coolant; a node is one body at one temperature with a heat capacity; copper loss heats the winding, iron loss the stator, a sixth of the inverter loss each junction; absent = no thermal rating' },
  'thermal.coolantTemp_C': { unit: '°C', doc: 'temperature of the coolant (water jacket, or the ambient air of a self-ventilated motor), -60 to 250' },
  'thermal.windingCapacity_J_per_K': { unit: 'J/K', doc: 'heat capacity of the winding node (copper and insulation), > 0' },
  'thermal.windingToStator_K_per_W': { unit: 'K/W', doc: 'thermal resistance from the winding node to the stator node (slot insulation, impregnation), > 0' },
  'thermal.statorCapacity_J_per_K': { unit: 'J/K', doc: 'heat capacity of the stator node (lamination stack and housing), > 0' },
  'thermal.statorToCoolant_K_per_W': { unit: 'K/W', doc: 'thermal resistance from the stator node to the coolant, > 0; at every speed unless statorToCoolantBySpeed is given' },
  'thermal.statorToCoolantBySpeed': { unit: '', doc: `a self-ventilated motor: the stator-to-coolant resistance against |speed| {speed_rpm, K_per_W}, linear in between and held beyond the ends, 2 to ${MAX_LIST_ENTRIES} entries; replaces statorToCoolant_K_per_W` },
  'thermal.statorToCoolantBySpeed.speed_rpm': { unit: '', doc: `mechanical speeds, rpm, >= 0, strictly ascending, 2 to ${MAX_LIST_ENTRIES} entries` },
  'thermal.statorToCoolantBySpeed.speed_rpm[]': { unit: 'rpm', doc: 'mechanical speed' },
  'thermal.statorToCoolantBySpeed.K_per_W': { unit: '', doc: 'stator-to-coolant resistance at each speed, K/W, > 0, one per speed_rpm entry' },
  'thermal.statorToCoolantBySpeed.K_per_W[]': { unit: 'K/W', doc: 'stator-to-coolant resistance' },
  'thermal.magnetAboveStator_K': { unit: 'K', doc: 'magnet temperature above the stator node (the rotor runs hotter), -100 to 200, default 0' },
  'thermal.windingMax_C': { unit: '°C', doc: "the winding's maximum temperature (its insulation class: 130 B, 155 F, 180 H), above coolantTemp_C" },
  'thermal.magnetMax_C': { unit: '°C', doc: "the magnet's maximum temperature (its grade, before irreversible demagnetisation), above coolantTemp_C" },
  'thermal.junctionToCoolant_K_per_W': { unit: 'K/W', doc: "thermal resistance from the junction of one switch position (switch and diode) to the coolant, > 0; given with junctionMax_C, or both left out (the inverter's junction not rated)" },
  'thermal.junctionMax_C': { unit: '°C', doc: "the switches' maximum junction temperature, above coolantTemp_C; given with junctionToCoolant_K_per_W" },

  tolerances: { unit: '', doc: 'tolerance bands of parameters, keyed by the parameter\'s path, each {minus_pct, plus_pct} (percent of the nominal value) or {min, max} (absolute, in the parameter\'s unit), and the Monte Carlo settings {samples, seed, distribution, sigmaOfBand}; absent = no tolerance study' },
  'tolerances.motor.Rs': { unit: 'ohm', doc: 'band of the stator resistance at 20 °C' },
  'tolerances.motor.psiM': { unit: 'Wb', doc: 'band of the magnet flux linkage at 20 °C (constant-term motor)' },
  'tolerances.motor.Ld': { unit: 'H', doc: 'band of the d-axis inductance (constant-term motor)' },
  'tolerances.motor.Lq': { unit: 'H', doc: 'band of the q-axis inductance (constant-term motor)' },
  'tolerances.motor.fluxMap.magnetFlux': { unit: 'Wb', doc: "band of the flux map's magnet flux, psi_d at zero current of the map as given: the whole psi_d table shifts by the change" },
  'tolerances.motor.fluxMap.scale': { unit: '', doc: "band of a scale on the flux map, 1 nominal: psi_d - psi_d(0, 0) and psi_q are multiplied by it (every inductance of the map scaled)" },
  'tolerances.nameplate.R': { unit: '', doc: 'band of the nameplate resistance value, in its stated basis' },
  'tolerances.nameplate.Ke': { unit: '', doc: 'band of the nameplate back-EMF constant value, in its stated unit' },
  'tolerances.nameplate.Kt': { unit: '', doc: 'band of the nameplate torque constant value, in its stated unit' },
  'tolerances.nameplate.L': { unit: '', doc: 'band of the nameplate inductance value, in its stated basis' },
  'tolerances.nameplate.Ld': { unit: '', doc: 'band of the nameplate d-axis inductance value, in its stated basis' },
  'tolerances.nameplate.Lq': { unit: '', doc: 'band of the nameplate q-axis inductance value, in its stated basis' },
  'tolerances.inverter.Vdc': { unit: 'V', doc: 'band of the DC-bus voltage' },
  'tolerances.inverter.Imax': { unit: 'A', doc: "band of the inverter's peak current limit (A peak); the continuous limit is held at or below it" },
  'tolerances.thermal.coolantTemp_C': { unit: '°C', doc: 'band of the coolant temperature (with a thermal section)' },
  'tolerances.monteCarlo': { unit: '', doc: 'Monte Carlo settings {samples, seed, distribution, sigmaOfBand}' },
  'tolerances.monteCarlo.samples': { unit: '', doc: 'number of samples, 1 to 1000000, default 1000' },
  'tolerances.monteCarlo.seed': { unit: '', doc: 'seed of the random draws, a whole number 0 to 4294967295, default 1; sample n is drawn from the seed and n alone' },
  'tolerances.monteCarlo.distribution': { unit: '', doc: '"uniform" over each band (default) or "normal" about the nominal value, truncated to the band' },
  'tolerances.monteCarlo.sigmaOfBand': { unit: '', doc: 'standard deviation of the normal distribution as a fraction of the half band, > 0 to 10, default 0.33' },

  dutyCycle: { unit: '', doc: `the application's load cycle {label, t_s, speed_rpm, torque_Nm}: columns of samples, linear in between, equal lengths, 2 to ${MAX_DUTY_CYCLE_SAMPLES} samples` },
  'dutyCycle.label': { unit: '', doc: 'name of the cycle, default empty' },
  'dutyCycle.t_s': { unit: 's', doc: 'time of each sample, s: the first 0, strictly ascending' },
  'dutyCycle.speed_rpm': { unit: 'rpm', doc: 'mechanical speed at each sample, rpm; negative = reverse' },
  'dutyCycle.torque_Nm': { unit: 'N·m', doc: 'shaft torque at each sample, N·m; negative = braking when the speed is positive' },
};

/** A key's documentation as the schema describes it: "meaning [unit]", or the meaning alone. */
export function keyDoc(path: string): string {
  const k = KEYS[path];
  if (!k) throw new Error(`no KEYS entry for ${path}`);
  return k.unit ? `${k.doc} [${k.unit}]` : k.doc;
}
