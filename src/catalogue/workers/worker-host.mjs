// Worker thread host. Node 20 cannot start a .ts file as a worker, so the pool
// starts this plain module, which registers the TypeScript loader and then
// imports the task module named in workerData.entry. That module exports
//   handleTask(task, report) → result (or a promise of it),
// where report(step) sends a progress note to the main thread.
import { register } from 'tsx/esm/api';
import { parentPort, workerData } from 'node:worker_threads';
import { pathToFileURL } from 'node:url';

register();
const mod = await import(pathToFileURL(workerData.entry).href);
if (typeof mod.handleTask !== 'function') {
  throw new Error(`${workerData.entry} does not export handleTask(task, report)`);
}

parentPort.on('message', async (message) => {
  const { id, task } = message;
  const report = (step) => parentPort.postMessage({ id, kind: 'progress', step: String(step) });
  try {
    const result = await mod.handleTask(task, report);
    parentPort.postMessage({ id, kind: 'result', result });
  } catch (error) {
    const text = error instanceof Error ? `${error.name}: ${error.message}` : String(error);
    const stack = error instanceof Error && error.stack ? error.stack : '';
    parentPort.postMessage({ id, kind: 'threw', message: text, stack });
  }
});
parentPort.postMessage({ kind: 'ready' });
