/**
 * What a simulation hands back: the decimated time series (preallocated, bounded) and the summary
 * figures accumulated on the fly (time to 95 % speed, peak current, steady-state torque ripple,
 * efficiency at the DC bus, energy-balance residual).
 *
 * References: definitions common practice (torque ripple as peak-to-peak over mean, e.g.
 * D. Hanselman, Brushless Permanent Magnet Motor Design, 2006, §7.4); energy balance of the
 * phase-variable model from P. Pillay, R. Krishnan, IEEE Trans. Ind. Appl. 25(2), 1989.
 */

/** Share of the run, at its end, taken as steady state for ripple and efficiency [-] (common practice, no source). */
export const DEFAULT_STEADY_WINDOW_FRACTION = 0.2;
/** Fraction of the set (or final) speed that defines the start-up time [-] (issue definition). */
export const START_UP_SPEED_FRACTION = 0.95;

const RAD_S_TO_RPM = 60 / (2 * Math.PI);

/** Names of the recorded series, in the order of SimulationSeries.values. */
export const SERIES_NAMES = [
  'timeS',
  'speedRpm',
  'torqueNm',
  'loadTorqueNm',
  'phaseCurrentAA',
  'phaseCurrentBA',
  'phaseCurrentCA',
  'phaseVoltageAV',
  'phaseVoltageBV',
  'phaseVoltageCV',
  'backEmfAV',
  'backEmfBV',
  'backEmfCV',
  'dcLinkCurrentA',
  'dcBusV',
] as const;
export type SeriesName = (typeof SERIES_NAMES)[number];

/** Decimated series: one preallocated Float64Array per name; the first `length` entries are valid. */
export interface SimulationSeries {
  length: number;
  values: Record<SeriesName, Float64Array>;
}

/** Allocates the series for at most `capacity` points. */
export function createSeries(capacity: number): SimulationSeries {
  const values = {} as Record<SeriesName, Float64Array>;
  for (const name of SERIES_NAMES) values[name] = new Float64Array(capacity);
  return { length: 0, values };
}

/** Plain-array copy of the valid part of the series (for JSON, charts and worker messages). */
export function seriesToJson(series: SimulationSeries): Record<SeriesName, number[]> {
  const out = {} as Record<SeriesName, number[]>;
  for (const name of SERIES_NAMES) out[name] = Array.from(series.values[name].subarray(0, series.length));
  return out;
}

/** Energies over the whole run [J]. */
export interface EnergyAccount {
  /** Electrical energy drawn from the DC link, ∫v_dc·i_dc dt [J]. */
  inputJ: number;
  copperLossJ: number;
  /** Work done on the load, ∫T_L·ω dt [J]. */
  loadJ: number;
  /** Viscous friction loss, ∫B·ω² dt [J]. */
  frictionJ: number;
  /** Change of kinetic energy ½·J·(ω_end² − ω_0²) [J]. */
  kineticJ: number;
  /** Change of magnetic energy ½·(L − M)·Σ i² [J]. */
  magneticJ: number;
}

/** The summary figures of a run. Null where a figure is undefined (never reached, zero mean). */
export interface SimulationSummary {
  finalSpeedRpm: number;
  /** First time the speed reaches 95 % of the set speed (or, without a speed loop, of the final speed) [s]. */
  timeTo95PctS: number | null;
  peakPhaseCurrentA: number;
  /** (T_max − T_min)/T_mean over the steady window [%]. */
  torqueRipplePct: number | null;
  /** Load work / DC-link energy over the steady window [%]. */
  efficiencyPct: number | null;
  /** (E_in − E_cu − E_load − E_fric − ΔE_kin − ΔE_mag)/E_in over the run [%]. */
  energyBalanceResidualPct: number;
  meanTorqueNm: number;
  rmsPhaseCurrentA: number;
  /** Start of the steady window [s]. */
  steadyWindowStartS: number;
  energies: EnergyAccount;
}

/** Accumulates the summary at every step of the nominal grid; numbers only, no allocation. */
export class SummaryTracker {
  peakCurrent = 0;
  crossingTime = Number.NaN;
  private previousTime = 0;
  private previousSpeed = 0;
  windowCount = 0;
  torqueMax = -Infinity;
  torqueMin = Infinity;
  torqueSum = 0;
  currentSquareSum = 0;
  windowInputJ = Number.NaN;
  windowLoadJ = Number.NaN;

  /**
   * @param windowStartS start of the steady window [s]
   * @param targetSpeedRadS speed whose 95 % is tracked on the fly [rad/s], or NaN to derive it at the end
   */
  constructor(
    readonly windowStartS: number,
    readonly targetSpeedRadS: number,
  ) {
    this.threshold = START_UP_SPEED_FRACTION * targetSpeedRadS;
  }

  /** 95 % of the target speed [rad/s] (NaN without a target: never crossed on the fly). */
  private readonly threshold: number;

