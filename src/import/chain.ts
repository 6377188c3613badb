import type { Finding } from '../checks/types.js';
import { endOf, line, reverseSegment, startOf } from '../geometry/segment.js';
import { CHAIN_GAP_MM } from '../geometry/tolerance.js';
import type { Loop, Segment, Vec2 } from '../geometry/types.js';
import { dist } from '../geometry/vec.js';
import type { DrawnSegment, SourceRef } from './explode.js';
import { PointGrid } from './spatial.js';

/** A closed chain of drawn segments, with the source of its first segment for messages. */
export type ChainedLoop = Readonly<{ loop: Loop; source: SourceRef }>;

export type ChainResult = Readonly<{ loops: ChainedLoop[]; findings: Finding[] }>;

/**
 * Join segments end to end into closed loops: ends closer than gapTolMm are the same point (found
 * through a grid, so 10,000 segments take milliseconds). Where joined ends differ, a line is
 * stretched to meet its neighbour (or a short bridging line is added between two arcs) so that
 * every loop is closed to CHAIN_GAP_MM. Chains that do not close are reported with their gap;
 * points where three or more ends meet are reported as branches.
 */
export function chainLoops(segs: readonly DrawnSegment[], gapTolMm: number): ChainResult {
  const findings: Finding[] = [];
  const n = segs.length;
  // End k of segment i is endpoint 2i + k.
  const pts: Vec2[] = [];
  for (const d of segs) pts.push(startOf(d.seg), endOf(d.seg));
  const parent = pts.map((_, i) => i);
  const find = (i: number): number => {
    while (parent[i] !== i) {
      parent[i] = parent[parent[i]];
      i = parent[i];
    }
    return i;
  };
  const grid = new PointGrid(Math.max(gapTolMm, 1e-9));
  // Only representatives go into the grid: an end within the tolerance of one joins its cluster.
  // Representatives lie more than the tolerance apart, so a 3 × 3 query sees a handful at most.
  pts.forEach((p, i) => {
    let joined = false;
    for (const j of grid.near(p)) {
      if (dist(p, pts[j]) <= gapTolMm) {
        const a = find(i);
        const b = find(j);
        if (a !== b) parent[Math.max(a, b)] = Math.min(a, b);
        joined = true;
      }
    }
    if (!joined) grid.add(i, p);
  });
  const node = pts.map((_, i) => find(i));
  const atNode = new Map<number, number[]>();
  node.forEach((nd, ep) => {
    const l = atNode.get(nd);
    if (l) l.push(ep);
    else atNode.set(nd, [ep]);
  });
  const reported = new Set<number>();
  const branches: Vec2[] = [];
  for (const [nd, eps] of atNode) {
    if (eps.length > 2 && !reported.has(nd)) {
      reported.add(nd);
      branches.push(pts[nd]);
    }
  }
  if (branches.length) {
    findings.push({
      rule: 'dxf-branching-contour',
      severity: 'error',
      part: '',
      measured: branches.length,
      limit: null,
      unit: 'points',
      atMm: [branches[0][0], branches[0][1]],
      message: `${branches.length} point${branches.length === 1 ? '' : 's'} where three or more segment ends meet (first at ${fmtPt(branches[0])}); a cut contour must pass each point once. Remove the stray segment or split the shape`,
    });
  }

  const used = new Array<boolean>(n).fill(false);
  const loops: ChainedLoop[] = [];
  const open: Array<{ start: Vec2; end: Vec2; count: number; source: SourceRef }> = [];
  /** Next unused segment touching the node; returns it oriented to leave the node. */
  const next = (nd: number): { i: number; seg: Segment } | null => {
    for (const ep of atNode.get(nd) ?? []) {
      const i = ep >> 1;
      if (used[i]) continue;
      used[i] = true;
      return { i, seg: ep & 1 ? reverseSegment(segs[i].seg) : segs[i].seg };
    }
    return null;
  };
  for (let i0 = 0; i0 < n; i0++) {
    if (used[i0]) continue;
    used[i0] = true;
    const fwd: Segment[] = [segs[i0].seg];
    const startNode = node[2 * i0];
    let endNode = node[2 * i0 + 1];
    let closed = endNode === startNode;
    while (!closed) {
      const nx = next(endNode);
      if (!nx) break;
      fwd.push(nx.seg);
      endNode = node[2 * nx.i + (nx.seg === segs[nx.i].seg ? 1 : 0)];
      closed = endNode === startNode;
    }
    if (closed) {
      loops.push({ loop: closeGaps(fwd, findings), source: segs[i0].source });
      continue;
    }
    // Open so far: extend backwards from the first segment's start to find the whole chain.
    const back: Segment[] = [];
    let headNode = startNode;
    for (;;) {
      const nx = next(headNode);
      if (!nx) break;
      back.push(reverseSegment(nx.seg));
      headNode = node[2 * nx.i + (nx.seg === segs[nx.i].seg ? 1 : 0)];
    }
    const chain = [...back.reverse(), ...fwd];
    open.push({ start: startOf(chain[0]), end: endOf(chain[chain.length - 1]), count: chain.length, source: segs[i0].source });
  }
  for (const o of open) {
    const gap = dist(o.start, o.end);
    let nearest: { d: number; p: Vec2 } | null = null;
    if (open.length <= 2000) {
      for (const other of open) {
        if (other === o) continue;
        for (const q of [other.start, other.end]) {
          for (const p of [o.start, o.end]) {
            const d = dist(p, q);
            if (!nearest || d < nearest.d) nearest = { d, p: q };
          }
        }
      }
    }
    const hint = nearest && nearest.d < gap ? `; the nearest loose end of another contour is ${nearest.d.toFixed(3)} mm away at ${fmtPt(nearest.p)}` : '';
    findings.push({
      rule: 'dxf-open-contour',
      severity: 'error',
      part: '',
      measured: gap,
      limit: gapTolMm,
      unit: 'mm',
      atMm: [o.end[0], o.end[1]],
      message: `open contour of ${o.count} segment${o.count === 1 ? '' : 's'} (layer ${o.source.layer}, from ${o.source.entity} line ${o.source.line}): its ends at ${fmtPt(o.start)} and ${fmtPt(o.end)} are ${gap.toFixed(3)} mm apart${hint}. It is not cut as a closed shape; close it in the drawing`,
    });
  }
  return { loops, findings };
}

