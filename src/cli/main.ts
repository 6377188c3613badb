#!/usr/bin/env node
import { Command } from 'commander';
import { reportError } from './io.js';
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

try {
  await program.parseAsync(process.argv);
} catch (e) {
  const code = (e as { code?: string }).code;
  if (typeof code === 'string' && code.startsWith('commander.')) {
    const helpOrVersion = code === 'commander.helpDisplayed' || code === 'commander.version' || code === 'commander.help';
    process.exitCode = helpOrVersion ? 0 : 2;
  } else {
    process.exitCode = reportError(e);
  }
}
