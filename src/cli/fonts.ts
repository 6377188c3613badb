import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { DrawingFonts } from '../export/pdfDrawing.js';
import { woffToSfnt } from '../export/woff.js';

const require = createRequire(import.meta.url);

let loaded: DrawingFonts | undefined;

/**
 * The drawing font embedded in every PDF: DejaVu Sans, regular and bold, from the npm package
 * `@fontsource/dejavu-sans` (free licence: see the package's LICENSE; README "Drawings").
 * Read here because only the CLI touches files; unpacked from WOFF first (src/export/woff.ts says why).
 */
export function drawingFonts(): DrawingFonts {
  // Read and unpacked once per process: the live page writes a drawing on every quote request.
  if (loaded) return loaded;
  const file = (w: number): Uint8Array => woffToSfnt(readFileSync(require.resolve(`@fontsource/dejavu-sans/files/dejavu-sans-latin-${w}-normal.woff`)));
  loaded = { regular: file(400), bold: file(700) };
  return loaded;
}
