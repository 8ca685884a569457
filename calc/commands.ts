/**
 * The command-line interface's commands: name → a function from one JSON input to one JSON output.
 * Each `run` validates its input (throwing CalcInputError with the field) and calls calc/ functions.
 * Kept apart from cli.ts so tests and the server can call the same commands without a process.
 */
export interface CalcCommand {
  /** One line for `calc/README.md` and the unknown-command message. */
  summary: string;
  run(input: unknown): unknown;
}

export const commands: Record<string, CalcCommand> = {
  // Each domain adds its commands here, e.g. 'efficiency-class': efficiencyClassCommand.
};
