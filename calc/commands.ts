/**
 * The command-line interface's commands: name → a function from one JSON input to one JSON output.
 * Each `run` validates its input (throwing CalcInputError with the field) and calls calc/ functions.
 * Kept apart from cli.ts so tests and the server can call the same commands without a process.
 */
import { runEfficiencyMapCommand, runSimulateCommand } from './dynamics/commands.js';
import { runEfficiencyClassCommand } from './efficiency/command.js';
import { runLineCurrentCommand } from './electrical/command.js';
import { runEconomicsCommand } from './economics/command.js';
import { runAssessCommand } from './assess/command.js';
import { runSizeBldcCommand, runSweepCommand, runWindingCommand } from './bldc/commands.js';

export interface CalcCommand {
  /** One line for `calc/README.md` and the unknown-command message. */
  summary: string;
  run(input: unknown): unknown;
}

export const commands: Record<string, CalcCommand> = {
  // Each domain adds its commands here, e.g. 'efficiency-class': efficiencyClassCommand.
  simulate: {
    summary: 'time-domain start-up of a BLDC on its six-step drive: summary figures and decimated series',
    run: (input) => runSimulateCommand(input),
  },
  'efficiency-class': {
    summary: 'nominal efficiency of IE1–IE5 (IEC 60034-30-1) or a NEMA MG 1 level for a rating, with its source',
    run: (input) => runEfficiencyClassCommand(input),
  },
  'line-current': {
    summary: 'line current and kVA of a three-phase motor from its input (or output and efficiency), power factor and voltage',
    run: (input) => runLineCurrentCommand(input),
  },
  economics: {
    summary: 'simple and discounted payback, NPV and IRR of an escalating yearly saving or of a cash-flow series',
    run: (input) => runEconomicsCommand(input),
  },
  assess: {
    summary: 'one motor against every retrofit option: energy, cost, CO2, line current, payback, NPV, IRR, recommendation',
    run: (input) => runAssessCommand(input),
  },
  winding: {
    summary: 'three-phase winding by the star of slots: layout, winding factors of every harmonic, balance',
    run: (input) => runWindingCommand(input),
  },
  'size-bldc': {
    summary: 'analytic surface-PM BLDC that fits a frame: dimensions, winding, magnet, losses, efficiency, masses, feasibility',
    run: (input) => runSizeBldcCommand(input),
  },
  sweep: {
    summary: 'vary one input of a size-bldc request over a range and tabulate the design figures',
    run: (input) => runSweepCommand(input),
  },
  'efficiency-map': {
    summary: 'motor + drive efficiency of a sized BLDC over a speed × torque grid, with the torque–speed envelope',
    run: (input) => runEfficiencyMapCommand(input),
  },
};