  /**
   * Time of the next sample [s]. A field rather than an argument: V8 boxes the floating-point
   * arguments of a call it does not inline, which would allocate on every grid step.
   */
  time = 0;

  /**
   * Takes one grid sample at `time`.
   * @param x state vector (currents [A], speed [rad/s], energy integrals [J]; indices of model.ts)
   * @param aux auxiliary outputs at x (electromagnetic torque [N·m]; indices of model.ts)
   */
  sample(x: Float64Array, aux: Float64Array): void {
    const timeS = this.time;
    // Indices of S_CURRENT_A…, S_SPEED, S_ENERGY_IN, S_ENERGY_LOAD and AUX_TORQUE in model.ts (simulate.ts checks them).
    const ia = x[0] as number;
    const ib = x[1] as number;
    const ic = x[2] as number;
    const speedRadS = x[3] as number;
    const torqueNm = aux[1] as number;
    const absA = ia < 0 ? -ia : ia;
    const absB = ib < 0 ? -ib : ib;
    const absC = ic < 0 ? -ic : ic;
    const peak = absA > absB ? (absA > absC ? absA : absC) : absB > absC ? absB : absC;
    if (peak > this.peakCurrent) this.peakCurrent = peak;
    if (speedRadS >= this.threshold && Number.isNaN(this.crossingTime)) {
      // Linear interpolation between grid points.
      const rise = speedRadS - this.previousSpeed;
      this.crossingTime = rise > 0 && timeS > 0 ? timeS - ((speedRadS - this.threshold) / rise) * (timeS - this.previousTime) : timeS;
    }
    this.previousTime = timeS;
    this.previousSpeed = speedRadS;
    if (timeS >= this.windowStartS) {
      if (this.windowCount === 0) {
        this.windowInputJ = x[6] as number;
        this.windowLoadJ = x[8] as number;
      }
      this.windowCount += 1;
      if (torqueNm > this.torqueMax) this.torqueMax = torqueNm;
      if (torqueNm < this.torqueMin) this.torqueMin = torqueNm;
      this.torqueSum += torqueNm;
      this.currentSquareSum += (ia * ia + ib * ib + ic * ic) / 3;
    }
  }

  /**
   * Final figures.
   * @param finalSpeedRadS [rad/s]
   * @param energies energy account of the whole run [J]
   * @param inputJ @param loadJ energy integrals at the end [J]
   * @param series decimated speed, for the 95 % time without a speed loop
   */
  finish(finalSpeedRadS: number, energies: EnergyAccount, inputJ: number, loadJ: number, series: SimulationSeries): SimulationSummary {
    let crossing = this.crossingTime;
    if (Number.isNaN(this.targetSpeedRadS)) crossing = crossingFromSeries(series, START_UP_SPEED_FRACTION * finalSpeedRadS * RAD_S_TO_RPM);
    const meanTorque = this.windowCount > 0 ? this.torqueSum / this.windowCount : 0;
    const windowInput = inputJ - this.windowInputJ;
    const windowLoad = loadJ - this.windowLoadJ;
    const balance = energies.inputJ - energies.copperLossJ - energies.loadJ - energies.frictionJ - energies.kineticJ - energies.magneticJ;
    return {
      finalSpeedRpm: finalSpeedRadS * RAD_S_TO_RPM,
      timeTo95PctS: Number.isNaN(crossing) ? null : crossing,
      peakPhaseCurrentA: this.peakCurrent,
      torqueRipplePct: this.windowCount > 0 && Math.abs(meanTorque) > 1e-12 ? ((this.torqueMax - this.torqueMin) / Math.abs(meanTorque)) * 100 : null,
      efficiencyPct: this.windowCount > 0 && windowInput > 0 ? (windowLoad / windowInput) * 100 : null,
      energyBalanceResidualPct: Math.abs(energies.inputJ) > 0 ? (balance / Math.abs(energies.inputJ)) * 100 : 0,
      meanTorqueNm: meanTorque,
      rmsPhaseCurrentA: this.windowCount > 0 ? Math.sqrt(this.currentSquareSum / this.windowCount) : 0,
      steadyWindowStartS: this.windowStartS,
      energies,
    };
  }
}

/**
 * First time a decimated speed series reaches a threshold, interpolated linearly [s], or NaN.
 * @param series recorded series @param thresholdRpm [rpm]
 */
export function crossingFromSeries(series: SimulationSeries, thresholdRpm: number): number {
  const time = series.values.timeS;
  const speed = series.values.speedRpm;
  for (let i = 0; i < series.length; i++) {
    const value = speed[i] as number;
    if (value >= thresholdRpm) {
      if (i === 0) return time[0] as number;
      const before = speed[i - 1] as number;
      const t0 = time[i - 1] as number;
      return t0 + ((thresholdRpm - before) / (value - before)) * ((time[i] as number) - t0);
    }
  }
  return Number.NaN;
}
