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
