import type { Loop, Vec2 } from './types.js';

import type { Material, ScrewSize } from '../params/types.js';

// The design's vocabulary (params) is the lowest layer; parts reuse its screw and material types.
export type { Material, ScrewSize };

/** Why a hole or cut-out is there: checks and drawings treat them differently. */
export type FeaturePurpose =
  | 'motor-bolt'
  | 'motor-bore'
  | 'stack-bolt'
  | 'standoff'
  | 'arm-root-bolt'
  | 'accessory'
  | 'camera-pivot'
  | 'camera-tilt-slot'
  | 'camera-mount'
  | 'strap-slot'
  | 'lead-opening'
  | 'lightening'
  | 'truss-window'
  | 'imported';

/** Plain words for each purpose, used in reports, hole tables and error messages. */
export const PURPOSE_WORDS: Record<FeaturePurpose, string> = {
  'motor-bolt': 'motor bolt',
  'motor-bore': 'motor bore',
  'stack-bolt': 'stack bolt',
  standoff: 'standoff',
  'arm-root-bolt': 'arm-root bolt',
  accessory: 'accessory',
  'camera-pivot': 'camera pivot',
  'camera-tilt-slot': 'camera tilt',
  'camera-mount': 'camera mount',
  'strap-slot': 'strap',
  'lead-opening': 'battery-lead',
  lightening: 'lightening',
  'truss-window': 'truss',
  imported: '',
};

const KIND_WORDS = { hole: 'hole', slot: 'slot', cutout: 'cut-out' } as const;

/**
 * A feature in words: "arm-root bolt hole Ø3.40", "strap slot", "truss cut-out"; the outline for null.
 */
export function featureLabel(f: Feature | null): string {
  if (!f) return 'outline';
  const words = `${PURPOSE_WORDS[f.purpose]} ${KIND_WORDS[f.kind]}`.trim();
  return `${words}${f.diameterMm !== undefined ? ` Ø${f.diameterMm.toFixed(2)}` : ''}`;
}

/**
 * An inner contour of a part. `loop` is clockwise. Round holes also carry their centre and
 * diameter so checks and hole tables need not rediscover them.
 */
export type Feature = Readonly<{
  loop: Loop;
  kind: 'hole' | 'slot' | 'cutout';
  purpose: FeaturePurpose;
  screw?: ScrewSize;
  centerMm?: Vec2;
  diameterMm?: number;
  /** Countersunk from the given face for a flush head. */
  countersink?: Readonly<{ headDiameterMm: number; face: 'top' | 'bottom' }>;
}>;

/** A load-carrying strut: its centreline in part coordinates and its width. */
export type Member = Readonly<{ name: string; startMm: Vec2; endMm: Vec2; widthMm: number }>;

/** Where one copy of a part sits in the assembled frame. Frame axes: x forward, y left, z up. */
export type Placement = Readonly<{
  /** Part coordinates → frame: mirror y, rotate about z, translate (plan view). */
  rotateRad: number;
  translateMm: Vec2;
  mirrorY: boolean;
  /** Height of the part's lower face above the bottom plate's lower face. mm. */
  zMm: number;
  /** Vertical plates (camera sides) stand in the x–z plane at y = translate[1]; their part y is frame z. */
  vertical?: boolean;
}>;

export type PartRole = 'bottom' | 'top' | 'arm' | 'brace' | 'camera-side' | 'imported';

/**
 * One plate as cut: outline counter-clockwise, features clockwise, all in part coordinates (mm).
 * weaveRad is the angle of the sheet's 0° fibre direction in part coordinates (0: along part x).
 */
export type Part = Readonly<{
  name: string;
  role: PartRole;
  quantity: number;
  thicknessMm: number;
  material: Material;
  weaveRad: number;
  outline: Loop;
  features: readonly Feature[];
  members: readonly Member[];
  placements: readonly Placement[];
  /** Design-file path that sizes this part, for error messages and findings. */
  sourcePath: string;
}>;
