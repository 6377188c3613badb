import { MM_PER_INCH } from '../params/units.js';

/** Drawing units the importer understands, by the name used on the command line and in sidecars. */
export const DRAWING_UNITS = ['mm', 'cm', 'm', 'in', 'ft', 'mil', 'um', 'dm'] as const;
export type DrawingUnit = (typeof DRAWING_UNITS)[number];

/** Millimetres per drawing unit. The inch is the international inch (1959): 25.4 mm exactly. */
export const MM_PER_UNIT: Readonly<Record<DrawingUnit, number>> = {
  mm: 1,
  cm: 10,
  m: 1000,
  in: MM_PER_INCH,
  ft: 12 * MM_PER_INCH,
  mil: MM_PER_INCH / 1000,
  um: 0.001,
  dm: 100,
};

/**
 * $INSUNITS codes of the DXF Reference (HEADER section): 0 unitless, 1 inches, 2 feet, 4 millimetres,
 * 5 centimetres, 6 metres, 9 mils, 13 microns, 14 decimetres. Codes for miles, kilometres, yards,
 * ångströms and astronomical lengths are not plate units and are refused by the caller.
 */
const INSUNITS: Readonly<Record<number, DrawingUnit>> = { 1: 'in', 2: 'ft', 4: 'mm', 5: 'cm', 6: 'm', 9: 'mil', 13: 'um', 14: 'dm' };

/** The unit an $INSUNITS code names; null for 0 (unitless) or a code that is not a plate unit. */
export function unitFromInsunits(code: number): DrawingUnit | null {
  return INSUNITS[code] ?? null;
}

/** Accepts the names in DRAWING_UNITS plus "inch"/"inches"/"millimetre"...; null otherwise. */
export function parseDrawingUnit(text: string): DrawingUnit | null {
  const t = text.trim().toLowerCase();
  const aliases: Record<string, DrawingUnit> = {
    inch: 'in',
    inches: 'in',
    '"': 'in',
    millimetre: 'mm',
    millimeter: 'mm',
    millimetres: 'mm',
    millimeters: 'mm',
    centimetre: 'cm',
    centimeter: 'cm',
    metre: 'm',
    meter: 'm',
    feet: 'ft',
    foot: 'ft',
    micron: 'um',
    µm: 'um',
  };
  if ((DRAWING_UNITS as readonly string[]).includes(t)) return t as DrawingUnit;
  return aliases[t] ?? null;
}
