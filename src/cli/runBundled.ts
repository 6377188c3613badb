import { loadProgram } from './program.js';

/**
 * `runCommandLine` of the built package's full program, the code `framewright` runs (bundled by
 * scripts/bundle-cli.mjs into dist/cli/run.js). The tests keep it loaded in a worker thread
 * (test/helpers/cliWorker.mjs), so they exercise the bundle, not the sources.
 */
export const runCommandLine = (argv: readonly string[]): Promise<number> => loadProgram('full').runCommandLine(argv);
