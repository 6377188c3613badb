import { cholesky, choleskySolveInPlace, type CholeskyFactor, type SparseSymmetric } from './sparse.js';

/**
 * Eigen-decomposition of a small dense symmetric matrix (row-major n×n): Householder reduction to
 * tridiagonal form, then the implicit QL iteration with Wilkinson shifts (the method of the
 * Handbook for Automatic Computation, vol. II, Wilkinson & Reinsch 1971, written anew here).
 * @returns eigenvalues ascending and the eigenvectors as the columns of `vectors` (row-major n×n)
 */
export function symmetricEigen(a0: Float64Array, n: number): { values: Float64Array; vectors: Float64Array } {
  const z = Float64Array.from(a0);
  const d = new Float64Array(n);
  const e = new Float64Array(n);
  // Householder tridiagonalisation; z accumulates the orthogonal transform.
  for (let i = n - 1; i > 0; i--) {
    const l = i - 1;
    let h = 0;
    let scale = 0;
    if (l > 0) {
      for (let k = 0; k <= l; k++) scale += Math.abs(z[i * n + k]);
      if (scale === 0) e[i] = z[i * n + l];
      else {
        for (let k = 0; k <= l; k++) {
          z[i * n + k] /= scale;
          h += z[i * n + k] * z[i * n + k];
        }
        const f = z[i * n + l];
        const g = f >= 0 ? -Math.sqrt(h) : Math.sqrt(h);
        e[i] = scale * g;
        h -= f * g;
        z[i * n + l] = f - g;
        let ff = 0;
        for (let j = 0; j <= l; j++) {
          z[j * n + i] = z[i * n + j] / h;
          let gg = 0;
          for (let k = 0; k <= j; k++) gg += z[j * n + k] * z[i * n + k];
          for (let k = j + 1; k <= l; k++) gg += z[k * n + j] * z[i * n + k];
          e[j] = gg / h;
          ff += e[j] * z[i * n + j];
        }
        const hh = ff / (h + h);
        for (let j = 0; j <= l; j++) {
          const fj = z[i * n + j];
          const gj = (e[j] -= hh * fj);
          for (let k = 0; k <= j; k++) z[j * n + k] -= fj * e[k] + gj * z[i * n + k];
        }
      }
    } else e[i] = z[i * n + l];
    d[i] = h;
  }
  d[0] = 0;
  e[0] = 0;
  for (let i = 0; i < n; i++) {
    const l = i - 1;
    if (d[i] !== 0) {
      for (let j = 0; j <= l; j++) {
        let g = 0;
        for (let k = 0; k <= l; k++) g += z[i * n + k] * z[k * n + j];
        for (let k = 0; k <= l; k++) z[k * n + j] -= g * z[k * n + i];
      }
    }
    d[i] = z[i * n + i];
    z[i * n + i] = 1;
    for (let j = 0; j <= l; j++) z[j * n + i] = z[i * n + j] = 0;
  }
  // Implicit QL on the tridiagonal (d, e).
  for (let i = 1; i < n; i++) e[i - 1] = e[i];
  e[n - 1] = 0;
  for (let l = 0; l < n; l++) {
    let iter = 0;
    for (;;) {
      let m = l;
      for (; m < n - 1; m++) {
        const dd = Math.abs(d[m]) + Math.abs(d[m + 1]);
        if (Math.abs(e[m]) <= Number.EPSILON * dd) break;
      }
      if (m === l) break;
      if (++iter > 60) throw new Error('symmetric eigen-decomposition did not converge');
      let g = (d[l + 1] - d[l]) / (2 * e[l]);
      let r = Math.hypot(g, 1);
      g = d[m] - d[l] + e[l] / (g + (g >= 0 ? Math.abs(r) : -Math.abs(r)));
      let s = 1;
      let c = 1;
      let p = 0;
      let i = m - 1;
      for (; i >= l; i--) {
        let f = s * e[i];
        const b = c * e[i];
        r = Math.hypot(f, g);
        e[i + 1] = r;
        if (r === 0) {
          d[i + 1] -= p;
          e[m] = 0;
          break;
        }
        s = f / r;
        c = g / r;
        g = d[i + 1] - p;
        r = (d[i] - g) * s + 2 * c * b;
        p = s * r;
        d[i + 1] = g + p;
        g = c * r - b;
        for (let k = 0; k < n; k++) {
          f = z[k * n + i + 1];
          z[k * n + i + 1] = s * z[k * n + i] + c * f;
          z[k * n + i] = c * z[k * n + i] - s * f;
        }
      }
      if (r === 0 && i >= l) continue;
      d[l] -= p;
      e[l] = g;
      e[m] = 0;
    }
  }
  const idx = Array.from({ length: n }, (_, i) => i).sort((x, y) => d[x] - d[y]);
  const values = Float64Array.from(idx, (i) => d[i]);
  const vectors = new Float64Array(n * n);
  for (let r = 0; r < n; r++) for (let c = 0; c < n; c++) vectors[r * n + c] = z[r * n + idx[c]];
  return { values, vectors };
}

