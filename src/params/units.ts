/** Length conversions at the interface; everything inside is millimetres. */

/** International inch (1959): exactly 25.4 mm. */
export const MM_PER_INCH = 25.4;

/** 1/8 inch end mill, the commonest router bit for plate frames. */
export const EIGHTH_INCH_MM = MM_PER_INCH / 8;

/** Degrees to radians. */
export const degToRad = (deg: number): number => (deg * Math.PI) / 180;
/** Radians to degrees. */
export const radToDeg = (rad: number): number => (rad * 180) / Math.PI;

/**
 * A length given as a number (mm) or a string with a unit suffix: "5.1in", "5.1\"", "127mm", "12.7cm".
 * Returns millimetres, or null when the text is not a length.
 */
export function parseLengthMm(value: number | string): number | null {
  if (typeof value === 'number') return Number.isFinite(value) ? value : null;
  const m = /^\s*([0-9]*\.?[0-9]+(?:e[+-]?\d+)?)\s*(in|inch|inches|"|mm|cm)?\s*$/i.exec(value);
  if (!m) return null;
  const v = Number(m[1]);
  const unit = (m[2] ?? 'mm').toLowerCase();
  if (unit === 'mm') return v;
  if (unit === 'cm') return v * 10;
  return v * MM_PER_INCH;
}
