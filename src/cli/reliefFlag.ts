import { plural } from '../params/words.js';
import { UsageError } from './usageError.js';

// `--relieve-corners [style]` of `check`, for designs and drawings alike. Import-free of the stages
// so the command line loads it at start-up.

/** The relief style of `--relieve-corners [style]`; bad input is a UsageError (exit 2). */
export function reliefStyle(flag: boolean | string): 'dogbone' | 'tbone' {
  if (flag === true || flag === 'dogbone') return 'dogbone';
  if (flag === 'tbone') return 'tbone';
  throw new UsageError(`--relieve-corners: ${JSON.stringify(flag)} must be dogbone or tbone`);
}

/** The line printed above a report of relieved parts. */
export function reliefLine(style: 'dogbone' | 'tbone', added: number, skipped: number): string {
  const word = style === 'dogbone' ? 'dogbone' : 'T-bone';
  return `Corner relief: ${plural(added, word)} added${skipped ? `, ${plural(skipped, 'corner')} too tight to relieve` : ''}; the report below is for the relieved parts.\n`;
}
