#!/usr/bin/env node
import { runCommandLine } from './run.js';

process.exitCode = await runCommandLine(process.argv);
