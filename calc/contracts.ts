/**
 * Contracts between calc/ domains, kept in one place so that a domain can be built and tested
 * without the others: the assessment (calc/assess) consumes a part-load curve that either a generic
 * permanent-magnet model or a sized BLDC design (calc/bldc) produces; the dynamic simulation
 * (calc/dynamics) consumes the electrical parameters of a sized design.
 */

/** One point of a part-load curve. */
export interface PartLoadPoint {
  /** Shaft load as a fraction of rated output [-], 0 to 1.25. */
  loadFraction: number;
  /** Efficiency of the whole option at this load, motor and drive together [-], 0 to 1. */
  efficiency: number;
  /** Power factor seen by the supply at this load [-], 0 to 1 (for a drive: displacement × distortion). */
  powerFactor: number;
}

/**
 * A measured or computed part-load curve for an option; `assess` interpolates it linearly in load
 * and uses it instead of a class-based model. Points are sorted by loadFraction and cover 0.1–1.25.
 */
export interface PartLoadCurve {
  /** What produced the curve, for the assumptions list (e.g. "BLDC design #12, 24 slots / 20 poles"). */
  source: string;
  /** Rated shaft power the curve is normalised to [kW]. */
  ratedPowerKw: number;
  points: PartLoadPoint[];
}

/**
 * The electrical and mechanical parameters of a sized BLDC that a time-domain simulation needs.
 * `size-bldc` returns them (field `simulationParams`); `simulate` accepts them directly.
 */
export interface BldcSimulationParams {
  /** Phase resistance at operating temperature [Ω]. */
  phaseResistanceOhm: number;
  /** Phase self-inductance [H]. */
  phaseInductanceH: number;
  /** Mutual inductance between two phases [H], negative or zero by the usual sign convention. */
  mutualInductanceH: number;
  /** Phase back-EMF flat-top value per mechanical angular speed [V·s/rad]. */
  backEmfConstantVsPerRad: number;
  /** Width of the back-EMF flat top [electrical degrees], 120 for an ideal trapezoid. */
  flatTopElectricalDeg: number;
  /** Pole pairs [-]. */
  polePairs: number;
  /** Rotor inertia [kg·m²]. */
  inertiaKgM2: number;
  /** Viscous friction coefficient [N·m·s/rad]. */
  viscousFrictionNmsPerRad: number;
  /** DC bus voltage [V]. */
  dcBusV: number;
  /**
   * Optional normalised back-EMF shape over one electrical period (phase A, peak 1, samples equally
   * spaced from 0 to 2π, first sample at 0); when absent the trapezoid with flatTopElectricalDeg is used.
   */
  backEmfShape?: number[];
}

/**
 * Drive (inverter) losses as the usual three-term model: a fixed part (control, gate drive,
 * cooling fan), a part proportional to the current (switching, diode and IGBT threshold drops)
 * and one proportional to its square (on-state resistance). Current is the RMS motor current.
 */
export interface DriveLossModel {
  fixedW: number;
  perAmpereW: number;
  perAmpereSquaredOhm: number;
}

/**
 * What a steady-state loss evaluation of a sized BLDC needs at any speed and torque (efficiency
 * map, part-load curve). `size-bldc` returns it (field `lossModel`); `efficiency-map` consumes it.
 * Each "AtRated" loss is the value at rated speed; the consumer scales it with speed as stated.
 */
export interface BldcLossModel {
  ratedSpeedRpm: number;
  ratedTorqueNm: number;
  /** Highest speed the design may run at (mechanical or voltage limit) [rpm]. */
  maxSpeedRpm: number;
  /** Highest continuous torque (thermal) [N·m]; the envelope's low-speed limit. */
  maxContinuousTorqueNm: number;
  /** Peak torque at the drive's current limit [N·m]. */
  peakTorqueNm: number;
  dcBusV: number;
  polePairs: number;
  phaseResistanceOhm: number;
  /** Torque per RMS phase current [N·m/A]. */
  torqueConstantNmPerA: number;
  /** Phase back-EMF flat-top value per mechanical angular speed [V·s/rad]. */
  backEmfConstantVsPerRad: number;
  /** Stator iron hysteresis loss at rated speed [W]; scales with frequency (speed). */
  ironHysteresisAtRatedW: number;
  /** Stator iron eddy-current loss at rated speed [W]; scales with frequency squared. */
  ironEddyAtRatedW: number;
  /** Magnet eddy-current loss at rated speed and torque [W]; scales with speed² × (torque/rated)². */
  magnetEddyAtRatedW: number;
  /** Bearing friction at rated speed [W]; scales with speed. */
  frictionAtRatedW: number;
  /** Windage (and shaft fan) at rated speed [W]; scales with speed cubed. */
  windageAtRatedW: number;
  drive: DriveLossModel;
}
