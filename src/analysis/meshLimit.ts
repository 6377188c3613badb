import { lengthOf, partArea, type Part } from '../geometry/index.js';

/**
 * Mesh nodes of one model `modes` solves at most (one part, or the assembled frame). The default mesh
 * of a demo frame plate has 1,100–1,400 nodes (about 8,000 degrees of freedom); the solver's time grows
 * a little faster than the node count (measured: 15,000 DOF 6.6 s, 56,000 DOF 34 s on the 2-core
 * machine shared with other work), so beyond this a run takes minutes and is refused instead.
 */
export const MAX_MESH_NODES = 20_000;

/** Boundary pieces per full turn of an arc in the mesh (as `meshPart` divides arcs). */
const PIECES_PER_TURN = 12;

/**
 * Nodes `meshPart` will make for a part at element size sizeMm, estimated without meshing: one per
 * boundary piece (each line and arc cut into pieces no longer than the size, arcs into at least 12
 * per turn) plus the interior lattice (one node per equilateral cell of the size). Cheap: linear in
 * the part's segments.
 */
export function meshNodeEstimate(part: Pick<Part, 'outline' | 'features'>, sizeMm: number): number {
  let boundary = 0;
  for (const loop of [part.outline, ...part.features.map((f) => f.loop)]) {
    for (const s of loop) {
      const n = Math.max(1, Math.ceil(lengthOf(s) / sizeMm - 1e-9));
      boundary += s.kind === 'arc' ? Math.max(n, Math.ceil((Math.abs(s.sweepRad) / (2 * Math.PI)) * PIECES_PER_TURN - 1e-9)) : n;
    }
  }
  const interior = Math.abs(partArea(part as Part)) / (sizeMm * sizeMm * (Math.sqrt(3) / 2));
  return Math.round(boundary + interior);
}

/**
 * Refuse a run with a model whose mesh would exceed MAX_MESH_NODES, before any mesh is made: each
 * part's own model, and with `assembled` the whole frame (every placed copy of every part).
 * @param sizeOf the element size each part will be meshed at, mm
 * @throws RangeError naming the model, its node count, the limit and what to change
 */
export function refuseLargeMeshes(parts: readonly Part[], sizeOf: (p: Part) => number, assembled = false): void {
  const advice = 'analyse one part (--part), use a coarser --mesh-size, or drop holes that do not change the stiffness';
  for (const p of parts) {
    const n = meshNodeEstimate(p, sizeOf(p));
    if (n > MAX_MESH_NODES) throw new RangeError(`the mesh of ${p.name} would have about ${n} nodes (${p.features.length} holes), more than the ${MAX_MESH_NODES} of one model; ${advice}`);
  }
  if (!assembled) return;
  const total = parts.reduce((a, p) => a + Math.max(1, p.placements.length) * meshNodeEstimate(p, sizeOf(p)), 0);
  if (total > MAX_MESH_NODES) throw new RangeError(`the assembled frame's mesh would have about ${total} nodes, more than the ${MAX_MESH_NODES} of one model; ${advice}`);
}
