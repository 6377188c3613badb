/** ISO metric screw sizes framewright knows hole series for. */
export type ScrewSize = 'M2' | 'M2.5' | 'M3' | 'M4' | 'M5';

/** Woven 0/90 laminate, in-plane engineering constants (GPa) and density. */
export type Material = Readonly<{
  name: string;
  e1Gpa: number;
  e2Gpa: number;
  g12Gpa: number;
  nu12: number;
  densityGPerCm3: number;
}>;
