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
