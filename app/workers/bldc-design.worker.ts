// Browser worker for the BLDC design search and sweeps: calc's own commands (the same validation and
// numbers as `npm run calc -- size-bldc` and the server), off the page's thread because a full
// slot/pole search takes about a second.
import { CalcInputError } from 'calc/errors';
import { runSizeBldcCommand, runSweepCommand } from 'calc/bldc/commands';

export type DesignWorkerRequest =
  | { id: number; type: 'size'; input: unknown }
  | { id: number; type: 'sweep'; input: unknown };

export type DesignWorkerResponse =
  | { id: number; type: 'result'; result: unknown }
  | { id: number; type: 'error'; message: string; field: string | null };

const scope = self as unknown as {
  postMessage(message: DesignWorkerResponse): void;
  addEventListener(type: 'message', listener: (event: MessageEvent<DesignWorkerRequest>) => void): void;
};

scope.addEventListener('message', (event) => {
  const request = event.data;
  try {
    const result = request.type === 'size' ? runSizeBldcCommand(request.input) : runSweepCommand(request.input);
    scope.postMessage({ id: request.id, type: 'result', result });
  } catch (error) {
    if (error instanceof CalcInputError) scope.postMessage({ id: request.id, type: 'error', message: error.message, field: error.field });
    else scope.postMessage({ id: request.id, type: 'error', message: error instanceof Error ? error.message : String(error), field: null });
  }
});
