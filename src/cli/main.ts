#!/usr/bin/env node
import { runCommandLine } from './run.js';

// A reader that stops early (`framewright schema | head`) closes the pipe: end quietly, as a shell
// tool does, instead of a stack trace for the write that could not be delivered.
for (const stream of [process.stdout, process.stderr]) {
  stream.on('error', (e: NodeJS.ErrnoException) => {
    if (e.code !== 'EPIPE') throw e;
    process.exit(typeof process.exitCode === 'number' ? process.exitCode : 0);
  });
}

process.exitCode = await runCommandLine(process.argv);
