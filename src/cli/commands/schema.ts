import type { Command } from 'commander';
import { designJsonSchema } from '../../params/index.js';
import { writeAllAtomically } from '../io.js';

export function registerSchema(program: Command): void {
  program
    .command('schema')
    .description('print the JSON Schema of the design file (for editor completion and validation)')
    .option('--out <file>', 'write it to a file instead of standard output')
    .action((opts: { out?: string }) => {
      const text = `${JSON.stringify(designJsonSchema(), null, 2)}\n`;
      if (opts.out) writeAllAtomically([{ path: opts.out, data: text }]);
      else process.stdout.write(text);
    });
}
