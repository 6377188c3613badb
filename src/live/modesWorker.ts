import { parentPort, workerData } from 'node:worker_threads';
import { modesSummary } from './modesSummary.js';

// Runs in a worker thread so the live server keeps answering edits while the modes are solved.
const { text, version } = workerData as { text: string; version: number };
try {
  parentPort?.postMessage({ ok: true, summary: modesSummary(text, version) });
} catch (e) {
  parentPort?.postMessage({ ok: false, message: (e as Error)?.message ?? String(e) });
}
