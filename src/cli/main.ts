#!/usr/bin/env node
import { Command } from 'commander';
import { errorJson, reportError } from './io.js';
import { registerCommands } from './commands/index.js';

const program = new Command();
program
  .name('framewright')
  .description('Parametric carbon-plate multirotor frames: plate geometry, design-rule checks, stiffness, variants, nesting, quotes and cut files.')
  .version('0.1.0')
  .showHelpAfterError()
  .configureOutput({ writeErr: (s) => process.stderr.write(s) })
  .exitOverride();

registerCommands(program);

/** `--json` among the arguments (before a `--`): failures are then also printed as JSON on stdout. */
const args = process.argv.slice(2);
const jsonWanted = args.slice(0, args.includes('--') ? args.indexOf('--') : undefined).includes('--json');

try {
  await program.parseAsync(process.argv);
} catch (e) {
  const code = (e as { code?: string }).code;
  if (typeof code === 'string' && code.startsWith('commander.')) {
    const helpOrVersion = code === 'commander.helpDisplayed' || code === 'commander.version' || code === 'commander.help';
    process.exitCode = helpOrVersion ? 0 : 2;
    if (!helpOrVersion && jsonWanted) process.stdout.write(`${JSON.stringify({ error: { message: (e as Error).message.replace(/^error: /, ''), path: '' } }, null, 2)}\n`);
  } else {
    process.exitCode = reportError(e);
    if (jsonWanted) process.stdout.write(`${JSON.stringify(errorJson(e), null, 2)}\n`);
  }
}
