/**
 * `line-current`: line current and apparent power of a three-phase motor.
 */
import { z } from 'zod';
import { parseInput } from '../input.js';
import { CalcInputError } from '../errors.js';
import { apparentPowerKva, lineCurrentA } from './line-current.js';

const positive = () => z.number({ error: 'must be a number' }).positive({ error: 'must be positive' });

export const lineCurrentInputSchema = z.object({
  inputPowerKw: z.number({ error: 'must be a number' }).min(0, { error: 'must be zero or more' }).optional(),
  outputPowerKw: z.number({ error: 'must be a number' }).min(0, { error: 'must be zero or more' }).optional(),
  efficiencyPct: positive().max(100, { error: 'must be at most 100' }).optional(),
  powerFactor: positive().max(1, { error: 'must be at most 1' }),
  voltageV: positive(),
});

/**
 * Runs `line-current`.
 *
 * @param input {inputPowerKw [kW] | (outputPowerKw [kW], efficiencyPct [%]), powerFactor [-], voltageV [V]}
 * @returns {currentA [A], inputPowerKw [kW], kva [kVA]}: I = P_in/(√3·V·PF), P_in = P_out/η.
 */
export function runLineCurrentCommand(input: unknown): { currentA: number; inputPowerKw: number; kva: number } {
  const parsed = parseInput(lineCurrentInputSchema, input);
  let inputPowerKw = parsed.inputPowerKw;
  if (inputPowerKw === undefined) {
    if (parsed.outputPowerKw === undefined) throw new CalcInputError('inputPowerKw', 'or outputPowerKw with efficiencyPct is required');
    if (parsed.efficiencyPct === undefined) throw new CalcInputError('efficiencyPct', 'is required with outputPowerKw');
    inputPowerKw = parsed.outputPowerKw / (parsed.efficiencyPct / 100);
  }
  return {
    currentA: lineCurrentA(inputPowerKw, parsed.powerFactor, parsed.voltageV),
    inputPowerKw,
    kva: apparentPowerKva(inputPowerKw, parsed.powerFactor),
  };
}
