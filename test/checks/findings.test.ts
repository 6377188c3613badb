import { describe, expect, it } from 'vitest';
import { checkFrame, checkOptions, checkPart, MERGE_DISTANCE_MM, type Finding } from '../../src/checks/index.js';
import { buildFrame, relieveFrame } from '../../src/geometry/index.js';
import { polygon, roundedRect, slot } from '../../src/geometry/primitives.js';
import { validateDesign } from '../../src/params/index.js';
import { DEMO_FILES, demoFrame, designWith } from '../helpers/demo.js';
import { rect, roundHole, testPart } from './parts.js';

/**
 * Every finding framewright can write, gathered from the demo designs, the same designs with corner
 * reliefs, planted designs that break the frame rules and planted parts that break the part rules:
 * together they reach every message template (the test below lists the templates it saw).
 */
const o = checkOptions({ toolDiameterMm: 3.175 });
const frameWith = (patch: Record<string, unknown>) => buildFrame(validateDesign(designWith('tessel-5.yaml', patch)));

function plantedParts(): Finding[] {
  const parts = [
    // e/D error and warning, pitch, stress (a member through the holes).
    testPart(rect(0, 0, 60, 12), [{ ...roundHole([4.08, 6], 3.4, 'arm-root-bolt'), screw: 'M3' as const }, { ...roundHole([12, 6], 3.4, 'arm-root-bolt'), screw: 'M3' as const }], {
      members: [{ name: 'arm', startMm: [0, 6], endMm: [60, 6], widthMm: 12 }],
    }),
    // A web between two holes and a neck in the outline.
    // A 1.2 mm web between two holes (error), a 1.7 mm one (warning, 2 mm plate), a 1.6 mm neck.
    testPart(polygon([[0, 0], [40, 0], [40, 12], [21, 12], [21, 1.6], [19, 1.6], [19, 12], [0, 12]]), [roundHole([5, 6], 3.4), roundHole([9.6, 6], 3.4), roundHole([27, 6], 3.4), roundHole([32.1, 6], 3.4)]),
    // Small hole (drill), a cut-out the tool cannot enter, a narrow slot, a narrow gap, sharp corners, a small fillet.
    testPart(rect(0, 0, 80, 40), [
      roundHole([5, 35], 2.4),
      { shape: rect(10, 10, 12.5, 12.5), kind: 'cutout' },
      { shape: slot([20, 30], [40, 30], 3), kind: 'slot' },
      { shape: roundedRect([30, 15], 10, 8, 1), kind: 'cutout' },
    ]),
    // Two pockets joined by a 2.8 mm channel: a gap narrower than the tool.
    testPart(rect(0, 0, 44, 30), [{ shape: polygon([[10, 10], [18, 10], [18, 13.6], [26, 13.6], [26, 10], [34, 10], [34, 20], [26, 20], [26, 16.4], [18, 16.4], [18, 20], [10, 20]]), kind: 'cutout' }]),
    // A strut at 30° to the weave (warning) beside one along it (note).
    testPart(rect(0, 0, 60, 40), [], {
      members: [
        { name: 'strut', startMm: [5, 5], endMm: [5 + 40 * Math.cos(Math.PI / 6), 5 + 40 * Math.sin(Math.PI / 6)], widthMm: 6 },
        { name: 'spar', startMm: [5, 35], endMm: [55, 35], widthMm: 6 },
      ],
    }),
  ];
  return parts.flatMap((p) => checkPart(p, o).findings);
}

function plantedFrames(): (readonly Finding[])[] {
  return [
    frameWith({ layout: { kind: 'x', wheelbaseMm: 190, armAngleDeg: 45 } }),
    frameWith({ body: { standoffs: { positionsMm: [[50, 17], [50, -17], [-50, 17], [-50, -17]] } } }),
    frameWith({ camera: { forwardOffsetMm: 60 } }),
    frameWith({ topPlate: { lengthMm: 140 } }),
    // Camera side plates grown into the flight stack: an interference.
    buildFrame(validateDesign(designWith('farline-7.yaml', { camera: { plateMarginMm: 5.2 } }))),
  ].map((f) => checkFrame(f).findings);
}

const demoReports = DEMO_FILES.flatMap((file) => {
  const frame = demoFrame(file);
  return [checkFrame(frame), checkFrame(relieveFrame(frame, 3.175).frame)];
});
const all: Finding[] = [...demoReports.flatMap((r) => r.findings), ...plantedParts(), ...plantedFrames().flat()];

/** A message's template: numbers, feature names and quoted parameters replaced by placeholders. */
const template = (m: string): string =>
  m
    .replace(/-?\d+(\.\d+)?/g, '#')
    .replace(/\b(front|rear)-(left|right)\b/g, 'P')
    .split(';')[0]
    .replace(/^[^:]*:/, 'X:');

