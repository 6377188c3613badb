// Bundles the live page (src/live/page) into dist/live/page/app.js and app.css: one script, one
// style sheet, no network at run time. Run by `npm run build` after tsc.
import { build } from 'esbuild';
import { copyFileSync, mkdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const out = join(root, 'dist', 'live', 'page');
mkdirSync(out, { recursive: true });
await build({
  entryPoints: [join(root, 'src', 'live', 'page', 'main.ts')],
  outfile: join(out, 'app.js'),
  bundle: true,
  format: 'iife',
  platform: 'browser',
  target: ['chrome110', 'firefox110', 'safari16'],
  minify: false,
  sourcemap: false,
  legalComments: 'none',
  logLevel: 'warning',
});
copyFileSync(join(root, 'src', 'live', 'page', 'style.css'), join(out, 'app.css'));
