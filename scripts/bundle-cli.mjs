// Bundles the command line, run by `npm run build` after tsc. Loading ~150 small modules one by one
// (resolve, open, compile each) cost a `check` more than its own geometry, and compiling the same
// code on every start another third (DEVELOPERS.md "Start-up"). Outputs (the library entry,
// dist/index.js, stays tsc's):
//
//   dist/cli/full-HASH.cjs   every command and stage (src/cli/run.ts), one script; a stage's module
//                            body still runs only when a command imports it
//   dist/cli/help-HASH.cjs   the argument parser and the command descriptions only, for --help
//   dist/cli/*.cache         V8 code caches of the two, made by training runs of the built CLI
//   dist/cli/programs.json   which script and cache each kind of run loads (src/cli/program.ts)
//   dist/cli/main.js         the `bin` (src/cli/main.ts), overwriting tsc's: picks a program and runs it
//   dist/cli/run.js          runCommandLine of the full program for the tests' worker (src/cli/runBundled.ts)
//   dist/live/modesWorker.js the live page's worker thread, self-contained
//   dist/cli/bundle.json     the sources in each program and how many modules each imports, for
//                            test/cli/startup.test.ts
//
// Files shipped beside the code are found from the package root (src/cli/packageRoot.ts), so a
// module's place in a bundle does not matter.
import { build } from 'esbuild';
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { readdirSync, rmSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
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

/** The help program never runs a command: every stage a command would load becomes a loud failure. */
const noStages = {
  name: 'no-stages',
  setup(b) {
    b.onResolve({ filter: /.*/ }, (a) => (a.kind === 'dynamic-import' ? { path: a.path, namespace: 'no-stage' } : undefined));
    b.onLoad({ filter: /.*/, namespace: 'no-stage' }, (a) => ({
      contents: `throw new Error(${JSON.stringify(`internal: the help program cannot load ${a.path} (src/cli/program.ts programFor sent a command to it)`)});`,
      loader: 'js',
    }));
  },
};

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
async function program(kind, plugins) {
  const r = await build({
    ...common,
    entryPoints: ['src/cli/run.ts'],
    format: 'cjs',
    write: false,
    outfile: join(cliDir, `${kind}.cjs`),
    plugins,
    minifyWhitespace: process.env.FW_MIN === '1',
    minifySyntax: process.env.FW_MIN === '1',
    // import.meta has no meaning in a script: its URL is the script's own (the package root is found from it).
    define: { 'import.meta.url': '__frameworkScriptUrl' },
    banner: { js: "const __frameworkScriptUrl = require('node:url').pathToFileURL(__filename).href;" },
  });
  const code = r.outputFiles[0].contents;
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
for (const f of readdirSync(cliDir)) if (/^(help|full)-[0-9a-f]+\.(cjs|cache)$/.test(f)) rmSync(join(cliDir, f));
rmSync(join(cliDir, 'chunks'), { recursive: true, force: true });

const [full, help] = await Promise.all([program('full', [zodWithoutLocales]), program('help', [noStages])]);
writeFileSync(join(cliDir, 'programs.json'), `${JSON.stringify({ full: full.entry, help: help.entry }, null, 1)}\n`);
writeFileSync(join(cliDir, 'bundle.json'), `${JSON.stringify({ help: help.sources, full: full.sources }, null, 1)}\n`);

await Promise.all([
  build({ ...common, entryPoints: ['src/cli/main.ts'], outfile: join(cliDir, 'main.js'), format: 'esm', external: [...common.external, './run.js'], define: { FRAMEWRIGHT_BUNDLE: 'true' } }),
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

// Training runs: each program's code cache holds what a typical run compiles (help; checks of the
// demo designs), made by the built CLI itself so V8's version and flags match the runs to come.
for (const args of [['--help'], ['check', 'designs/tessel-5.yaml', 'designs/mote-3.yaml', 'designs/farline-7.yaml']]) {
  const r = spawnSync(process.execPath, [join(cliDir, 'main.js'), ...args], { cwd: root, env: { ...process.env, FRAMEWRIGHT_WRITE_CODE_CACHE: '1' }, stdio: ['ignore', 'ignore', 'pipe'] });
  if (r.status !== 0 && r.status !== 1) throw new Error(`training run framewright ${args.join(' ')} failed (${r.status}): ${r.stderr}`);
}
