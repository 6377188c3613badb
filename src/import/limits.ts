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
  /** Lines and arcs after exploding (a command that needs a mesh node per segment sets it lower). */
  maxSegments: number;
  /** Closed contours (outlines and holes) in the drawing: the design-rule checks' limit. */
  maxContours: number;
  /** Why a caller lowered a limit, added to the refusal (e.g. "modes meshes at most …"). */
  reason?: string;
}>;

export const DEFAULT_LIMITS: ImportLimits = {
  maxPairs: 5_000_000,
  maxEntities: 200_000,
  maxBlockDepth: 16,
  maxCoordinateMm: 1e6,
  maxSegments: 800_000,
  // A frame plate has tens to hundreds of holes, a sheet of 100 plates about 10,000 contours; the
  // checks stay linear, but 100,000 holes give about a million findings (a report of hundreds of MB).
  maxContours: 50_000,
};

/** The end of a refusal message: the reader's limit, or the reason a caller gave for a lower one. */
export const limitWords = (l: ImportLimits): string => (l.reason ? `, the limit here: ${l.reason}` : ", the reader's limit");
