import { checkFrame, type CheckReport } from '../checks/index.js';
import { buildFrame } from '../geometry/frame.js';
import type { Design } from '../params/design.js';
import { ceilToStep } from './layoutScale.js';
import { smallestReach } from './rootRoom.js';
import { armWidthParams, MAX_WIDTH_FACTOR, measureArms, MIN_ARM_STOCK_MM, STOCK_THICKNESSES_MM, withArmSize, type SizeRule } from './sizeRule.js';

/**
 * What a refused variant reports: the constraint it cannot meet, in numbers, and the nearest
 * changes that would meet it. `place` moves arm roots out where they need room (rootRoom.ts).
 */

type Place = (d: Design) => Design | null;

const THICKEST_STOCK_MM: number = STOCK_THICKNESSES_MM[STOCK_THICKNESSES_MM.length - 1];
/** Thickest arm plate the design schema takes. mm. */
const SCHEMA_MAX_ARM_MM = 8;

/** The design's arms at their widest allowed (MAX_WIDTH_FACTOR × its widths) and `t` thick, placed. */
const stiffest = (d: Design, t: number, place: Place): Design | null => place(withArmSize(d, armWidthParams(d).map((p) => Math.min(p.maxMm, MAX_WIDTH_FACTOR * p.value)), t));

/** The size rule and what the stiffest allowed arm reaches against it. */
export function armRuleConstraint(d: Design, rule: SizeRule, place: Place): string {
  const placed = stiffest(d, THICKEST_STOCK_MM, place);
  const reach = placed ? measureArms(placed, rule) : null;
  const narrowest = place(withArmSize(d, armWidthParams(d).map((p) => Math.max(p.minMm, p.strut ? MIN_ARM_STOCK_MM : 0)), MIN_ARM_STOCK_MM));
  const what = reach
    ? `the stiffest allowed arm (${THICKEST_STOCK_MM} mm, widths ${MAX_WIDTH_FACTOR} × the source's) reaches f1 ${reach.frequencyHz.toFixed(1)} Hz and deflects ${reach.deflectionMm.toFixed(3)} mm (allowed ${reach.allowedDeflectionMm.toFixed(3)} mm)`
    : narrowest
      ? `the widest allowed arm roots (${MAX_WIDTH_FACTOR} × the source's) do not fit beside each other and the standoffs, and the narrower ones that fit fall short`
      : 'even the narrowest arm roots do not fit beside each other, the standoffs and the braces within 60 % of the way to the motors';
  return `the arm size rule (f1 ≥ ${rule.requiredHz.toFixed(1)} Hz and tip deflection ≤ ${(100 * rule.allowedDeflectionRatio).toFixed(2)} % of the free length): ${what}`;
}

/** Changes that would meet the rule when no stocked section does: a thicker plate, or the clamp further out. */
export function armRuleAlternatives(d: Design, rule: SizeRule, place: Place): string[] {
  const out: string[] = [];
  const meets = (t: number, dd: Design = d) => {
    const placed = stiffest(dd, t, place);
    return placed !== null && measureArms(placed, rule).met;
  };
  if (meets(SCHEMA_MAX_ARM_MM)) {
    let lo = THICKEST_STOCK_MM;
    let hi = SCHEMA_MAX_ARM_MM;
    for (let i = 0; i < 30; i++) {
      const mid = (lo + hi) / 2;
      if (meets(mid)) hi = mid;
      else lo = mid;
    }
    out.push(`arms of ${ceilToStep(hi, 0.1)} mm plate at ${MAX_WIDTH_FACTOR} × the source's widths (thicker than the stocked ${THICKEST_STOCK_MM} mm)`);
  }
  const a = d.arms;
  if (a.construction === 'separate') {
    // Any clamp that still leaves the root block and a little free arm before the motor.
    const reach = smallestReach(d, 1, (moved) => meets(THICKEST_STOCK_MM, moved), 2 * a.root.edgeMarginMm);
    if (reach !== null) out.push(`arms clamped further out: arms.root.reachMm ${reach} mm (the body's arm pads and braces grow with it)`);
  }
  return out;
}

/** 'fix the source first' when the source design itself has check errors. */
export function sourceErrorHint(source: Design): string[] {
  const n = checkFrame(buildFrame(source)).summary.errors;
  return n ? [`fix the source design first (\`framewright check\` finds ${n} error${n === 1 ? '' : 's'} there)`] : [];
}

/** Changes that would clear the check errors of the closest attempt. */
export function checkAlternatives(source: Design, report: CheckReport | null, wheelbaseAlternative: string | null): string[] {
  const out: string[] = [];
  if (report) {
    const errors = (r: CheckReport) => r.findings.filter((f) => f.severity === 'error').map((f) => `${f.rule} ${f.part}`);
    const inSource = new Set(errors(checkFrame(buildFrame(source))));
    if (errors(report).some((k) => inSource.has(k))) out.push('fix the source design first (`framewright check` finds the same errors there)');
  }
  if (wheelbaseAlternative) out.push(wheelbaseAlternative);
  return out;
}
