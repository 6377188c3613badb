import type { Command } from 'commander';
import { registerBuild } from './build.js';
import { registerCheck } from './check.js';
import { registerSchema } from './schema.js';
import { registerVariant } from './variant.js';

/** Every command registers itself here; one line per command file. */
export function registerCommands(program: Command): void {
  registerBuild(program);
  registerCheck(program);
  registerSchema(program);
  registerVariant(program);
}
