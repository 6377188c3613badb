/**
 * What drives a frame: the motors' rotation and the props' thrust, from the prop diameter alone.
 * One representation of the rotation band for every stage (assembled-frame modes, size variants).
 *
 * A prop's tip speed is what limits how fast it turns (noise, efficiency and compressibility grow
 * with it), so builds of every size run their props' tips at a similar top speed. At a given tip
 * speed v the rotation frequency is n = v / (π D): the motors' rotation band falls as 1/D.
 * Static thrust follows the propeller's thrust coefficient, T = C_T ρ n² D⁴ (the dimensionless
 * form used throughout propeller theory, e.g. McCormick, Aerodynamics, Aeronautics and Flight
 * Mechanics, ch. 6); at a given tip speed it grows as D².
 * SI inside; mm, Hz, N at the interface.
 */

/** The motors' rotation frequencies, Hz, and how the top one was found. */
export type RotationBand = Readonly<{ lowHz: number; highHz: number; source: string }>;

/**
 * Blade tip speed taken as the top of the rotation band when the design states none, m/s: it puts
 * the top rotation of a 5-inch prop near 600 Hz and of a 7-inch near 430 Hz, inside the ranges the
 * trade quotes (domain.md: 500–650 Hz and 350–450 Hz). Common practice, no source.
 */
export const TOP_TIP_SPEED_MPS = 240;
/** Bottom of the band as a fraction of the top rotation speed (idle to hover; common practice, no source). */
export const BAND_LOW_FRACTION = 0.3;

/** Static thrust coefficient of a small two- or three-blade prop, T / (ρ n² D⁴). From memory (small-prop test data run 0.08–0.15). */
export const STATIC_THRUST_COEFFICIENT = 0.1;

/** Sea-level standard air density (ISA). kg/m³. */
export const SEA_LEVEL_AIR_DENSITY = 1.225;

/**
 * Rotation frequency of a prop of diameter D (mm) whose tips move at `tipSpeedMps`: v / (π D). Hz.
 * Throws RangeError for a non-positive diameter or speed.
 * @example rotationHz(127, 240) // 601.5: a 5-inch prop at 240 m/s tip speed
 */
export function rotationHz(propDiameterMm: number, tipSpeedMps: number): number {
  if (!(propDiameterMm > 0) || !(tipSpeedMps > 0)) throw new RangeError(`prop diameter and tip speed must be positive (got ${propDiameterMm} mm, ${tipSpeedMps} m/s)`);
  return tipSpeedMps / (Math.PI * propDiameterMm * 1e-3);
}

/**
 * The motors' rotation band from the prop diameter and a top blade tip speed: top f = v / (π D),
 * bottom BAND_LOW_FRACTION of it.
 * @param propDiameterMm prop diameter, mm (> 0)
 * @example rotationBandFromTipSpeed(177.8).highHz // 429.7: a 7-inch prop
 */
export function rotationBandFromTipSpeed(propDiameterMm: number, tipSpeedMps = TOP_TIP_SPEED_MPS): RotationBand {
  const high = rotationHz(propDiameterMm, tipSpeedMps);
  return { lowHz: BAND_LOW_FRACTION * high, highHz: high, source: `blade tip speed ${tipSpeedMps} m/s on a ${propDiameterMm.toFixed(1)} mm prop (top), ${Math.round(BAND_LOW_FRACTION * 100)} % of it (bottom)` };
}

/** A motor's speed under load over its no-load speed kv × V (domain.md: 0.75–0.85; common practice, no source). */
export const LOADED_SPEED_FRACTION = 0.8;

/**
 * The motors' rotation band of a design: top rotation frequency kv × V × 0.8 / 60 when the motor
 * gives kv and a supply voltage, else from the prop's tip speed (`props.maxTipSpeedMps`, default
 * 240 m/s) as v / (π D); bottom 30 % of the top.
 * @param propDiameterMm prop diameter, mm (> 0)
 * @example rotationBandOf({ motor: { kv: 2400, supplyVoltageV: 22.2 }, props: {} }, 129.5).highHz // 710.4
 */
export function rotationBandOf(d: Readonly<{ motor: Readonly<{ kv?: number; supplyVoltageV?: number }>; props: Readonly<{ maxTipSpeedMps?: number }> }>, propDiameterMm: number): RotationBand {
  const { kv, supplyVoltageV } = d.motor;
  if (kv === undefined || supplyVoltageV === undefined) return rotationBandFromTipSpeed(propDiameterMm, d.props.maxTipSpeedMps ?? TOP_TIP_SPEED_MPS);
  const high = (kv * supplyVoltageV * LOADED_SPEED_FRACTION) / 60;
  return { lowHz: BAND_LOW_FRACTION * high, highHz: high, source: `motor ${kv} kv on ${supplyVoltageV} V, ${Math.round(LOADED_SPEED_FRACTION * 100)} % of its no-load speed (top), ${Math.round(BAND_LOW_FRACTION * 100)} % of it (bottom)` };
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
 * A motor's full thrust: its prop at the top of the rotation band. N.
 * @example fullThrustN(127) // ≈ 11.5 (1.18 kgf), a 5-inch prop
 */
export const fullThrustN = (propDiameterMm: number): number => propThrustN(propDiameterMm, rotationBandFromTipSpeed(propDiameterMm).highHz);
