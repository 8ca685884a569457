/**
 * Motor load estimated from what an engineer measures on site: input power, speed (slip) or current.
 *
 * References:
 * [1] US DOE, "Determining Electric Motor Load and Efficiency", fact sheet, 2014: the input-power,
 *     slip and current methods, the slip correction for supply voltage ((V/V_r)² scaling of slip)
 *     and their accuracy.
 * [2] NEMA MG 1 12.46: the full-load speed of a motor may differ from its nameplate by up to 20 % of
 *     the rated slip, which bounds the slip method's accuracy.
 */
import { CalcInputError, requireInRange, requirePositive } from '../errors.js';
import type { LossSplit } from '../efficiency/part-load.js';

/** A load estimate and how far it may be off. */
export interface LoadEstimate {
  /** Shaft load / rated output [-]. */
  loadFraction: number;
  /** Likely error of the estimate, ± relative to the load [%]. */
  uncertaintyPct: number;
  method: 'input-power' | 'slip' | 'current';
  note: string;
}

/** ± relative uncertainty of each method [%] (common practice after [1]; slip after [2]). */
export const LOAD_ESTIMATE_UNCERTAINTY_PCT = { inputPower: 5, slip: 20, currentAboveHalfLoad: 10, currentBelowHalfLoad: 30 } as const;

/**
 * Load from measured input power, by inverting the part-load loss model.
 *
 * @param measuredInputKw three-phase input power measured with a power analyser [kW]
 * @param split the motor's loss split (calc/efficiency/part-load.ts lossSplit) [kW]
 * @returns load L solving P_in = L·P_N + P_c + P_v·L² [-]:
 *   L = (−P_N + √(P_N² + 4·P_v·(P_in − P_c))) / (2·P_v). ±5 %.
 * References: [1] (input-power method, with the loss model instead of one efficiency).
 */
export function loadFromInputPower(measuredInputKw: number, split: LossSplit): LoadEstimate {
  requirePositive('measuredInputKw', measuredInputKw);
  const { ratedPowerKw: p, constantLossKw: c, loadLossKw: v } = split;
  if (measuredInputKw <= c) {
    return { loadFraction: 0, uncertaintyPct: LOAD_ESTIMATE_UNCERTAINTY_PCT.inputPower, method: 'input-power', note: 'input at or below the no-load losses: motor idling' };
  }
  const load = v > 0 ? (-p + Math.sqrt(p * p + 4 * v * (measuredInputKw - c))) / (2 * v) : (measuredInputKw - c) / p;
  return { loadFraction: load, uncertaintyPct: LOAD_ESTIMATE_UNCERTAINTY_PCT.inputPower, method: 'input-power', note: 'P_in = L·P_N + P_c + P_v·L² solved for L' };
}

/**
 * Load from measured speed (slip method).
 *
 * @param measuredSpeedRpm shaft speed measured with a tachometer [rpm]
 * @param ratedSpeedRpm nameplate full-load speed [rpm]
 * @param poles [-]; @param frequencyHz supply frequency [Hz]
 * @param measuredVoltageV supply voltage at the time [V] (optional); @param ratedVoltageV nameplate voltage [V]
 * @returns L = (n_s − n)/((n_s − n_r)·(V_r/V)²) [-], n_s = 120·f/p; ±20 % (nameplate speed tolerance [2]).
 * References: [1] slip method with voltage correction; [2].
 */
export function loadFromSlip(
  measuredSpeedRpm: number,
  ratedSpeedRpm: number,
  poles: number,
  frequencyHz: number,
  measuredVoltageV?: number,
  ratedVoltageV?: number,
): LoadEstimate {
  requirePositive('poles', poles);
  requirePositive('frequencyHz', frequencyHz);
  const synchronousRpm = (120 * frequencyHz) / poles;
  requireInRange('ratedSpeedRpm', ratedSpeedRpm, synchronousRpm * 0.8, synchronousRpm - 1e-9);
  requireInRange('measuredSpeedRpm', measuredSpeedRpm, synchronousRpm * 0.7, synchronousRpm);
  let ratedSlipRpm = synchronousRpm - ratedSpeedRpm;
  if (measuredVoltageV !== undefined || ratedVoltageV !== undefined) {
    if (measuredVoltageV === undefined || ratedVoltageV === undefined) {
      throw new CalcInputError('measuredVoltageV', 'and ratedVoltageV must be given together');
    }
    requirePositive('measuredVoltageV', measuredVoltageV);
    requirePositive('ratedVoltageV', ratedVoltageV);
    ratedSlipRpm *= (ratedVoltageV / measuredVoltageV) ** 2; // slip ∝ 1/V² [1]
  }
  return {
    loadFraction: (synchronousRpm - measuredSpeedRpm) / ratedSlipRpm,
    uncertaintyPct: LOAD_ESTIMATE_UNCERTAINTY_PCT.slip,
    method: 'slip',
    note: `synchronous speed ${synchronousRpm} rpm; nameplate speed may be off by 20 % of rated slip (NEMA MG 1 12.46)`,
  };
}

/**
 * Load from measured current.
 *
 * @param measuredCurrentA mean line current [A]; @param ratedCurrentA nameplate current [A]
 * @param measuredVoltageV, ratedVoltageV [V] (optional, scale the current to rated voltage)
 * @param noLoadCurrentA current running uncoupled [A] (optional): when given, the magnetising part
 *   is removed in quadrature, L = √((I² − I₀²)/(I_r² − I₀²)); otherwise L = (I/I_r)·(V/V_r).
 * @returns load [-] with ±10 % above half load and ±30 % below (the current method is poor at light
 *   load because the magnetising current dominates).
 * References: [1] current method.
 */
export function loadFromCurrent(
  measuredCurrentA: number,
  ratedCurrentA: number,
  measuredVoltageV?: number,
  ratedVoltageV?: number,
  noLoadCurrentA?: number,
): LoadEstimate {
  requirePositive('measuredCurrentA', measuredCurrentA);
  requirePositive('ratedCurrentA', ratedCurrentA);
  const voltageRatio = measuredVoltageV !== undefined && ratedVoltageV !== undefined ? measuredVoltageV / ratedVoltageV : 1;
  requirePositive('measuredVoltageV', voltageRatio);
  const current = measuredCurrentA * voltageRatio;
  let load: number;
  let note: string;
  if (noLoadCurrentA !== undefined) {
    requireInRange('noLoadCurrentA', noLoadCurrentA, 0, ratedCurrentA * 0.95);
    load = Math.sqrt(Math.max(current * current - noLoadCurrentA * noLoadCurrentA, 0) / (ratedCurrentA ** 2 - noLoadCurrentA ** 2));
    note = 'magnetising current removed in quadrature';
  } else {
    load = current / ratedCurrentA; // current method of [1]
    note = 'I/I_r × V/V_r; overstates light loads';
  }
  const uncertaintyPct = load >= 0.5 ? LOAD_ESTIMATE_UNCERTAINTY_PCT.currentAboveHalfLoad : LOAD_ESTIMATE_UNCERTAINTY_PCT.currentBelowHalfLoad;
  return { loadFraction: load, uncertaintyPct, method: 'current', note };
}

