import { readdirSync } from 'node:fs';
import { spawn, spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { MessageChannel, receiveMessageOnPort, Worker, type MessagePort } from 'node:worker_threads';
import { REPO } from './demo.js';
import { SET_MARKER } from '../../src/cli/outputSet.js';

type CliResult = { code: number; stdout: string; stderr: string };

/** Run the built CLI (dist/, made by `npm test`'s build step) in its own node process, from the repository root. */
export function runCliProcess(args: string[], input?: string): CliResult {
  const r = spawnSync(process.execPath, [join(REPO, 'dist', 'cli', 'main.js'), ...args], {
    cwd: REPO,
    encoding: 'utf8',
    input,
    maxBuffer: 64 * 1024 * 1024,
  });
  return { code: r.status ?? -1, stdout: r.stdout, stderr: r.stderr };
}

let worker: { port: MessagePort; flag: Int32Array } | null = null;

/** The worker thread that keeps the built CLI loaded (cliWorker.mjs), started on first use. */
function cliWorker(): { port: MessagePort; flag: Int32Array } {
  if (worker) return worker;
  const flag = new Int32Array(new SharedArrayBuffer(4));
  const { port1, port2 } = new MessageChannel();
  const w = new Worker(join(REPO, 'test', 'helpers', 'cliWorker.mjs'), {
    workerData: { runModule: pathToFileURL(join(REPO, 'dist', 'cli', 'run.js')).href, flag: flag.buffer, port: port2 },
    transferList: [port2],
    stdout: true,
    stderr: true,
  });
  w.unref();
  worker = { port: port1, flag };
  return worker;
}

/**
 * Run the built CLI (dist/) as the command line would, with the same exit code, standard output and
 * error, but inside a worker thread that keeps it loaded: each call costs the command's own work, not
 * a node start-up and module load. Commands that read standard input run in a process
 * (runCliProcess), and so do the tests of what only a process shows (start-up, signals, warnings).
 */
export function runCli(args: string[], input?: string): CliResult {
  if (input !== undefined || process.cwd() !== REPO) return runCliProcess(args, input);
  const { port, flag } = cliWorker();
  Atomics.store(flag, 0, 0);
  port.postMessage(args);
  // The worker answers on the port and raises the flag; a command running 10 minutes is a hang.
  if (Atomics.wait(flag, 0, 0, 600_000) === 'timed-out') throw new Error(`framewright ${args.join(' ')} did not finish in 10 minutes`);
  const reply = receiveMessageOnPort(port);
  if (!reply) throw new Error('the CLI worker gave no answer');
  return reply.message as CliResult;
}

/** A stack trace line, which users must never see for bad input. */
export const STACK_LINE = /^\s+at .+\(.+:\d+:\d+\)$/m;

/** The files a command wrote into an output folder (sorted), without the marker every output set carries. */
export function outputNames(dir: string): string[] {
  return readdirSync(dir)
    .filter((f) => f !== SET_MARKER)
    .sort();
}

/** runCli without blocking the test process, so independent runs overlap (the machine has two cores or more). */
export function runCliAsync(args: string[], input?: string | Buffer): Promise<{ code: number; stdout: string; stderr: string }> {
  return new Promise((done) => {
    const child = spawn(process.execPath, [join(REPO, 'dist', 'cli', 'main.js'), ...args], { cwd: REPO });
    const out: Buffer[] = [];
    const err: Buffer[] = [];
    child.stdout.on('data', (b: Buffer) => out.push(b));
    child.stderr.on('data', (b: Buffer) => err.push(b));
    child.on('close', (code) => done({ code: code ?? -1, stdout: Buffer.concat(out).toString('utf8'), stderr: Buffer.concat(err).toString('utf8') }));
    child.stdin.on('error', () => {}); // a command that refuses its input early closes standard input
    child.stdin.end(input);
  });
}
