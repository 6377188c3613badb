import { readFileSync, watch, type FSWatcher } from 'node:fs';
import { basename, dirname, resolve } from 'node:path';
import { errorJson, reportError, STDIN_PATH, UsageError } from './io.js';

/** Changes closer together than this are one save (editors write, rename and touch in bursts). ms. */
const SETTLE_MS = 120;

const contents = (path: string): string | null => {
  try {
    return readFileSync(path, 'utf8');
  } catch {
    return null;
  }
};

/**
 * `--watch`: run once, then again whenever one of the files changes, until Ctrl-C. A run that fails
 * (bad input) reports its error (also as JSON on stdout with `--json`) and the watch goes on; the
 * exit code at the end is the last run's. Folders are watched rather than files, because editors
 * save by renaming a new file over the old one; a change that leaves the text as it was is ignored.
 */
export async function watchAndRun(paths: readonly string[], run: () => Promise<number>, json: boolean): Promise<void> {
  if (paths.includes(STDIN_PATH)) throw new UsageError('--watch needs files to watch; standard input (-) cannot be watched', '--watch');
  const files = [...new Set(paths.map((p) => resolve(p)))];
  const seen = new Map(files.map((f) => [f, contents(f)]));
  let running: Promise<void> = Promise.resolve();
  const once = async (): Promise<void> => {
    try {
      process.exitCode = await run();
    } catch (e) {
      process.exitCode = reportError(e);
      if (json) process.stdout.write(`${JSON.stringify(errorJson(e), null, 2)}\n`);
    }
    process.stderr.write(`framewright: watching ${paths.join(', ')} (Ctrl-C to stop)\n`);
  };
  await once();
  let timer: NodeJS.Timeout | null = null;
  const watchers: FSWatcher[] = [];
  for (const dir of new Set(files.map((f) => dirname(f)))) {
    const names = new Set(files.filter((f) => dirname(f) === dir).map((f) => basename(f)));
    const w = watch(dir, (_event, name) => {
      if (name !== null && !names.has(name)) return;
      if (timer) clearTimeout(timer);
      timer = setTimeout(() => {
        const changed = files.filter((f) => contents(f) !== seen.get(f));
        if (changed.length === 0) return;
        for (const f of changed) seen.set(f, contents(f));
        // Runs one after another: a save during a run waits for it.
        running = running.then(() => {
          process.stderr.write(`\nframewright: ${changed.map((f) => basename(f)).join(', ')} changed; running again\n`);
          return once();
        });
      }, SETTLE_MS);
    });
    w.on('error', () => undefined);
    watchers.push(w);
  }
  await new Promise<void>((done) => {
    const stop = (): void => {
      process.off('SIGINT', stop);
      process.off('SIGTERM', stop);
      if (timer) clearTimeout(timer);
      for (const w of watchers) w.close();
      done();
    };
    process.on('SIGINT', stop);
    process.on('SIGTERM', stop);
  });
}