export type EigenOptions = Readonly<{
  /** Shift σ (rad²/s²) below every wanted eigenvalue; K − σM must be positive definite. Default −(2π·10 Hz)². */
  shift?: number;
  /** Vectors per Krylov block: at least the largest multiplicity expected. Default 3. */
  blockSize?: number;
  /**
   * Known eigenvectors at λ = 0 (rigid-body motions of an unsupported model), kept out of the search:
   * every basis vector is made M-orthogonal to them. Without this, the rigid modes' large θ would
   * swamp the precision left for high elastic modes. Vectors that vanish on the active DOFs are ignored.
   */
  deflate?: readonly Float64Array[];
  /** Relative residual of the inverted operator, ‖Op x − θx‖_M / θ, accepted. Eigenvalue errors go as its square. Default 1e-3. */
  tolerance?: number;
  /** A Cholesky factor of K − σM for this shift, from an earlier call (`EigenResult.factor`), to ask for more modes without factoring again. */
  factor?: CholeskyFactor;
}>;

/** Default shift σ: −(2π · 10 Hz)², below every elastic mode of a frame part and above the rigid-body modes' zero. rad²/s². */
export const DEFAULT_SHIFT = -((2 * Math.PI * 10) ** 2);

export type EigenResult = Readonly<{
  /** Deflation vectors actually used (non-zero on the active DOFs and independent). */
  deflated: number;
  /** Eigenvalues λ = ω², ascending, rad²/s². */
  values: number[];
  /** Eigenvectors, M-normalised (xᵀMx = 1). */
  vectors: Float64Array[];
  /** Size of the Krylov basis used. */
  basisSize: number;
  /** The factor of K − σM used (pass it back in `options.factor` to ask for more modes). */
  factor: CholeskyFactor | null;
}>;

const dot = (a: Float64Array, b: Float64Array): number => {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i] * b[i];
  return s;
};

const axpy = (y: Float64Array, c: number, x: Float64Array): void => {
  for (let i = 0; i < y.length; i++) y[i] += c * x[i];
};

/**
 * Lowest eigenpairs of K x = λ M x (K, M symmetric on one sparse pattern, M positive semi-definite,
 * K − σM positive definite) by shift-invert block Lanczos with full reorthogonalisation. The basis
 * Q is grown block by block from Op = (K − σM)⁻¹M in the M-inner product. The projected operator
 * H = QᵀM·Op·Q comes for free from the Gram–Schmidt coefficients; a Ritz pair (θ, Qs) has the residual
 * ‖Op x − θx‖_M = ‖W s_last‖_M with W the last block's orthogonalised remainders, so convergence is
 * judged from vectors the iteration forms anyway. Blocks keep repeated eigenvalues (symmetric parts)
 * from being missed. Deterministic: the start block comes from a fixed-seed generator.
 * @throws NotPositiveDefiniteError when K − σM is not positive definite (a mechanism)
 */
