import { readFileSync } from 'node:fs';
import { checkFrame, checkOptions, checkParts } from '../checks/index.js';
import type { Feature, Part } from '../geometry/part.js';
import { circle, roundedRect } from '../geometry/primitives.js';
import { buildFrame } from '../geometry/index.js';
import { parseDesignText } from '../params/index.js';
import type { BenchCase } from './types.js';

/** A 2 mm plate with a 50 × 40 grid of 6 mm lightening holes on a 10 mm pitch (2,000 holes, 4 mm webs). */
export function lighteningPlate(): Part {
  const features: Feature[] = [];
  for (let i = 0; i < 50; i++) {
    for (let j = 0; j < 40; j++) {
      const c = [-245 + 10 * i, -195 + 10 * j] as const;
      features.push({ loop: circle(c, 3, false), kind: 'hole', purpose: 'lightening', centerMm: c, diameterMm: 6 });
    }
  }
  return {
    name: 'lightening-grid',
    role: 'imported',
    quantity: 1,
    thicknessMm: 2,
    material: { name: 'woven-cf', e1Gpa: 65, e2Gpa: 65, g12Gpa: 4, nu12: 0.07, densityGPerCm3: 1.57 },
    weaveRad: 0,
    outline: roundedRect([0, 0], 510, 410, 8),
    features,
    members: [],
    placements: [],
    sourcePath: 'bench',
  };
}

export const cases: BenchCase[] = [
  {
    name: 'check a plate with 2,000 holes (webs, edges, bit reach)',
    target: 'under 200 ms',
    budgetMs: 200,
    setup: () => lighteningPlate(),
    run: (plate) => checkParts([plate as Part], checkOptions({ toolDiameterMm: 3.175 })),
    note: (r) => {
      const rep = r as ReturnType<typeof checkParts>;
      return `min web ${rep.parts[0].metrics.minWebMm} mm, ${rep.findings.length} findings`;
    },
  },
  {
    name: 'check tessel-5 (all part and frame rules)',
    target: 'under 1 s',
    budgetMs: 1000,
    setup: () => buildFrame(parseDesignText(readFileSync(new URL('../../designs/tessel-5.yaml', import.meta.url), 'utf8'))),
    run: (frame) => checkFrame(frame as ReturnType<typeof buildFrame>),
    note: (r) => `${(r as ReturnType<typeof checkFrame>).summary.errors} errors, ${(r as ReturnType<typeof checkFrame>).summary.warnings} warnings`,
  },
];
