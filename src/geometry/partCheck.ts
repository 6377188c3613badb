import type { DesignIssue } from '../params/errors.js';
import { withArticle } from '../params/words.js';
import { featureLabel } from './part.js';
import type { SourcedFeature } from './holes.js';
import { isInside } from './inside.js';
import { intersectSegments } from './intersect.js';
import { loopBBox, signedArea } from './loop.js';
import { startOf, segmentBBox } from './segment.js';
import { COINCIDENT_MM } from './tolerance.js';
import type { BBox, Loop } from './types.js';
import { loopProblem } from './validate.js';

type Buildable = Readonly<{ name: string; outline: Loop; features: readonly SourcedFeature[]; sourcePath: string }>;

/**
 * Problems that make a freshly built part uncuttable, each naming the design parameter behind it:
 * an outline or inner contour that is open or crosses itself, a hole that reaches outside the
 * outline, two inner contours that touch or overlap.
 */
export function checkPartGeometry(p: Buildable): DesignIssue[] {
  const issues: DesignIssue[] = [];
  const op = loopProblem(p.outline);
  if (op) issues.push({ path: p.sourcePath, value: p.name, message: `gives an outline that is not a simple closed contour (${op.kind}: ${op.detail} at ${fmt(op.at)})` });
  if (signedArea(p.outline) <= 0) issues.push({ path: p.sourcePath, value: p.name, message: 'gives an outline that is not counter-clockwise' });
  const boxes = p.features.map((f) => loopBBox(f.loop));
  const outlineBoxes = p.outline.map(segmentBBox);
  const segBoxes = p.features.map((f) => f.loop.map(segmentBBox));
  p.features.forEach((f, i) => {
    const fp = loopProblem(f.loop);
    if (fp) issues.push({ path: f.sourcePath, value: p.name, message: `gives ${withArticle(featureLabel(f))} contour that is not simple (${fp.kind} at ${fmt(fp.at)})` });
    if (signedArea(f.loop) >= 0) issues.push({ path: f.sourcePath, value: p.name, message: `gives ${withArticle(featureLabel(f))} contour that is not clockwise` });
    if (crosses(f.loop, p.outline, outlineBoxes) || !isInside(p.outline, startOf(f.loop[0]))) {
      issues.push({ path: f.sourcePath, value: p.name, message: `puts ${withArticle(featureLabel(f))} at ${fmt(startOf(f.loop[0]))} that reaches outside the ${p.name} outline` });
    }
    for (let j = i + 1; j < p.features.length; j++) {
      const a = boxes[i];
      const b = boxes[j];
      if (a[0] > b[2] || b[0] > a[2] || a[1] > b[3] || b[1] > a[3]) continue;
      const g = p.features[j];
      if (crosses(f.loop, g.loop, segBoxes[j]) || isInside(g.loop, startOf(f.loop[0])) || isInside(f.loop, startOf(g.loop[0]))) {
        issues.push({ path: g.sourcePath, value: p.name, message: `puts ${withArticle(featureLabel(g))} on top of ${withArticle(featureLabel(f))} (from ${f.sourcePath}) near ${fmt(startOf(g.loop[0]))}` });
      }
    }
  });
  return issues;
}

/** Does any segment of `a` meet one of `b` (whose segment boxes are `bBoxes`, computed once by the caller)? */
function crosses(a: Loop, b: Loop, bBoxes: readonly BBox[]): boolean {
  for (const s of a) {
    const sb = segmentBBox(s);
    for (const [k, t] of b.entries()) {
      const tb = bBoxes[k];
      if (sb[0] > tb[2] || tb[0] > sb[2] || sb[1] > tb[3] || tb[1] > sb[3]) continue;
      if (intersectSegments(s, t, COINCIDENT_MM).length) return true;
    }
  }
  return false;
}

const fmt = (p: readonly number[]): string => `(${p[0].toFixed(2)}, ${p[1].toFixed(2)}) mm`;
