// Defaults of the analysis that the command line names in its help text. This module imports
// nothing, so `framewright --help` can show them without loading the analysis.

/** Thrust used for static figures when none is given, N (a 5-inch motor near hover-to-punch; common practice, no source). */
export const DEFAULT_THRUST_N = 10;
