import type { Command } from 'commander';
import { registerBuild } from './build.js';
import { registerCheck } from './check.js';
import { registerLive } from './live.js';
import { registerModes } from './modes.js';
import { registerQuote } from './quote.js';
import { registerSchema } from './schema.js';
import { registerVariant } from './variant.js';

/** Every command registers itself here; one line per command file. */
export function registerCommands(program: Command): void {
  registerBuild(program);
  registerCheck(program);
  registerLive(program);
  registerModes(program);
  registerQuote(program);
  registerSchema(program);
  registerVariant(program);
}
