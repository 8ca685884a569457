/**
 * Worker entry of the simulation, for both a Node worker_threads script (server) and a browser
 * module Web Worker (client). Only this edge touches the environment: it finds the message port
 * (`self` in a browser worker, `parentPort` under Node) and wires it to the pure protocol handler.
 *
 *   Node:    new Worker(new URL('./worker.ts', import.meta.url), { execArgv: ['--import', 'tsx'] })
 *   Browser: new Worker(new URL('calc/dynamics/worker.ts', import.meta.url), { type: 'module' })
 */
import { createWorkerHandler, type WorkerRequest, type WorkerResponse } from './worker-protocol.js';

interface Port {
  postMessage(message: WorkerResponse): void;
}

interface BrowserWorkerScope extends Port {
  addEventListener(type: 'message', listener: (event: { data: WorkerRequest }) => void): void;
}

interface NodePort extends Port {
  on(type: 'message', listener: (message: WorkerRequest) => void): void;
}

const scope = globalThis as { WorkerGlobalScope?: unknown; self?: unknown };
if (scope.WorkerGlobalScope !== undefined && scope.self !== undefined) {
  const browser = scope.self as BrowserWorkerScope;
  const handle = createWorkerHandler((message) => browser.postMessage(message));
  browser.addEventListener('message', (event) => void handle(event.data));
} else {
  // A variable specifier keeps browser bundlers from resolving the Node module.
  const specifier = 'node:worker_threads';
  const { parentPort } = (await import(/* @vite-ignore */ specifier)) as { parentPort: NodePort | null };
  if (parentPort !== null) {
    const handle = createWorkerHandler((message) => parentPort.postMessage(message));
    parentPort.on('message', (message) => void handle(message));
  }
}
