import { Command } from 'commander';
import { errorJson, reportError } from './io.js';
import { registerCommands } from './commands/index.js';

/**
 * Run the command line once: `argv` as node gives it (program path first, then the script, then
 * the arguments). Returns the exit code: 0 fine, 1 the checks found errors, 2 bad input or usage,
 * 3 a bug. Writes to standard output and error; never calls process.exit, so it can run more than
 * once in one process (the tests do).
 */
export async function runCommandLine(argv: readonly string[]): Promise<number> {
  const program = new Command();
  program
    .name('framewright')
    .description('Parametric carbon-plate multirotor frames: plate geometry, design-rule checks, stiffness, variants, nesting, quotes and cut files.')
    .version('0.1.0')
    .showHelpAfterError()
    .configureOutput({ writeOut: (s) => process.stdout.write(s), writeErr: (s) => process.stderr.write(s) })
    .exitOverride();
  registerCommands(program);
  // Commands report "the checks found errors" through process.exitCode; start from a clean slate.
  process.exitCode = undefined;
  // `--json` among the arguments (before a `--`): failures are then also printed as JSON on stdout.
  const args = argv.slice(2);
  const jsonWanted = args.slice(0, args.includes('--') ? args.indexOf('--') : undefined).includes('--json');
  try {
    await program.parseAsync([...argv]);
    return typeof process.exitCode === 'number' ? process.exitCode : 0;
  } catch (e) {
    const code = (e as { code?: string }).code;
    if (typeof code === 'string' && code.startsWith('commander.')) {
      const helpOrVersion = code === 'commander.helpDisplayed' || code === 'commander.version' || code === 'commander.help';
      if (!helpOrVersion && jsonWanted) process.stdout.write(`${JSON.stringify({ error: { message: (e as Error).message.replace(/^error: /, ''), path: '' } }, null, 2)}\n`);
      return helpOrVersion ? 0 : 2;
    }
    const exit = reportError(e);
    if (jsonWanted) process.stdout.write(`${JSON.stringify(errorJson(e), null, 2)}\n`);
    return exit;
  }
}
