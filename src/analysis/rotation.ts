/**
 * What drives a frame: the motors' rotation and the props' thrust, from the prop diameter alone.
 *
 * A prop's tip speed is what limits how fast it turns (noise, efficiency and compressibility grow
 * with it), so builds of every size run their props' tips at a similar top speed. At a given tip
 * speed v the rotation frequency is n = v / (π D): the motors' top rotation band falls as 1/D.
 * Static thrust follows the propeller's thrust coefficient, T = C_T ρ n² D⁴ (the dimensionless
 * form used throughout propeller theory, e.g. McCormick, Aerodynamics, Aeronautics and Flight
 * Mechanics, ch. 6); at a given tip speed it grows as D².
 * SI inside; mm, Hz, N at the interface.
 */

/**
 * Blade tip speeds at the top of the throttle that bound the motors' top rotation band. m/s.
 * Common practice, no source: they reproduce the domain notes' 500–650 Hz for 5-inch props and
 * 350–450 Hz for 7-inch props.
 */
export const TOP_TIP_SPEED_MPS = { low: 200, high: 255 } as const;

/** Static thrust coefficient of a small two- or three-blade prop, T / (ρ n² D⁴). From memory (small-prop test data run 0.08–0.15). */
export const STATIC_THRUST_COEFFICIENT = 0.1;

/** Sea-level standard air density (ISA). kg/m³. */
export const SEA_LEVEL_AIR_DENSITY = 1.225;

/** The motors' top rotation band for a prop: rotation frequencies at the band's two tip speeds. Hz. */
export type RotationBand = Readonly<{ lowHz: number; highHz: number }>;

/**
 * Rotation frequency of a prop of diameter D (mm) whose tips move at `tipSpeedMps`: v / (π D). Hz.
 * Throws RangeError for a non-positive diameter or speed.
 * @example rotationHz(127, 200) // 501.3: a 5-inch prop at 200 m/s tip speed
 */
export function rotationHz(propDiameterMm: number, tipSpeedMps: number): number {
  if (!(propDiameterMm > 0) || !(tipSpeedMps > 0)) throw new RangeError(`prop diameter and tip speed must be positive (got ${propDiameterMm} mm, ${tipSpeedMps} m/s)`);
  return tipSpeedMps / (Math.PI * propDiameterMm * 1e-3);
}

/**
 * The motors' top rotation band for a prop (mm): rotation at the band's low and high tip speeds. Hz.
 * @example rotationBand(177.8) // { lowHz: 358.1, highHz: 456.5 }: a 7-inch prop
 */
export function rotationBand(propDiameterMm: number, tips: Readonly<{ low: number; high: number }> = TOP_TIP_SPEED_MPS): RotationBand {
  return { lowHz: rotationHz(propDiameterMm, tips.low), highHz: rotationHz(propDiameterMm, tips.high) };
}

/**
 * Static thrust of one prop turning at `rotationHz`: T = C_T ρ n² D⁴. N.
 * @example propThrustN(127, 650) // ≈ 13.46: a 5-inch prop at 650 rev/s
 */
export function propThrustN(propDiameterMm: number, rotationHz: number, thrustCoefficient = STATIC_THRUST_COEFFICIENT, airDensity = SEA_LEVEL_AIR_DENSITY): number {
  if (!(propDiameterMm > 0) || !(rotationHz >= 0)) throw new RangeError(`prop diameter must be positive and rotation ≥ 0 (got ${propDiameterMm} mm, ${rotationHz} Hz)`);
  const D = propDiameterMm * 1e-3;
  return thrustCoefficient * airDensity * rotationHz * rotationHz * D ** 4;
}

/**
 * A motor's full thrust: its prop at the top of the rotation band (the high tip speed). N.
 * @example fullThrustN(127) // ≈ 13.0 (1.33 kgf), a 5-inch prop
 */
export const fullThrustN = (propDiameterMm: number): number => propThrustN(propDiameterMm, rotationBand(propDiameterMm).highHz);
