/**
 * The command-line interface's commands: name → a function from one JSON input to one JSON output.
 * Each `run` validates its input (throwing CalcInputError with the field) and calls calc/ functions.
 * Kept apart from cli.ts so tests and the server can call the same commands without a process.
 */
import { runEfficiencyMapCommand, runSimulateCommand } from './dynamics/commands.js';

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
  'efficiency-map': {
    summary: 'motor + drive efficiency of a sized BLDC over a speed × torque grid, with the torque–speed envelope',
    run: (input) => runEfficiencyMapCommand(input),
  },
};
