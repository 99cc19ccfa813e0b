/**
 * Worker-thread entry while the app runs from its TypeScript sources (Vite's
 * dev server, vitest, tsx scripts): worker threads cannot read TypeScript by
 * themselves, so this loads ./worker.ts through tsx. A built app hands its
 * compiled worker file to the pool directly and never reads this one.
 */
import { workerData } from 'node:worker_threads';
import { tsImport } from 'tsx/esm/api';

/** @type {{ runTask: (message: unknown) => Promise<unknown> }} */
const tasks = await tsImport(workerData.tasksFileUrl, import.meta.url);

export const runTask = tasks.runTask;
