// The entry of every pool worker. It is plain JavaScript so that it starts the same way whatever
// loaded the pool (the compiled CLI, Vite loading the Astro config, vitest). A compiled task module is
// imported as it is; for a TypeScript one it registers tsx itself, because a worker does not inherit
// the TypeScript loader of the thread that started it.
import { parentPort, workerData } from 'node:worker_threads';

// Plain-JavaScript packages named in `preload` are loaded before the loader is registered: a library
// of a thousand files loads several times faster without a round trip to the loader for each file.
for (const name of workerData.preload) await import(name);
if (workerData.taskModule.endsWith('.ts')) (await import('tsx/esm/api')).register();
const { default: task } = await import(workerData.taskModule);

parentPort.on('message', async (input) => {
  try {
    parentPort.postMessage({ ok: true, value: await task(input) });
  } catch (error) {
    parentPort.postMessage({ ok: false, message: error instanceof Error ? error.message : String(error) });
  }
});
// Tasks are sent only after this, so the time limit never counts the worker's own start-up.
parentPort.postMessage({ ready: true });
