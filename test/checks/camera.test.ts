import { rng } from '../helpers/random.js';
import { describe, expect, it } from 'vitest';
import { buildFrame } from '../../src/geometry/index.js';
import { validateDesign } from '../../src/params/index.js';
import { cameraViewRule, checkFrame, checkOptions, discViewMargin, optionsForDesign, propDiscs, smallestHiding, type CameraPose } from '../../src/checks/index.js';
import { cameraFixes, type CameraChange } from '../../src/checks/props.js';
import { designWith } from '../helpers/demo.js';

const rad = (d: number): number => (d * Math.PI) / 180;

describe('props in the camera view (pinhole model), cases computed by hand', () => {
  // Camera 10 mm above the prop plane, level, 120° × 60°. The lower edge of the view is 30° below
  // horizontal, so it meets the prop plane at x = 10 / tan 30° = 17.3205 mm ahead of the camera.
  const level: CameraPose = { eyeMm: [0, 0, 10], uptiltRad: 0, hFovRad: rad(120), vFovRad: rad(60) };
  const edge = 10 / Math.tan(rad(30));

  it('a prop behind the camera whose tip lies exactly on the lower edge of the view', () => {
    const R = 50 + edge; // disc centred 50 mm behind: its front tip is at x = 17.3205
    expect(discViewMargin(level, { id: 't', centerMm: [-50, 0], radiusMm: R, zMm: 0 })).toBeCloseTo(0, 9);
    expect(discViewMargin(level, { id: 't', centerMm: [-50, 0], radiusMm: R - 0.01, zMm: 0 })).toBeCloseTo(0.01, 9);
    expect(discViewMargin(level, { id: 't', centerMm: [-50, 0], radiusMm: R + 0.01, zMm: 0 })).toBeCloseTo(-0.01, 9);
  });

  it('with 10° uptilt the edge moves out to 10 / tan 20° = 27.4748 mm', () => {
    const up: CameraPose = { ...level, uptiltRad: rad(10) };
    expect(discViewMargin(up, { id: 't', centerMm: [-50, 0], radiusMm: 50 + 10 / Math.tan(rad(20)), zMm: 0 })).toBeCloseTo(0, 9);
  });

  it('a tip on the side edge: eye in the prop plane, 90° horizontal field, edge y = x', () => {
    const side: CameraPose = { eyeMm: [0, 0, 5], uptiltRad: 0, hFovRad: rad(90), vFovRad: rad(60) };
    // Disc at (0, 100): its distance to the line y = x is 100/√2 = 70.7107, met at (50, 50), inside the ray.
    expect(discViewMargin(side, { id: 's', centerMm: [0, 100], radiusMm: 100 / Math.SQRT2, zMm: 5 })).toBeCloseTo(0, 9);
    expect(discViewMargin(side, { id: 's', centerMm: [0, 100], radiusMm: 70, zMm: 5 })).toBeCloseTo(100 / Math.SQRT2 - 70, 9);
  });

  it('smallest forward position that hides the prop: edge at x_eye + 17.3205 beyond the tip at −50 + 70', () => {
    const margin = (x: number) => discViewMargin({ ...level, eyeMm: [x, 0, 10] }, { id: 't', centerMm: [-50, 0], radiusMm: 70, zMm: 0 });
    // Hidden when x + 17.3205 > 20, i.e. x > 2.6795.
    expect(smallestHiding(margin, -30, 80, 0.5)!).toBeCloseTo(20 - edge, 3);
  });
});