/** Make consecutive segments meet exactly where their ends were joined within the gap tolerance. */
function closeGaps(chain: Segment[], findings: Finding[]): Loop {
  const out: Segment[] = [...chain];
  let worst = 0;
  let worstAt: Vec2 = startOf(out[0]);
  const bridges: Array<{ after: number; seg: Segment }> = [];
  for (let k = 0; k < out.length; k++) {
    const a = out[k];
    const nk = (k + 1) % out.length;
    const b = out[nk];
    const e = endOf(a);
    const s = startOf(b);
    const g = dist(e, s);
    if (g === 0) continue;
    if (g > worst) {
      worst = g;
      worstAt = e;
    }
    if (g <= CHAIN_GAP_MM * 1e-3) continue;
    if (a.kind === 'line' && a !== b) out[k] = line(a.start, s);
    else if (b.kind === 'line' && a !== b) out[nk] = line(e, b.end);
    else if (g > CHAIN_GAP_MM) bridges.push({ after: k, seg: line(e, s) });
  }
  for (const br of bridges.reverse()) out.splice(br.after + 1, 0, br.seg);
  if (worst > CHAIN_GAP_MM) {
    findings.push({
      rule: 'dxf-gap-closed',
      severity: 'info',
      part: '',
      measured: worst,
      limit: null,
      unit: 'mm',
      atMm: [worstAt[0], worstAt[1]],
      message: `ends up to ${worst.toFixed(4)} mm apart near ${fmtPt(worstAt)} were joined to close a contour; snap them in the drawing if the cutter's importer is stricter`,
    });
  }
  return out;
}

const fmtPt = (p: Vec2): string => `(${p[0].toFixed(3)}, ${p[1].toFixed(3)}) mm`;