describe('findings: one per rule and place', () => {
  it(`no two findings of one rule on one part lie within ${MERGE_DISTANCE_MM} mm (demo designs, relieved, planted)`, () => {
    const reports = [...demoReports.map((r) => r.findings), ...plantedFrames()];
    for (const fs of reports) {
      const placed = fs.filter((f) => f.atMm);
      for (let i = 0; i < placed.length; i++) {
        for (let j = i + 1; j < placed.length; j++) {
          const a = placed[i];
          const b = placed[j];
          if (a.rule !== b.rule || a.part !== b.part) continue;
          const d = Math.hypot(a.atMm![0] - b.atMm![0], a.atMm![1] - b.atMm![1]);
          expect(d, `${a.part} ${a.rule}: "${a.message}" / "${b.message}"`).toBeGreaterThanOrEqual(MERGE_DISTANCE_MM);
        }
      }
    }
  });

  it('the demo designs have no errors and at most 10 warnings each', () => {
    for (const r of demoReports.filter((_, i) => i % 2 === 0)) {
      expect(r.summary.errors).toBe(0);
      expect(r.summary.warnings).toBeLessThanOrEqual(10);
    }
  });
});

describe('finding messages', () => {
  it('every message states the measured value and the limit it is held against', () => {
    // Ratios and lengths with two decimals (tool sizes with three: 3.175 mm).
    const shows = (m: string, x: number): boolean => m.includes(Math.abs(x).toFixed(2)) || m.includes(Math.abs(x).toFixed(3));
    for (const f of all) {
      if (f.measured !== null) expect(shows(f.message, f.measured), f.message).toBe(true);
      else expect(f.severity, f.message).toBe('info');
      if (f.limit !== null) expect(shows(f.message, f.limit), f.message).toBe(true);
      else expect(f.message, f.message).toMatch(/no limit/);
    }
  });

  it('every message ends in one sentence of advice that starts with what to do', () => {
    const verbs = /^(move|widen|drill|round|enlarge|space|lay|run|trim|set|accept|lengthen|use|turn|shim|narrow|add|information only|no change needed)\b/;
    for (const f of all) {
      const parts = f.message.split('; ');
      expect(parts.length, f.message).toBe(2);
      expect(parts[1], f.message).toMatch(verbs);
      expect(parts[1], f.message).not.toMatch(/\.\s/); // one sentence
    }
  });

  it('grammar over every template: articles, spacing, brackets, no raw ids or missing values', () => {
    const templates = new Set(all.map((f) => `${f.rule} ${f.severity} ${template(f.message)}`));
    // Every rule's templates are reached (part rules, frame rules, both severities where they exist).
    const want = [
      'bit-reach error X: slot width', 'bit-reach error X: the largest tool', 'bit-reach error X: gap', 'bit-reach info X: diameter', 'bit-reach warning X: radius',
      'camera-view warning', 'hole-edge-distance error X: e/D', 'hole-edge-distance warning X: e/D', 'hole-edge-distance warning X: pitch/D', 'hole-stress info',
      'prop-clearance error X: clearance', 'prop-clearance error X: gap', 'interference error X: overlap', 'weave-direction info', 'weave-direction warning',
      'web-width error X: web', 'web-width warning X: web',
    ];
    for (const w of want) expect([...templates].some((t) => t.startsWith(w)), w).toBe(true);
    for (const f of all) {
      const m = f.message;
      expect(m, m).not.toMatch(/\b(undefined|NaN|null|Infinity)\b|\[object/);
      expect(m, m).not.toMatch(/ {2}| [,;:)]|\( /);
      // "a" before a vowel sound, "an" before a consonant sound (an M3 and an 8 mm are right).
      expect(m, m).not.toMatch(/\ba (?:[aeio]|u(?!ni|se))\w/i);
      expect(m, m).not.toMatch(/\ban (?![aeiou]|[AEFHILMNORSX][0-9\s.-]|8|11 |18 )\S/);
      // Feature purposes in words, not identifiers.
      expect(m, m).not.toMatch(/arm-root-bolt|motor-bolt|stack-bolt|camera-tilt-slot|truss-window|lead-opening/);
      expect((m.match(/\(/g) ?? []).length, m).toBe((m.match(/\)/g) ?? []).length);
      expect(m[0], m).toMatch(/[a-zA-Z]/);
    }
  });

  it('bit-reach on a narrow slot gives the slot width and a fix with the width and a bit', () => {
    const p = testPart(rect(0, 0, 40, 30), [{ shape: slot([10, 10], [30, 10], 3), kind: 'slot' }]);
    const f = checkPart(p, o).findings.filter((x) => x.rule === 'bit-reach' && x.severity === 'error');
    expect(f.length).toBe(1);
    expect(f[0].measured).toBeCloseTo(3, 3);
    // 3.175 + 0.1 rounded up to 0.1 mm; the largest common bit not above 3 mm.
    expect(f[0].message).toMatch(/slot width 3\.00 mm is below the 3\.175 mm tool diameter; widen the slot to 3\.3 mm or use a 3 mm bit/);
  });
});
