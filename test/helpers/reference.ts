import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';

/**
 * Independent reference tools (Debian packages installed by .ci/run). Locally a missing tool skips
 * its tests with a message; in CI (FRAMEWRIGHT_REFERENCE_TOOLS=required) a missing tool fails them.
 */
export const REFERENCE_REQUIRED = process.env.FRAMEWRIGHT_REFERENCE_TOOLS === 'required';

/** Debian's own interpreter: the python3-* reference modules live there, not in other pythons on PATH. */
export const SYSTEM_PYTHON = '/usr/bin/python3';

export function pythonModuleAvailable(module: string): boolean {
  if (!existsSync(SYSTEM_PYTHON)) return false;
  return spawnSync(SYSTEM_PYTHON, ['-c', `import ${module}`], { encoding: 'utf8' }).status === 0;
}

export function commandAvailable(cmd: string): boolean {
  return spawnSync('sh', ['-c', `command -v ${cmd}`], { encoding: 'utf8' }).status === 0;
}

/** True when the tool is there; otherwise throws in CI, or warns and returns false locally. */
export function requireTool(available: boolean, name: string): boolean {
  if (available) return true;
  if (REFERENCE_REQUIRED) throw new Error(`reference tool ${name} is missing but FRAMEWRIGHT_REFERENCE_TOOLS=required`);
  console.warn(`skipping: reference tool ${name} is not installed (CI installs it)`);
  return false;
}

/** Run a Python script with Debian's python3; stdin in, stdout parsed as JSON. */
export function runPythonJson<T>(script: string, input: unknown, args: string[] = []): T {
  const r = spawnSync(SYSTEM_PYTHON, [script, ...args], { input: JSON.stringify(input), encoding: 'utf8', maxBuffer: 256 * 1024 * 1024 });
  if (r.status !== 0) throw new Error(`${script} failed (${r.status}): ${r.stderr}`);
  return JSON.parse(r.stdout) as T;
}
