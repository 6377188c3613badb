/** One benchmark case: `run` is timed over several repetitions; `target` states the goal in words. */
export type BenchCase = Readonly<{
  name: string;
  target: string;
  /** Milliseconds the median must stay under to meet the target. */
  budgetMs: number;
  setup?: () => unknown;
  run: (state: unknown) => unknown;
  /** A figure to print beside the timing (e.g. "utilisation 71 % vs bound 83 %"), from the last run's result. */
  note?: (result: unknown) => string;
}>;

/** What one figure measured in this run: its value, its peer's, and whether the goal is met. */
export type FigureResult = Readonly<{ value: string; peer: string; ratio?: string; met: boolean; note?: string }>;

/**
 * One row of the figures table (`npm run bench`): a figure the project promises, measured beside
 * its peer in the same run (a bare `node -e 0`, an independent reference program, a lower bound),
 * so the ratio means the same on any machine. `order` places the row among those of other files
 * (the order of the table in the issue that set the goals).
 */
export type BenchFigure = Readonly<{
  figure: string;
  goal: string;
  order: number;
  measure: () => Promise<FigureResult>;
}>;

/**
 * Something to time: an async function, or a process (`argv[0]` is the program; `process.execPath`
 * for node) that must exit with one of `exitCodes` (default 0 or 1).
 */
export type Timed = (() => unknown) | Readonly<{ argv: readonly string[]; cwd?: string; input?: string; exitCodes?: readonly number[] }>;
