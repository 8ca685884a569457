/**
 * Steady-state efficiency of the BLDC and its drive over a speed × torque grid, with the
 * torque–speed envelope of the six-step drive (current limit, thermal limit, DC-bus voltage limit).
 *
 * References:
 * [1] R. Krishnan, Electric Motor Drives, 2001, §9.4 (steady-state torque–speed characteristic of the
 *     six-step PM brushless DC drive: V_dc = 2·k_e·ω + 2·R·I).
 * [2] J. R. Hendershot, T. J. E. Miller, Design of Brushless Permanent-Magnet Machines, 2010, ch. 9
 *     (loss segregation: copper ∝ I², hysteresis ∝ f, eddy ∝ f², friction ∝ n, windage ∝ n³).
 * [3] IEC 61800-9-2:2017, Annex A (drive losses as fixed + ∝ I + ∝ I² terms).
 */
import type { BldcLossModel } from '../contracts.js';
import { CalcInputError, requireNonNegative, requirePositive } from '../errors.js';

/** Samples of the envelope curve from standstill to its highest speed [-]. */
export const ENVELOPE_POINTS = 61;
/** Longest speed or torque axis of one map [-] (bounds the work of a request). */
export const MAX_MAP_AXIS = 200;
/** RMS over flat-top value of a 120° block current, √(2/3) [-] ([1] §9.4). */
export const BLOCK_CURRENT_RMS_FACTOR = Math.sqrt(2 / 3);

const RPM_TO_RAD_S = (2 * Math.PI) / 60;

/** The losses of one operating point [W] and its efficiency [-]. */
export interface OperatingPointLosses {
  copperW: number;
  ironW: number;
  magnetW: number;
  mechanicalW: number;
  driveW: number;
  totalW: number;
  outputW: number;
  inputW: number;
  /** Motor + drive efficiency, output / input [-]; 0 where the output is 0. */
  efficiency: number;
}

/**
 * Losses and efficiency of motor and drive at one steady operating point ([2], [3]):
 *   I_rms = T / K_t,  P_cu = 3·R·I_rms²,  P_fe = P_h·(n/n_r) + P_e·(n/n_r)²,
 *   P_mag = P_m·(n/n_r)²·(T/T_r)²,  P_mech = P_f·(n/n_r) + P_w·(n/n_r)³,
 *   P_drive = P_0 + k_1·I_rms + k_2·I_rms²,  η = T·ω / (T·ω + ΣP).
 * @param model loss model of the sized design
 * @param speedRpm shaft speed [rpm], ≥ 0
 * @param torqueNm shaft torque [N·m], ≥ 0
 */
export function operatingPointLosses(model: BldcLossModel, speedRpm: number, torqueNm: number): OperatingPointLosses {
  const speedRatio = speedRpm / model.ratedSpeedRpm;
  const torqueRatio = torqueNm / model.ratedTorqueNm;
  const currentRms = torqueNm / model.torqueConstantNmPerA;
  const copperW = 3 * model.phaseResistanceOhm * currentRms * currentRms;
  const ironW = model.ironHysteresisAtRatedW * speedRatio + model.ironEddyAtRatedW * speedRatio * speedRatio;
  const magnetW = model.magnetEddyAtRatedW * speedRatio * speedRatio * torqueRatio * torqueRatio;
  const mechanicalW = model.frictionAtRatedW * speedRatio + model.windageAtRatedW * speedRatio ** 3;
  const driveW = model.drive.fixedW + model.drive.perAmpereW * currentRms + model.drive.perAmpereSquaredOhm * currentRms * currentRms;
  const totalW = copperW + ironW + magnetW + mechanicalW + driveW;
  const outputW = torqueNm * speedRpm * RPM_TO_RAD_S;
  const inputW = outputW + totalW;
  return { copperW, ironW, magnetW, mechanicalW, driveW, totalW, outputW, inputW, efficiency: inputW > 0 ? outputW / inputW : 0 };
}

/**
 * Highest torque of the six-step drive at a speed [N·m] ([1] §9.4): the lesser of the current-limit
 * (peak) torque and the voltage-limit torque, where two phases in series on their flat tops need
 * V_dc ≥ 2·k_e·ω + 2·R·I, so I ≤ (V_dc − 2·k_e·ω)/(2R) and T = K_t·√(2/3)·I (K_t per RMS ampere);
 * zero above maxSpeedRpm.
 * @param model loss model @param speedRpm [rpm]
 * @returns peak (short-time) and continuous envelope torques [N·m]
 */
export function envelopeTorque(model: BldcLossModel, speedRpm: number): { peakNm: number; continuousNm: number } {
  if (speedRpm > model.maxSpeedRpm) return { peakNm: 0, continuousNm: 0 };
  const speed = speedRpm * RPM_TO_RAD_S;
  const flatTopCurrent = Math.max(0, (model.dcBusV - 2 * model.backEmfConstantVsPerRad * speed) / (2 * model.phaseResistanceOhm));
  const voltageLimitNm = model.torqueConstantNmPerA * BLOCK_CURRENT_RMS_FACTOR * flatTopCurrent;
  return { peakNm: Math.min(model.peakTorqueNm, voltageLimitNm), continuousNm: Math.min(model.maxContinuousTorqueNm, voltageLimitNm) };
}