export function lowestEigenpairs(k: SparseSymmetric, mFull: SparseSymmetric, count: number, options: EigenOptions = {}): EigenResult {
  const n = k.n;
  const m = mFull.compressed();
  const want = Math.min(count, n - (options.deflate?.length ?? 0));
  if (want <= 0) return { values: [], vectors: [], basisSize: 0, deflated: 0, factor: options.factor ?? null };
  const sigma = options.shift ?? DEFAULT_SHIFT;
  const p = Math.max(1, Math.min(options.blockSize ?? 3, n));
  const tol = options.tolerance ?? 1e-3;
  const factor = options.factor ?? cholesky(k.plus(mFull, -sigma));
  const lockedQ: Float64Array[] = [];
  const lockedMQ: Float64Array[] = [];
  const q: Float64Array[] = [];
  const mq: Float64Array[] = [];
  const z: Float64Array[] = [];
  /** Columns of H by basis index: h[j][i] = q_iᵀ M z_j for i < h[j].length. */
  const h: number[][] = [];
  const maxBasis = Math.min(n - (options.deflate?.length ?? 0), 10 * want + 10 * p + 50);
  let seed = 12345;
  const rand = () => {
    seed = (seed * 1103515245 + 12345) % 2147483648;
    return seed / 2147483648 - 0.5;
  };
  /**
   * Remove the components along the locked and basis vectors by classical Gram–Schmidt, a second pass
   * only when the first removed more than half of v's M-norm (the criterion of Daniel, Gragg, Kaufman &
   * Stewart, Math. Comp. 30, 1976: the removed part, Σc², comes from the coefficients, M-orthonormal basis).
   * @param norm0 v's M-norm before
   * @returns the first pass's basis coefficients
   */
  const orthogonalise = (v: Float64Array, norm0: number): number[] => {
    let first: number[] = [];
    for (let pass = 0; pass < 2; pass++) {
      let removed = 0;
      for (let i = 0; i < lockedQ.length; i++) {
        const c = dot(lockedMQ[i], v);
        removed += c * c;
        axpy(v, -c, lockedQ[i]);
      }
      const c = q.map((_, i) => dot(mq[i], v));
      for (let i = 0; i < q.length; i++) {
        removed += c[i] * c[i];
        axpy(v, -c[i], q[i]);
      }
      if (pass > 0) break;
      first = c;
      if (norm0 * norm0 - removed > 0.5 * norm0 * norm0) break;
    }
    return first;
  };
  /** Orthonormalise candidates among themselves (M-norm) after `orthogonalise`; returns kept vectors with M·v. */
  const normaliseBlock = (cands: Float64Array[], norms0: number[]): Array<{ v: Float64Array; mv: Float64Array }> => {
    const out: Array<{ v: Float64Array; mv: Float64Array }> = [];
    cands.forEach((v, c) => {
      for (let pass = 0; pass < 2; pass++) for (const o of out) axpy(v, -dot(o.mv, v), o.v);
      let mv = m.multiply(v);
      const norm = Math.sqrt(Math.max(dot(v, mv), 0));
      if (!(norm > 1e-10 * norms0[c])) return;
      for (let i = 0; i < n; i++) v[i] /= norm;
      for (let i = 0; i < n; i++) mv[i] /= norm;
      out.push({ v, mv });
    });
    return out;
  };
  const addToBasis = (block: Array<{ v: Float64Array; mv: Float64Array }>) => {
    const sol = choleskySolveInPlace(
      factor,
      block.map((b) => Float64Array.from(b.mv)),
    );
    block.forEach((b, i) => {
      q.push(b.v);
      mq.push(b.mv);
      z.push(sol[i]);
      h.push([]);
    });
  };
  for (const d of options.deflate ?? []) {
    const v = Float64Array.from(d);
    const norm0 = Math.sqrt(Math.max(dot(v, m.multiply(v)), 0));
    if (!(norm0 > 0)) continue;
    for (let pass = 0; pass < 2; pass++) for (let i = 0; i < lockedQ.length; i++) axpy(v, -dot(lockedMQ[i], v), lockedQ[i]);
    const mv = m.multiply(v);
    const norm = Math.sqrt(Math.max(dot(v, mv), 0));
    if (!(norm > 1e-8 * norm0)) continue;
    for (let i = 0; i < n; i++) {
      v[i] /= norm;
      mv[i] /= norm;
    }
    lockedQ.push(v);
    lockedMQ.push(mv);
  }
  const randomBlock = (): Array<{ v: Float64Array; mv: Float64Array }> => {
    const cands = Array.from({ length: p }, () => {
      const v = new Float64Array(n);
      for (let i = 0; i < n; i++) v[i] = rand();
      return v;
    });
    const norms = cands.map((v) => Math.sqrt(Math.max(dot(v, m.multiply(v)), 0)));
    cands.forEach((v, i) => orthogonalise(v, norms[i]));
    return normaliseBlock(cands, norms);
  };
  addToBasis(randomBlock());
  let last = 0;
  for (;;) {
    // Candidates: Op applied to the last block, orthogonalised against everything so far.
    const lastEnd = q.length;
    const cands: Float64Array[] = [];
    const norms0: number[] = [];
    for (let j = last; j < lastEnd; j++) {
      const v = Float64Array.from(z[j]);
      norms0.push(Math.sqrt(Math.max(dot(v, m.multiply(v)), 0)));
      h[j] = orthogonalise(v, norms0[norms0.length - 1]);
      cands.push(v);
    }
    // H over the current basis is now complete: entry (i, j) was formed when the later of the two
    // blocks was orthogonalised; pairs inside one block were formed twice and are averaged.
    const b = lastEnd;
    const hm = new Float64Array(b * b);
    const known = new Uint8Array(b * b);
    for (let j = 0; j < b; j++) {
      const col = h[j];
      for (let i = 0; i < col.length; i++) {
        hm[i * b + j] = col[i];
        known[i * b + j] = 1;
      }
    }
    for (let i = 0; i < b; i++) {
      for (let j = 0; j < i; j++) {
        const a = known[i * b + j] ? hm[i * b + j] : hm[j * b + i];
        const c = known[j * b + i] ? hm[j * b + i] : hm[i * b + j];
        hm[i * b + j] = hm[j * b + i] = 0.5 * (a + c);
      }
    }
    const { values, vectors } = symmetricEigen(hm, b);
    // Largest θ of the inverted operator ↔ eigenvalues closest above the shift.
    const ritz: Array<{ theta: number; s: Float64Array }> = [];
    for (let c = b - 1; c >= 0 && ritz.length < want; c--) {
      if (!(values[c] > 0)) break;
      ritz.push({ theta: values[c], s: Float64Array.from({ length: b }, (_, r) => vectors[r * b + c]) });
    }
    // Residuals from the remainders W of the last block: ‖W s_last‖²_M = s_lastᵀ (WᵀMW) s_last.
    const nc = cands.length;
    const mc = cands.map((v) => m.multiply(v));
    const w = new Float64Array(nc * nc);
    for (let a = 0; a < nc; a++) for (let c = 0; c <= a; c++) w[a * nc + c] = w[c * nc + a] = dot(cands[a], mc[c]);
    let converged = ritz.length === want;
    for (const { theta, s } of ritz) {
      let r2 = 0;
      for (let a = 0; a < nc; a++) for (let c = 0; c < nc; c++) r2 += s[last + a] * s[last + c] * w[a * nc + c];
      if (!(Math.sqrt(Math.max(r2, 0)) <= tol * theta)) converged = false;
    }
    if (converged || q.length >= maxBasis) return finish(ritz);
    const block = normaliseBlock(cands, norms0);
    last = lastEnd;
    if (block.length) addToBasis(block);
    else {
      const fresh = randomBlock();
      if (!fresh.length) return finish(ritz);
      addToBasis(fresh);
    }
  }

  function finish(ritz: Array<{ theta: number; s: Float64Array }>): EigenResult {
    const vectors = ritz.map(({ s }) => {
      const x = new Float64Array(n);
      for (let a = 0; a < s.length; a++) if (s[a] !== 0) axpy(x, s[a], q[a]);
      return x;
    });
    return { values: ritz.map(({ theta }) => sigma + 1 / theta), vectors, basisSize: q.length, deflated: lockedQ.length, factor };
  }
}
