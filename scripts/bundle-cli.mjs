// Bundles the command line into a few files, run by `npm run build` after tsc: loading ~150 small
// modules one by one (resolve, open, stat, compile each) cost a `check` more than its own geometry
// (DEVELOPERS.md "Start-up"). Each command still loads only its stages: every `await import()`
// becomes a chunk of its own, and code two of them share goes into a shared chunk.
//
// The entries overwrite tsc's output of the same name: dist/cli/main.js (the `bin`),
// dist/cli/run.js (the whole command line, which the tests keep loaded in a worker) and
// dist/live/modesWorker.js (the live page's worker thread). Chunks go to dist/cli/chunks/. Files
// shipped beside the code are found from the package root (src/cli/packageRoot.ts), so a module's
// new location does not matter. The library entry (dist/index.js) stays tsc's output.
//
// dist/cli/bundle.json records, for each output file, the sources in it and the outputs it imports
// statically; test/cli/startup.test.ts reads it to prove start-up loads only the command line.
import { build } from 'esbuild';
import { rmSync, writeFileSync } from 'node:fs';
import { dirname, join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const dist = join(root, 'dist');
// Chunk names carry a hash of their content: clear the last build's, or they pile up.
rmSync(join(dist, 'cli', 'chunks'), { recursive: true, force: true });

const result = await build({
  absWorkingDir: root,
  entryPoints: {
    'cli/main': 'src/cli/main.ts',
    'cli/run': 'src/cli/run.ts',
    'live/modesWorker': 'src/live/modesWorker.ts',
  },
  outdir: dist,
  chunkNames: 'cli/chunks/[name]-[hash]',
  bundle: true,
  splitting: true,
  format: 'esm',
  platform: 'node',
  target: 'node20',
  // pdfkit reads its font metrics from files beside its own code (__dirname): it stays a package.
  external: ['pdfkit'],
  // Packages written as CommonJS (yaml, commander) call require() for node's built-ins.
  banner: { js: "import { createRequire as __frameworkCreateRequire } from 'node:module';\nconst require = __frameworkCreateRequire(import.meta.url);" },
  legalComments: 'none',
  metafile: true,
  logLevel: 'warning',
});

const bundle = {};
for (const [file, out] of Object.entries(result.metafile.outputs)) {
  bundle[relative(dist, join(root, file))] = {
    inputs: Object.keys(out.inputs).sort(),
    imports: out.imports.filter((i) => i.kind === 'import-statement' && !i.external).map((i) => relative(dist, join(root, i.path))),
  };
}
const sources = {};
for (const [file, input] of Object.entries(result.metafile.inputs)) sources[file] = input.imports.filter((i) => i.kind === 'import-statement' && !i.external && !i.path.startsWith('node:')).length;
writeFileSync(join(dist, 'cli', 'bundle.json'), `${JSON.stringify({ outputs: bundle, staticImportsOfSource: sources }, null, 1)}\n`);
