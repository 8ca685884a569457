/**
 * Line current and apparent power of a three-phase load.
 *
 * References:
 * [1] I = P_in / (√3·V_LL·PF) and S = √3·V_LL·I, balanced three-phase circuits (any circuits text;
 *     NEC Table 430.250 lists full-load currents that are deliberately higher, for conductor sizing).
 */
import { requireInRange, requirePositive } from '../errors.js';

const SQRT3 = Math.sqrt(3);

/**
 * Line current of a balanced three-phase load.
 *
 * @param inputPowerKw real input power P_in [kW], ≥ 0
 * @param powerFactor true power factor PF [-], 0 < PF ≤ 1
 * @param voltageV line-to-line voltage V_LL [V]
 * @returns I = 1000·P_in / (√3·V_LL·PF) [A].
 * References: [1].
 */
export function lineCurrentA(inputPowerKw: number, powerFactor: number, voltageV: number): number {
  requireInRange('inputPowerKw', inputPowerKw, 0, Number.MAX_VALUE);
  requireInRange('powerFactor', powerFactor, 1e-3, 1);
  requirePositive('voltageV', voltageV);
  return (1000 * inputPowerKw) / (SQRT3 * voltageV * powerFactor);
}

/**
 * Apparent power.
 *
 * @param inputPowerKw P [kW]; @param powerFactor PF [-]
 * @returns S = P / PF [kVA].
 */
export function apparentPowerKva(inputPowerKw: number, powerFactor: number): number {
  requireInRange('powerFactor', powerFactor, 1e-3, 1);
  return inputPowerKw / powerFactor;
}

/**
 * Power factor from a nameplate's power, efficiency, voltage and current.
 *
 * @param ratedPowerKw rated output [kW]; @param efficiency [-]; @param voltageV [V]; @param currentA [A]
 * @returns PF = P_N/η / (√3·V·I) [-], capped at 1.
 */
export function powerFactorFromNameplate(ratedPowerKw: number, efficiency: number, voltageV: number, currentA: number): number {
  requirePositive('ratedCurrentA', currentA);
  requirePositive('voltageV', voltageV);
  return Math.min((1000 * ratedPowerKw) / efficiency / (SQRT3 * voltageV * currentA), 1);
}
