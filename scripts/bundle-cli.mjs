// Bundles the command line, run by `npm run build` after tsc. Loading ~150 small modules one by one
// (resolve, open, compile each) cost a `check` more than its own geometry, and compiling the same
// code on every start another third (DEVELOPERS.md "Start-up"). Outputs (the library entry,
// dist/index.js, stays tsc's):
//
//   dist/cli/full-HASH.cjs   every command and stage (src/cli/run.ts), one script; a stage's module
//                            body still runs only when a command imports it
//   dist/cli/check-HASH.cjs  the command line with the stages `check` runs only
//   dist/cli/help-HASH.cjs   the argument parser and the command descriptions only, for --help
//   dist/cli/*.cache         V8 code caches of the three, made by training runs of the built CLI
//                            (scripts/train-code-cache.mjs)
//   dist/cli/programs.json   which script and cache each kind of run loads (src/cli/program.ts)
//   dist/cli/framewright.cjs the `bin` (src/cli/main.ts): picks a program and runs it; CommonJS,
//                            as an ES module entry costs node a few milliseconds more to start
//   dist/cli/main.js         overwriting tsc's: runs framewright.cjs (`node dist/cli/main.js ...`)
//   dist/cli/run.js          runCommandLine of the full program for the tests' worker (src/cli/runBundled.ts)
//   dist/live/modesWorker.js the live page's worker thread, self-contained
//   dist/cli/bundle.json     the sources in each program and how many modules each imports, for
//                            test/cli/startup.test.ts
//
// Files shipped beside the code are found from the package root (src/cli/packageRoot.ts), so a
// module's place in a bundle does not matter.
import { build } from 'esbuild';
import { createHash } from 'node:crypto';
import { chmodSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { TRAINING, trainCodeCache } from './train-code-cache.mjs';
import { dirname, join, relative, sep } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const dist = join(root, 'dist');
const cliDir = join(dist, 'cli');

/**
 * zod's namespace exports every translation of its messages (`z.locales`, 45 languages, a third
 * of its code), which no bundler can drop because a namespace object holds them. framewright writes
 * its own messages and uses only zod's default English ones (imported on their own), so the bundle
 * gets an empty namespace instead.
 */
const zodWithoutLocales = {
  name: 'zod-without-locales',
  setup(b) {
    b.onResolve({ filter: /^\.\.\/locales\/index\.js$/ }, (a) => (/[\\/]zod[\\/]v4[\\/]classic[\\/]/.test(a.importer) ? { path: 'zod-locales', namespace: 'zod-locales' } : undefined));
    b.onLoad({ filter: /.*/, namespace: 'zod-locales' }, () => ({ contents: 'export {};', loader: 'js' }));
  },
};

/**
 * A program for some commands only: a stage that the other commands' files would load becomes a
 * loud failure instead of code to read and compile. `own` lists the command-line files whose
 * `await import()`s are kept (a stage's own lazy imports are always kept); null keeps all.
 */
const onlyStagesOf = (own) => ({
  name: 'only-stages-of',
  setup(b) {
    if (own === null) return;
    b.onResolve({ filter: /.*/ }, (a) => {
      if (a.kind !== 'dynamic-import' || !a.path.startsWith('.')) return undefined;
      const from = relative(root, a.importer).split(sep).join('/');
      return from.startsWith('src/cli/') && !own.includes(from) ? { path: a.path, namespace: 'no-stage' } : undefined;
    });
    b.onLoad({ filter: /.*/, namespace: 'no-stage' }, (a) => ({
      contents: `throw new Error(${JSON.stringify(`internal: this program cannot load ${a.path} (src/cli/program.ts programFor sent another command to it)`)});`,
      loader: 'js',
    }));
  },
});

/**
 * commander loads node:child_process at start-up for a feature framewright does not use (commands
 * that are separate executables); loading it costs every run a few milliseconds. The bundle loads
 * it on first use instead. Fails the build if commander's line changes.
 */
const commanderWithoutChildProcess = {
  name: 'commander-without-child-process',
  setup(b) {
    b.onLoad({ filter: /[\\/]commander[\\/]lib[\\/]command\.js$/ }, (a) => {
      const text = readFileSync(a.path, 'utf8');
      const line = "const childProcess = require('node:child_process');";
      if (!text.includes(line)) throw new Error(`${a.path}: the line "${line}" is gone; review the commander-without-child-process plugin`);
      return { contents: text.replace(line, "const childProcess = { spawn: (...a) => require('node:child_process').spawn(...a) };"), loader: 'js' };
    });
  },
};

/**
 * The programs, by the commands they run (src/cli/program.ts `programFor` picks one); the training
 * run that makes each one's code cache is in scripts/train-code-cache.mjs. `check` gets a program of its own: it is the command
 * people run most, on every edit; the rest share `full`.
 */
const PROGRAMS = {
  help: { own: [] },
  check: { own: ['src/cli/io.ts', 'src/cli/dxfInput.ts', 'src/cli/commands/check.ts', 'src/cli/commands/checkDxf.ts'] },
  full: { own: null },
};
if (Object.keys(PROGRAMS).join() !== Object.keys(TRAINING).join()) throw new Error('scripts/train-code-cache.mjs TRAINING must name the same programs as PROGRAMS');

const common = {
  absWorkingDir: root,
  bundle: true,
  platform: 'node',
  target: 'node20',
  // pdfkit reads its font metrics from files beside its own code (__dirname): it stays a package.
  external: ['pdfkit'],
  legalComments: 'none',
  logLevel: 'warning',
  metafile: true,
};

/** A program script: CommonJS, run by src/cli/program.ts inside the module wrapper it adds. */
async function program(kind) {
  const r = await build({
    ...common,
    entryPoints: ['src/cli/run.ts'],
    format: 'cjs',
    write: false,
    outfile: join(cliDir, `${kind}.cjs`),
    plugins: [onlyStagesOf(PROGRAMS[kind].own), zodWithoutLocales, commanderWithoutChildProcess],
    // Less text to read at every start; names are kept, so a stack trace still names functions.
    minifyWhitespace: true,
    minifySyntax: true,
    // import.meta has no meaning in a script: its URL is the script's own (the package root is found from it).
    define: { 'import.meta.url': '__frameworkScriptUrl' },
    banner: { js: "'use strict';\nconst __frameworkScriptUrl = require('node:url').pathToFileURL(__filename).href;" },
  });
  // program.ts reads the script as Latin-1 (faster than UTF-8), which is exact for ASCII. esbuild
  // escapes other characters in strings but leaves them in regular expressions (`[xX×]`): a \uXXXX
  // escape means the same character in a string, a template, a regular expression and a comment.
  const code = r.outputFiles[0].text.replace(/[^\x00-\x7f]/g, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
  const hash = createHash('sha256').update(code).digest('hex').slice(0, 12);
  const script = `${kind}-${hash}.cjs`;
  writeFileSync(join(cliDir, script), code);
  // Each source with the number of modules it imports (static imports of this project's modules and packages).
  const sources = Object.fromEntries(
    Object.entries(r.metafile.inputs)
      .filter(([file]) => !file.startsWith('no-stage:'))
      .sort(([a], [b]) => (a < b ? -1 : 1))
      .map(([file, input]) => [file, input.imports.filter((i) => i.kind === 'import-statement' && !i.path.startsWith('node:')).length]),
  );
  return { entry: { script, cache: `${kind}-${hash}.cache` }, sources };
}

// Earlier builds' programs and caches carry other hashes: clear them, and the chunks of the
// previous layout.
for (const f of readdirSync(cliDir)) if (/^[a-z]+-[0-9a-f]{12}\.(cjs|cache)$/.test(f)) rmSync(join(cliDir, f));
rmSync(join(cliDir, 'chunks'), { recursive: true, force: true });

const kinds = Object.keys(PROGRAMS);
const built = await Promise.all(kinds.map(program));
writeFileSync(join(cliDir, 'programs.json'), `${JSON.stringify(Object.fromEntries(kinds.map((k, i) => [k, built[i].entry])), null, 1)}\n`);
writeFileSync(join(cliDir, 'bundle.json'), `${JSON.stringify(Object.fromEntries(kinds.map((k, i) => [k, built[i].sources])), null, 1)}\n`);

await Promise.all([
  build({
    ...common,
    entryPoints: ['src/cli/main.ts'],
    outfile: join(cliDir, 'framewright.cjs'),
    format: 'cjs',
    external: [...common.external, './run.js'],
    define: { FRAMEWRIGHT_BUNDLE: 'true', 'import.meta.url': '__frameworkScriptUrl' },
    banner: { js: "'use strict';\nconst __frameworkScriptUrl = require('node:url').pathToFileURL(__filename).href;" },
  }),
  build({ ...common, entryPoints: ['src/cli/runBundled.ts'], outfile: join(cliDir, 'run.js'), format: 'esm' }),
  build({
    ...common,
    entryPoints: ['src/live/modesWorker.ts'],
    outfile: join(dist, 'live', 'modesWorker.js'),
    format: 'esm',
    plugins: [zodWithoutLocales],
    // Packages written as CommonJS (yaml) call require() for node's built-ins.
    banner: { js: "import { createRequire as __frameworkCreateRequire } from 'node:module';\nconst require = __frameworkCreateRequire(import.meta.url);" },
  }),
]);

chmodSync(join(cliDir, 'framewright.cjs'), 0o755);
// `node dist/cli/main.js` (the README's and the tests' way in) runs the same launcher.
writeFileSync(join(cliDir, 'main.js'), "#!/usr/bin/env node\n// The command line is dist/cli/framewright.cjs (scripts/bundle-cli.mjs); this runs it.\nimport './framewright.cjs';\n");

for (const kind of kinds) trainCodeCache(root, kind);
