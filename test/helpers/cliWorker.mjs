// A worker thread that runs the built CLI's `runCommandLine` (dist/cli/run.js) on request, so the
// tests can run many commands without starting a node process for each (test/helpers/cli.ts).
import { workerData } from 'node:worker_threads';

// A worker that cannot load the CLI still answers every request (with the reason), so a caller never waits forever.
let runCommandLine;
try {
  ({ runCommandLine } = await import(workerData.runModule));
} catch (e) {
  runCommandLine = () => {
    throw new Error(`cannot load ${workerData.runModule} (run npm run build): ${e?.message ?? e}`);
  };
}
const flag = new Int32Array(workerData.flag);
const port = workerData.port;

port.on('message', async (args) => {
  const out = [];
  const err = [];
  const write = (sink) => (chunk, encoding, done) => {
    sink.push(typeof chunk === 'string' ? chunk : Buffer.from(chunk).toString('utf8'));
    (typeof encoding === 'function' ? encoding : done)?.();
    return true;
  };
  const saved = [process.stdout.write, process.stderr.write];
  process.stdout.write = write(out);
  process.stderr.write = write(err);
  let code;
  try {
    code = await runCommandLine([process.execPath, 'framewright', ...args]);
  } catch (e) {
    code = -2;
    err.push(String(e?.stack ?? e));
  } finally {
    [process.stdout.write, process.stderr.write] = saved;
    process.exitCode = undefined;
  }
  port.postMessage({ code, stdout: out.join(''), stderr: err.join('') });
  Atomics.store(flag, 0, 1);
  Atomics.notify(flag, 0);
});
