/**
 * Named tolerances, one meaning each. Every geometric comparison in framewright uses one of these,
 * passed explicitly where a caller may want another value.
 */

/** Two points closer than this are the same point (chaining loops, matching endpoints). mm. */
export const COINCIDENT_MM = 1e-6;

/** Endpoints of consecutive segments in a loop may differ by this much (floating error of arc ends). mm. */
export const CHAIN_GAP_MM = 1e-4;

/** Largest distance between an arc and the chord that replaces it when a loop must be flattened. mm. */
export const CHORD_TOL_MM = 0.002;

/** Two tangent directions closer than this angle meet smoothly (no corner). rad. */
export const SMOOTH_JOINT_RAD = 1e-6;

/** Probe step used to ask which side of a boundary piece is material (boolean classification). mm. */
export const SIDE_PROBE_MM = 1e-4;
