/**
 * Worker-thread entry that runs one calc command (calc/commands.ts) per message, so CPU-heavy work
 * (a BLDC search, a sweep, a simulation) keeps the server's event loop free.
 *   in:  {id, command, input}
 *   out: {id, ok: true, result} | {id, ok: false, message, field}  (field: CalcInputError's, else null)
 */
import { parentPort } from 'node:worker_threads';
import { commands } from '../../calc/commands.js';
import { CalcInputError } from '../../calc/errors.js';

export interface CalcWorkerRequest {
  id: number;
  command: string;
  input: unknown;
}
export type CalcWorkerResponse = { id: number; ok: true; result: unknown } | { id: number; ok: false; message: string; field: string | null };

parentPort?.on('message', (request: CalcWorkerRequest) => {
  let response: CalcWorkerResponse;
  try {
    const command = commands[request.command];
    if (!command) throw new Error(`unknown calc command ${request.command}`);
    response = { id: request.id, ok: true, result: command.run(request.input) };
  } catch (error) {
    response =
      error instanceof CalcInputError
        ? { id: request.id, ok: false, message: error.message, field: error.field }
        : { id: request.id, ok: false, message: error instanceof Error ? error.message : String(error), field: null };
  }
  parentPort?.postMessage(response);
});