/** The map: efficiency and loss grids indexed [torque][speed], null outside the envelope, and the envelope. */
export interface EfficiencyMap {
  speedsRpm: number[];
  torquesNm: number[];
  /** efficiencyPct[i][j] at torquesNm[i], speedsRpm[j] [%]; null above the peak envelope. */
  efficiencyPct: (number | null)[][];
  /** Total motor + drive loss [W], same indexing; null outside. */
  totalLossW: (number | null)[][];
  envelope: {
    speedsRpm: number[];
    /** Peak torque (current and voltage limits) [N·m]. */
    maxTorqueNm: number[];
    /** Continuous torque (thermal and voltage limits) [N·m]. */
    continuousTorqueNm: number[];
    /** Speed where the voltage limit starts to cut the peak torque [rpm]. */
    baseSpeedRpm: number;
    /** Ideal no-load speed V_dc / (2·k_e) [rpm]. */
    noLoadSpeedRpm: number;
  };
  /** Highest efficiency inside the envelope and where [%, rpm, N·m]. */
  best: { efficiencyPct: number; speedRpm: number; torqueNm: number } | null;
}

/** Checks a loss model; throws CalcInputError naming the field under `field`. */
export function validateLossModel(model: BldcLossModel, field: string): void {
  for (const name of ['ratedSpeedRpm', 'ratedTorqueNm', 'maxSpeedRpm', 'maxContinuousTorqueNm', 'peakTorqueNm', 'dcBusV', 'phaseResistanceOhm', 'torqueConstantNmPerA', 'backEmfConstantVsPerRad'] as const) {
    requirePositive(`${field}.${name}`, model[name]);
  }
  for (const name of ['ironHysteresisAtRatedW', 'ironEddyAtRatedW', 'magnetEddyAtRatedW', 'frictionAtRatedW', 'windageAtRatedW'] as const) {
    requireNonNegative(`${field}.${name}`, model[name]);
  }
  requireNonNegative(`${field}.drive.fixedW`, model.drive.fixedW);
  requireNonNegative(`${field}.drive.perAmpereW`, model.drive.perAmpereW);
  requireNonNegative(`${field}.drive.perAmpereSquaredOhm`, model.drive.perAmpereSquaredOhm);
}

function validateAxis(values: readonly number[], field: string): void {
  if (values.length < 1 || values.length > MAX_MAP_AXIS) throw new CalcInputError(field, `must have 1 to ${MAX_MAP_AXIS} values`);
  values.forEach((value, index) => requireNonNegative(`${field}.${index}`, value));
}

/**
 * Efficiency map of motor and drive over speedsRpm × torquesNm (see operatingPointLosses and
 * envelopeTorque for the equations).
 * @param model loss model of the sized design
 * @param speedsRpm speed axis [rpm], each ≥ 0
 * @param torquesNm torque axis [N·m], each ≥ 0
 * @param field name of the loss model in error messages
 */
export function efficiencyMap(model: BldcLossModel, speedsRpm: readonly number[], torquesNm: readonly number[], field = 'lossModel'): EfficiencyMap {
  validateLossModel(model, field);
  validateAxis(speedsRpm, 'speedsRpm');
  validateAxis(torquesNm, 'torquesNm');
  const limits = speedsRpm.map((speed) => envelopeTorque(model, speed).peakNm);
  const efficiencyPct: (number | null)[][] = [];
  const totalLossW: (number | null)[][] = [];
  let best: EfficiencyMap['best'] = null;
  for (const torque of torquesNm) {
    const efficiencyRow: (number | null)[] = [];
    const lossRow: (number | null)[] = [];
    speedsRpm.forEach((speed, j) => {
      if (torque > (limits[j] as number) * (1 + 1e-12)) {
        efficiencyRow.push(null);
        lossRow.push(null);
        return;
      }
      const point = operatingPointLosses(model, speed, torque);
      const percent = point.efficiency * 100;
      efficiencyRow.push(percent);
      lossRow.push(point.totalW);
      if (best === null || percent > best.efficiencyPct) best = { efficiencyPct: percent, speedRpm: speed, torqueNm: torque };
    });
    efficiencyPct.push(efficiencyRow);
    totalLossW.push(lossRow);
  }
  const noLoadSpeedRpm = model.dcBusV / (2 * model.backEmfConstantVsPerRad) / RPM_TO_RAD_S;
  const topSpeed = Math.min(model.maxSpeedRpm, noLoadSpeedRpm);
  const envelopeSpeeds = Array.from({ length: ENVELOPE_POINTS }, (_, i) => (topSpeed * i) / (ENVELOPE_POINTS - 1));
  // Base speed: V_dc = 2·k_e·ω + 2·R·I at the peak torque's flat-top current.
  const peakCurrent = model.peakTorqueNm / (model.torqueConstantNmPerA * BLOCK_CURRENT_RMS_FACTOR);
  const baseSpeedRpm = Math.max(0, (model.dcBusV - 2 * model.phaseResistanceOhm * peakCurrent) / (2 * model.backEmfConstantVsPerRad) / RPM_TO_RAD_S);
  return {
    speedsRpm: [...speedsRpm],
    torquesNm: [...torquesNm],
    efficiencyPct,
    totalLossW,
    envelope: {
      speedsRpm: envelopeSpeeds,
      maxTorqueNm: envelopeSpeeds.map((speed) => envelopeTorque(model, speed).peakNm),
      continuousTorqueNm: envelopeSpeeds.map((speed) => envelopeTorque(model, speed).continuousNm),
      baseSpeedRpm: Math.min(baseSpeedRpm, model.maxSpeedRpm),
      noLoadSpeedRpm,
    },
    best,
  };
}
