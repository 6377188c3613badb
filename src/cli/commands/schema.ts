import type { Command } from 'commander';
import { writeAllAtomically } from '../io.js';

export function registerSchema(program: Command): void {
  program
    .command('schema')
    .description('print the JSON Schema of the design file (for editor completion and validation)')
    .option('--out <file>', 'write it to a file instead of standard output')
    .option('--markdown', 'print the design-file reference table (as in the README) instead')
    .action(async (opts: { out?: string; markdown?: boolean }) => {
      const { designJsonSchema, designReferenceMarkdown } = await import('../../params/index.js');
      const text = opts.markdown ? `${designReferenceMarkdown()}\n` : `${JSON.stringify(designJsonSchema(), null, 2)}\n`;
      if (opts.out) writeAllAtomically([{ path: opts.out, data: text }]);
      else process.stdout.write(text);
    });
}
