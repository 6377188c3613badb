/**
 * The check report contract (stable field names; see README "Check report"). Every stage that
 * produces findings (design rules, DXF file hygiene) uses these shapes.
 */
export type Severity = 'error' | 'warning' | 'info';

export type Finding = Readonly<{
  /** Rule identifier, kebab-case, e.g. "web-width", "hole-edge-distance", "dxf-open-contour". */
  rule: string;
  severity: Severity;
  /** Part name; empty when no part could be formed (file-level findings). */
  part: string;
  measured: number | null;
  limit: number | null;
  unit: string;
  /** Where, in part coordinates (mm); frame coordinates for frame-level findings. */
  atMm: readonly [number, number] | null;
  message: string;
  /** Fit findings on the assembled frame: the two things that meet (plate copy, standoff, screw, component or prop ids). */
  parts?: readonly [string, string];
  /** Fit findings: where they meet, frame coordinates (x forward, y left, z up). mm. */
  where?: readonly [number, number, number];
}>;

export type PartMetrics = Readonly<{
  name: string;
  thicknessMm: number;
  contours: number;
  holes: number;
  areaMm2: number;
  cutLengthMm: number;
  bboxMm: readonly [number, number, number, number];
  metrics: Readonly<{
    minWebMm: number | null;
    minHoleEdgeWebMm: number | null;
    minHoleHoleWebMm: number | null;
    minEdgeRatio: number | null;
  }>;
}>;

export type CheckReport = Readonly<{
  units: 'mm';
  parts: readonly PartMetrics[];
  findings: readonly Finding[];
  summary: Readonly<{ errors: number; warnings: number }>;
}>;
