// Browser entry of the start-up simulation: calc/dynamics' worker protocol wired to the worker's
// own scope. (calc/dynamics/worker.ts also serves Node worker threads, with a top-level await that
// the browser build's classic worker format cannot take; this entry is its browser half.)
import { createWorkerHandler, type WorkerRequest, type WorkerResponse } from 'calc/dynamics/worker-protocol';

const scope = self as unknown as {
  postMessage(message: WorkerResponse): void;
  addEventListener(type: 'message', listener: (event: MessageEvent<WorkerRequest>) => void): void;
};

const handle = createWorkerHandler((message) => scope.postMessage(message));
scope.addEventListener('message', (event) => void handle(event.data));
