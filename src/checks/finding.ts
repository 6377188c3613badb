import type { Vec2 } from '../geometry/types.js';
import type { Finding, Severity } from './types.js';

/** Round a reported number to 4 decimals so reports are stable across platforms' last-bit noise. */
export const r4 = (x: number): number => Math.round(x * 1e4) / 1e4 + 0;

/**
 * Messages already given, so that the thousands of identical findings of a drilled plate share one
 * string instead of each keeping its own (memory that otherwise grows the garbage collector's work
 * faster than the hole count). Cleared when large; it only ever returns a string equal to its input.
 */
const texts = new Map<string, string>();
const MAX_TEXTS = 4096;

function shared(message: string): string {
  const known = texts.get(message);
  if (known !== undefined) return known;
  if (texts.size >= MAX_TEXTS) texts.clear();
  texts.set(message, message);
  return message;
}

/** A finding with rounded numbers. */
export function finding(
  rule: string,
  severity: Severity,
  part: string,
  measured: number | null,
  limit: number | null,
  unit: string,
  at: Vec2 | null,
  message: string,
): Finding {
  return {
    rule,
    severity,
    part,
    measured: measured === null ? null : r4(measured),
    limit: limit === null ? null : r4(limit),
    unit,
    atMm: at ? [r4(at[0]), r4(at[1])] : null,
    message: shared(message),
  };
}

export const mm = (x: number, d = 2): string => `${x.toFixed(d)} mm`;

/**
 * End mills a shop commonly stocks for carbon plate, largest first. mm. Common practice, no source
 * (1/8" = 3.175 mm is the usual default; metric 1–3 mm for small features).
 */
export const COMMON_BITS_MM: readonly number[] = [6, 4, 3.175, 3, 2.5, 2, 1.5, 1, 0.8, 0.5];

/** The largest common bit no wider than maxMm, or null when even the smallest is too wide. */
export const largestBitMm = (maxMm: number): number | null => COMMON_BITS_MM.find((b) => b <= maxMm + 1e-9) ?? null;

/** A width that clears a tool of diameter D with room to spare: D + 0.1 mm, rounded up to 0.1 mm. */
export const clearWidthMm = (toolDiameterMm: number): number => Math.ceil((toolDiameterMm + 0.1) * 10 - 1e-9) / 10;

/** A bit size as written in advice: "2 mm", "3.175 mm". */
export const bitText = (d: number): string => `${Number(d.toFixed(3))} mm`;
export const pt = (p: Vec2): string => `(${p[0].toFixed(2)}, ${p[1].toFixed(2)})`;
export const mid = (a: Vec2, b: Vec2): Vec2 => [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2];

/**
 * A finding about two things of the assembled frame that meet: `part` is "frame", `atMm` the plan
 * position, `parts` both names, `where` the 3D point (mm, rounded like every reported number).
 */
export function fitFinding(
  rule: string,
  severity: Severity,
  measured: number | null,
  limit: number | null,
  unit: string,
  parts: readonly [string, string],
  where: readonly [number, number, number],
  message: string,
): Finding {
  return {
    ...finding(rule, severity, 'frame', measured, limit, unit, [where[0], where[1]], message),
    parts: [parts[0], parts[1]],
    where: [r4(where[0]), r4(where[1]), r4(where[2])],
  };
}
