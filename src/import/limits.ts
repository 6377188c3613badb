/**
 * Size limits that keep a hostile or broken file from hanging the reader. Each is far beyond any
 * plate drawing (a busy frame plate has a few hundred entities) and is named in the error message.
 */
export type ImportLimits = Readonly<{
  /** Group-code pairs in the file. */
  maxPairs: number;
  /** Entities after every block is exploded. */
  maxEntities: number;
  /** INSERT nesting depth. */
  maxBlockDepth: number;
  /** Largest |coordinate| after conversion to mm. */
  maxCoordinateMm: number;
}>;

export const DEFAULT_LIMITS: ImportLimits = {
  maxPairs: 5_000_000,
  maxEntities: 200_000,
  maxBlockDepth: 16,
  maxCoordinateMm: 1e6,
};
