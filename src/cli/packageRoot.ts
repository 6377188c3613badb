import { existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

let root: string | undefined;

/**
 * The folder of this package (the one holding its package.json), found by walking up from this
 * module. Files shipped beside the code (designs/, the live page in dist/live/page, the modes
 * worker) are found from here, never relative to a module: the CLI is bundled into chunks that
 * live elsewhere than the sources (scripts/bundle-cli.mjs), and the tests run the sources.
 */
export function packageRoot(): string {
  if (root !== undefined) return root;
  let dir = dirname(fileURLToPath(import.meta.url));
  for (;;) {
    const manifest = join(dir, 'package.json');
    if (existsSync(manifest) && (JSON.parse(readFileSync(manifest, 'utf8')) as { name?: string }).name === 'framewright') return (root = dir);
    const up = dirname(dir);
    if (up === dir) throw new Error(`framewright's package.json not found above ${fileURLToPath(import.meta.url)}`);
    dir = up;
  }
}

/** A file of this package by its path from the package root, e.g. `packagePath('designs', 'tessel-5.yaml')`. */
export const packagePath = (...parts: string[]): string => join(packageRoot(), ...parts);

/** The example shop profile shipped with the package, the quote's default. */
export const defaultShopPath = (): string => packagePath('designs', 'hollin-row-shop.yaml');