describe('camera-view rule on a design', () => {
  it('the suggested forward offset hides every prop, and 0.5 mm less does not', () => {
    const raw = designWith('tessel-5.yaml', {});
    const frame = buildFrame(validateDesign(raw));
    const o = optionsForDesign(frame.design);
    const f = cameraViewRule(frame, o, propDiscs(frame));
    expect(f.filter((x) => x.severity === 'warning').length).toBe(2); // both front props show at the demo setting
    // The fix in each warning names the smallest forward offset that hides both.
    const off = Number(/camera\.forwardOffsetMm ([0-9.]+) mm/.exec(f[0].message)![1]);
    const at = (offset: number) => {
      const fr = buildFrame(validateDesign(designWith('tessel-5.yaml', { camera: { forwardOffsetMm: offset } })));
      return cameraViewRule(fr, optionsForDesign(fr.design), propDiscs(fr)).filter((x) => x.severity === 'warning').length;
    };
    expect(at(off + 0.01)).toBe(0);
    expect(at(off - 0.5)).toBeGreaterThan(0);
  });

  it('every advised change hides every prop when re-checked at the printed value; slightly short of it does not; smallest first', () => {
    // Pivot 30 mm up, 40° uptilt: uptilt, lens, pivot height and forward offset each clear on their own.
    const camera = { pivotHeightMm: 30, uptiltDeg: 40 };
    const warnings = (change: CameraChange) => {
      const fr = buildFrame(validateDesign(designWith('tessel-5.yaml', { camera: { ...camera, ...change } })));
      return cameraViewRule(fr, optionsForDesign(fr.design), propDiscs(fr)).filter((x) => x.severity === 'warning');
    };
    const frame = buildFrame(validateDesign(designWith('tessel-5.yaml', { camera })));
    const fixes = cameraFixes(frame, optionsForDesign(frame.design), propDiscs(frame));
    expect(fixes.map((f) => Object.keys(f.change).join('+')).sort()).toEqual(['forwardOffsetMm', 'horizontalFovDeg+verticalFovDeg', 'pivotHeightMm', 'uptiltDeg']);
    const found = warnings({});
    expect(found.length).toBeGreaterThan(0);
    // The message lists them in the same order, each with its parameter path and the printed value.
    const listed = fixes.map((f) => found[0].message.indexOf(f.text));
    expect(listed.every((i) => i > 0)).toBe(true);
    expect([...listed].sort((a, b) => a - b)).toEqual(listed);
    for (let i = 1; i < fixes.length; i++) expect(fixes[i].fraction).toBeGreaterThanOrEqual(fixes[i - 1].fraction);
    const now: Record<string, number> = { forwardOffsetMm: 16, pivotHeightMm: 30, uptiltDeg: 40, horizontalFovDeg: 120, verticalFovDeg: 90 };
    for (const f of fixes) {
      for (const [k, v] of Object.entries(f.change)) expect(f.text, k).toContain(`camera.${k} ${v.toFixed(2)}`);
      expect(warnings(f.change), f.text).toEqual([]);
      // Short of it: half a step (0.5 mm, 0.25°, 0.5° of field) back towards the design's value.
      const back = Object.fromEntries(Object.entries(f.change).map(([k, v]) => [k, v - Math.sign(v - now[k]) * (k === 'uptiltDeg' ? 0.25 : 0.5)]));
      expect(warnings(back).length, `${f.text}, short: ${JSON.stringify(back)}`).toBeGreaterThan(0);
    }
  });

  it('limits from the checks section change the field of view', () => {
    const frame = buildFrame(validateDesign(designWith('tessel-5.yaml', { checks: { 'camera-view': { horizontalFovDeg: 40, verticalFovDeg: 20 } } })));
    expect(checkFrame(frame).findings.filter((x) => x.rule === 'camera-view')).toEqual([]);
    expect(checkOptions().limits['camera-view'].horizontalFovDeg).toBeUndefined();
  });
});

describe('view margin against sampling the disc through a projection (seeded)', () => {
  /** Is a point seen: rotate into camera axes (pitch by the uptilt) and project onto the image plane. */
  function seen(pose: CameraPose, p: readonly [number, number, number]): boolean {
    const d = [p[0] - pose.eyeMm[0], p[1] - pose.eyeMm[1], p[2] - pose.eyeMm[2]];
    const c = Math.cos(pose.uptiltRad);
    const s = Math.sin(pose.uptiltRad);
    const depth = c * d[0] + s * d[2];
    const up = -s * d[0] + c * d[2];
    if (depth <= 0) return false;
    return Math.abs(d[1] / depth) <= Math.tan(pose.hFovRad / 2) && Math.abs(up / depth) <= Math.tan(pose.vFovRad / 2);
  }
  it('agrees on visibility wherever the margin is clear of the sampling error', () => {
    const r = rng(3);
    let checked = 0;
    for (let k = 0; k < 150; k++) {
      const pose: CameraPose = { eyeMm: [r() * 60, r() * 10 - 5, 5 + r() * 20], uptiltRad: rad(r() * 60 - 10), hFovRad: rad(60 + r() * 100), vFovRad: rad(40 + r() * 80) };
      const disc = { id: 'd', centerMm: [r() * 300 - 150, r() * 300 - 150] as const, radiusMm: 20 + r() * 70, zMm: r() * 30 };
      const m = discViewMargin(pose, disc);
      if (Math.abs(m) < 1) continue; // within a millimetre of the boundary the sampling below cannot decide
      let any = false;
      for (let i = 0; i <= 60 && !any; i++) {
        for (let j = 0; j < 120 && !any; j++) {
          const rr = (disc.radiusMm * i) / 60;
          const a = (2 * Math.PI * j) / 120;
          any = seen(pose, [disc.centerMm[0] + rr * Math.cos(a), disc.centerMm[1] + rr * Math.sin(a), disc.zMm]);
        }
      }
      expect(any, `case ${k}, margin ${m}`).toBe(m <= 0);
      checked++;
    }
    expect(checked).toBeGreaterThan(100);
  });
});
