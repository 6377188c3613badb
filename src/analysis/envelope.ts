/**
 * Symmetric sparse matrices in envelope (variable-band, "skyline" by rows) storage and their
 * Cholesky factors. Row i holds columns first[i]..i contiguously, so the inner products of the
 * factorisation run over plain array slices. Renumbering the unknowns by reverse Cuthill–McKee
 * (see `reverseCuthillMcKee`) keeps the envelope narrow for plate meshes.
 */
export class Envelope {
  readonly n: number;
  readonly first: Int32Array;
  /** Offset of the diagonal entry of row i in `val`. */
  readonly diag: Int32Array;
  readonly val: Float64Array;

  /** @param first first stored column of each row (first[i] ≤ i) */
  constructor(first: Int32Array, val?: Float64Array) {
    this.n = first.length;
    this.first = first;
    this.diag = new Int32Array(this.n);
    let off = 0;
    for (let i = 0; i < this.n; i++) {
      if (first[i] > i || first[i] < 0) throw new RangeError(`envelope row ${i} starts at column ${first[i]}`);
      off += i - first[i];
      this.diag[i] = off;
      off += 1;
    }
    this.val = val ?? new Float64Array(off);
  }

  /** Number of stored entries (the envelope size). */
  get size(): number {
    return this.val.length;
  }

  /** Add v to entry (i, j) and, by symmetry, (j, i). */
  add(i: number, j: number, v: number): void {
    if (j > i) [i, j] = [j, i];
    const k = this.diag[i] - (i - j);
    if (j < this.first[i]) throw new RangeError(`entry (${i}, ${j}) lies outside the envelope`);
    this.val[k] += v;
  }

  get(i: number, j: number): number {
    if (j > i) [i, j] = [j, i];
    return j < this.first[i] ? 0 : this.val[this.diag[i] - (i - j)];
  }

  /** y = A x. */
  multiply(x: Float64Array, y = new Float64Array(this.n)): Float64Array {
    y.fill(0);
    const { first, diag, val } = this;
    for (let i = 0; i < this.n; i++) {
      const d = diag[i];
      const f = first[i];
      let s = val[d] * x[i];
      const xi = x[i];
      for (let j = f, k = d - (i - f); j < i; j++, k++) {
        s += val[k] * x[j];
        y[j] += val[k] * xi;
      }
      y[i] += s;
    }
    return y;
  }

  /** A copy with `shift[i]` added to each diagonal entry (used for K − σM with a lumped M). */
  withDiagonal(shift: Float64Array, factor: number): Envelope {
    const c = new Envelope(this.first, new Float64Array(this.val));
    for (let i = 0; i < this.n; i++) c.val[c.diag[i]] += factor * shift[i];
    return c;
  }
}

/** The matrix was not positive definite: a mechanism (unrestrained part) or a wrong shift. */
export class NotPositiveDefiniteError extends Error {
  constructor(readonly row: number) {
    super(`matrix is not positive definite (pivot ${row})`);
  }
}

/** Cholesky factor L (A = L Lᵀ) in the same envelope, computed in place on a copy. */
export function cholesky(a: Envelope): Envelope {
  const l = new Envelope(a.first, new Float64Array(a.val));
  const { first, diag, val } = l;
  for (let i = 0; i < l.n; i++) {
    const fi = first[i];
    const rowStart = diag[i] - (i - fi);
    for (let j = fi; j < i; j++) {
      const fj = first[j];
      const k0 = Math.max(fi, fj);
      let s = val[rowStart + (j - fi)];
      let pi = rowStart + (k0 - fi);
      let pj = diag[j] - (j - k0);
      for (let k = k0; k < j; k++) s -= val[pi++] * val[pj++];
      val[rowStart + (j - fi)] = s / val[diag[j]];
    }
    let s = val[diag[i]];
    for (let p = rowStart; p < diag[i]; p++) s -= val[p] * val[p];
    if (!(s > 0)) throw new NotPositiveDefiniteError(i);
    val[diag[i]] = Math.sqrt(s);
  }
  return l;
}

/** Solve L Lᵀ x = b with a factor from `cholesky`; b is left untouched. */
export function choleskySolve(l: Envelope, b: Float64Array, x = new Float64Array(l.n)): Float64Array {
  const { first, diag, val, n } = l;
  x.set(b);
  for (let i = 0; i < n; i++) {
    let s = x[i];
    for (let j = first[i], k = diag[i] - (i - first[i]); j < i; j++, k++) s -= val[k] * x[j];
    x[i] = s / val[diag[i]];
  }
  for (let i = n - 1; i >= 0; i--) {
    const xi = (x[i] /= val[diag[i]]);
    for (let j = first[i], k = diag[i] - (i - first[i]); j < i; j++, k++) x[j] -= val[k] * xi;
  }
  return x;
}

/**
 * Reverse Cuthill–McKee ordering of an undirected graph (adjacency lists). Each connected part
 * starts from a pseudo-peripheral vertex found by repeated breadth-first search; neighbours are
 * visited by increasing degree, ties by index, so the result is deterministic.
 * @returns order[k] = the vertex placed at position k
 */
export function reverseCuthillMcKee(adj: readonly (readonly number[])[]): Int32Array {
  const n = adj.length;
  const seen = new Uint8Array(n);
  const order: number[] = [];
  const deg = (v: number) => adj[v].length;
  const bfsLevels = (start: number): number[][] => {
    const lvl = new Int32Array(n).fill(-1);
    lvl[start] = 0;
    const levels: number[][] = [[start]];
    for (;;) {
      const next: number[] = [];
      for (const v of levels[levels.length - 1]) for (const w of adj[v]) if (lvl[w] < 0 && !seen[w]) {
        lvl[w] = levels.length;
        next.push(w);
      }
      if (!next.length) return levels;
      levels.push(next);
    }
  };
  for (let s = 0; s < n; s++) {
    if (seen[s]) continue;
    let root = s;
    let depth = -1;
    for (let it = 0; it < 5; it++) {
      const lv = bfsLevels(root);
      if (lv.length <= depth) break;
      depth = lv.length;
      const last = lv[lv.length - 1];
      root = last.reduce((best, v) => (deg(v) < deg(best) || (deg(v) === deg(best) && v < best) ? v : best), last[0]);
    }
    const queue = [root];
    seen[root] = 1;
    for (let h = 0; h < queue.length; h++) {
      const v = queue[h];
      order.push(v);
      const nb = adj[v].filter((w) => !seen[w]).sort((a, b) => deg(a) - deg(b) || a - b);
      for (const w of nb) {
        seen[w] = 1;
        queue.push(w);
      }
    }
  }
  return Int32Array.from(order.reverse());
}
