import { cholesky, choleskySolve, type Envelope } from './envelope.js';

/**
 * Symmetric eigen-decomposition of a small dense matrix (row-major n×n) by cyclic Jacobi rotations.
 * Returns eigenvalues (unsorted, in matching order) and eigenvectors as columns of `vectors`.
 */
export function jacobiEigen(a0: Float64Array, n: number): { values: Float64Array; vectors: Float64Array } {
  const a = new Float64Array(a0);
  const v = new Float64Array(n * n);
  for (let i = 0; i < n; i++) v[i * n + i] = 1;
  for (let sweep = 0; sweep < 60; sweep++) {
    let off = 0;
    let total = 0;
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) {
      const x = a[i * n + j] * a[i * n + j];
      total += x;
      if (i !== j) off += x;
    }
    if (off <= 1e-30 * total || off === 0) break;
    for (let p = 0; p < n - 1; p++) {
      for (let q = p + 1; q < n; q++) {
        const apq = a[p * n + q];
        if (Math.abs(apq) < 1e-300) continue;
        const theta = (a[q * n + q] - a[p * n + p]) / (2 * apq);
        const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
        const c = 1 / Math.sqrt(t * t + 1);
        const s = t * c;
        for (let k = 0; k < n; k++) {
          const akp = a[k * n + p];
          const akq = a[k * n + q];
          a[k * n + p] = c * akp - s * akq;
          a[k * n + q] = s * akp + c * akq;
        }
        for (let k = 0; k < n; k++) {
          const apk = a[p * n + k];
          const aqk = a[q * n + k];
          a[p * n + k] = c * apk - s * aqk;
          a[q * n + k] = s * apk + c * aqk;
        }
        for (let k = 0; k < n; k++) {
          const vkp = v[k * n + p];
          const vkq = v[k * n + q];
          v[k * n + p] = c * vkp - s * vkq;
          v[k * n + q] = s * vkp + c * vkq;
        }
      }
    }
  }
  const values = new Float64Array(n);
  for (let i = 0; i < n; i++) values[i] = a[i * n + i];
  return { values, vectors: v };
}

export type EigenOptions = Readonly<{
  /** Shift σ (rad²/s²) below every wanted eigenvalue; K − σM must be positive definite. Default −(2π·10 Hz)². */
  shift?: number;
  /** Vectors per Krylov block: at least the largest multiplicity expected. Default 6. */
  blockSize?: number;
  /**
   * Known eigenvectors at λ = 0 (rigid-body motions of an unsupported model), kept out of the search:
   * every basis vector is made M-orthogonal to them. Without this, the rigid modes' large θ would
   * swamp the precision left for high elastic modes. Vectors that vanish on the active DOFs are ignored.
   */
  deflate?: readonly Float64Array[];
  /** Relative residual of the inverted operator, ‖Op x − θx‖_M / θ, accepted. Eigenvalue errors go as its square. Default 1e-4. */
  tolerance?: number;
}>;

export type EigenResult = Readonly<{
  /** Deflation vectors actually used (non-zero on the active DOFs and independent). */
  deflated: number;
  /** Eigenvalues λ = ω², ascending, rad²/s². */
  values: number[];
  /** Eigenvectors, M-normalised (xᵀMx = 1). */
  vectors: Float64Array[];
  /** Size of the Krylov basis used. */
  basisSize: number;
}>;

/**
 * Lowest eigenpairs of K x = λ M x (K symmetric in envelope storage, M diagonal and positive) by
 * shift-invert block Lanczos with full reorthogonalisation: the basis is grown block by block
 * from Op = (K − σM)⁻¹M in the M-inner product and Rayleigh–Ritz is applied to Op on it until the
 * wanted pairs meet the residual tolerance. Blocks keep repeated eigenvalues (symmetric parts,
 * rigid-body modes of a free part) from being missed, as a single-vector Lanczos run can.
 * Deterministic: the start block comes from a fixed-seed generator.
 * @throws NotPositiveDefiniteError when K − σM is not positive definite
 */
export function lowestEigenpairs(k: Envelope, m: Float64Array, count: number, options: EigenOptions = {}): EigenResult {
  const n = k.n;
  const want = Math.min(count, n);
  if (want <= 0) return { values: [], vectors: [], basisSize: 0, deflated: 0 };
  const sigma = options.shift ?? -((2 * Math.PI * 10) ** 2);
  const p = Math.min(options.blockSize ?? 6, n);
  const tol = options.tolerance ?? 1e-4;
  // A safety stop; the wanted pairs normally converge with a basis of two to four times their number.
  const maxBasis = Math.min(n - (options.deflate?.length ?? 0), 10 * want + 10 * p + 50);
  const factor = cholesky(k.withDiagonal(m, -sigma));
  const locked: Float64Array[] = [];
  const q: Float64Array[] = [];
  const z: Float64Array[] = [];
  const mdot = (a: Float64Array, b: Float64Array) => {
    let s = 0;
    for (let i = 0; i < n; i++) s += a[i] * m[i] * b[i];
    return s;
  };
  /** M-orthogonalise against the basis (twice, classical Gram–Schmidt) and normalise; null if nothing is left. */
  const orthonormalise = (v: Float64Array): Float64Array | null => {
    const norm0 = Math.sqrt(mdot(v, v));
    if (norm0 === 0) return null;
    for (let pass = 0; pass < 2; pass++) {
      for (const b of locked) {
        const c = mdot(b, v);
        for (let i = 0; i < n; i++) v[i] -= c * b[i];
      }
      for (const b of q) {
        const c = mdot(b, v);
        for (let i = 0; i < n; i++) v[i] -= c * b[i];
      }
    }
    const norm = Math.sqrt(mdot(v, v));
    if (norm < 1e-10 * norm0) return null;
    for (let i = 0; i < n; i++) v[i] /= norm;
    return v;
  };
  let seed = 12345;
  const rand = () => {
    seed = (seed * 1103515245 + 12345) % 2147483648;
    return seed / 2147483648 - 0.5;
  };
  const addBlock = (cands: Float64Array[]): number => {
    let added = 0;
    for (const c of cands) {
      if (q.length + locked.length >= n) break;
      const v = orthonormalise(c);
      if (!v) continue;
      q.push(v);
      const mv = new Float64Array(n);
      for (let i = 0; i < n; i++) mv[i] = m[i] * v[i];
      z.push(choleskySolve(factor, mv));
      added++;
    }
    return added;
  };
  const randomBlock = () => Array.from({ length: p }, () => Float64Array.from({ length: n }, rand));
  for (const d of options.deflate ?? []) {
    const v = orthonormaliseAgainstLocked(new Float64Array(d));
    if (v) locked.push(v);
  }
  function orthonormaliseAgainstLocked(v: Float64Array): Float64Array | null {
    const norm0 = Math.sqrt(mdot(v, v));
    if (!(norm0 > 0)) return null;
    for (let pass = 0; pass < 2; pass++) {
      for (const b of locked) {
        const c = mdot(b, v);
        for (let i = 0; i < n; i++) v[i] -= c * b[i];
      }
    }
    const norm = Math.sqrt(mdot(v, v));
    if (norm < 1e-8 * norm0) return null;
    for (let i = 0; i < n; i++) v[i] /= norm;
    return v;
  }
  addBlock(randomBlock());
  let lastBlockStart = 0;
  // H = QᵀM Z (the projected operator) and G = ZᵀM Z, grown one row per basis vector. With
  // Ritz vector x = Q s and θ its value, ‖Op x − θx‖²_M = sᵀGs − 2θ sᵀHs + θ², so convergence is
  // judged without forming any vector.
  const hRows: number[][] = [];
  const gRows: number[][] = [];
  for (;;) {
    for (let i = hRows.length; i < q.length; i++) {
      const h: number[] = [];
      const g: number[] = [];
      for (let j = 0; j <= i; j++) {
        h.push(0.5 * (mdot(q[i], z[j]) + mdot(q[j], z[i])));
        g.push(mdot(z[i], z[j]));
      }
      hRows.push(h);
      gRows.push(g);
    }
    if (q.length >= Math.min(n, want + p)) {
      const ritz = ritzPairs(hRows, want);
      let converged = true;
      for (const { theta, s } of ritz) {
        const r2 = quad(gRows, s) - 2 * theta * quad(hRows, s) + theta * theta;
        if (!(Math.sqrt(Math.max(r2, 0)) <= tol * theta)) converged = false;
      }
      // The cheap estimate is found by cancellation and cannot resolve much below ε·θmax, so a
      // pass is confirmed on the vectors themselves before it is trusted.
      if (converged && !explicitlyConverged(ritz)) converged = false;
      if (converged || q.length >= maxBasis) return finish(ritz);
    }
    const start = q.length;
    const added = addBlock(z.slice(lastBlockStart, start).map((v) => new Float64Array(v)));
    lastBlockStart = start;
    if (added === 0 && addBlock(randomBlock()) === 0) return finish(ritzPairs(hRows, want));
  }

  function explicitlyConverged(ritz: Array<{ theta: number; s: Float64Array }>): boolean {
    const x = new Float64Array(n);
    const y = new Float64Array(n);
    for (const { theta, s } of ritz) {
      x.fill(0);
      y.fill(0);
      for (let a = 0; a < s.length; a++) {
        const c = s[a];
        const qa = q[a];
        const za = z[a];
        for (let r = 0; r < n; r++) {
          x[r] += c * qa[r];
          y[r] += c * za[r];
        }
      }
      let r2 = 0;
      for (let r = 0; r < n; r++) r2 += m[r] * (y[r] - theta * x[r]) ** 2;
      if (!(Math.sqrt(r2) <= tol * theta)) return false;
    }
    return true;
  }

  function finish(ritz: Array<{ theta: number; s: Float64Array }>): EigenResult {
    const vectors = ritz.map(({ s }) => {
      const x = new Float64Array(n);
      for (let a = 0; a < s.length; a++) {
        const c = s[a];
        if (c === 0) continue;
        const qa = q[a];
        for (let r = 0; r < n; r++) x[r] += c * qa[r];
      }
      return x;
    });
    return { values: ritz.map(({ theta }) => sigma + 1 / theta), vectors, basisSize: q.length, deflated: locked.length };
  }
}

/** sᵀ A s for a symmetric matrix stored as lower-triangle rows. */
function quad(rows: number[][], s: Float64Array): number {
  let acc = 0;
  for (let i = 0; i < s.length; i++) {
    const row = rows[i];
    let t = 0;
    for (let j = 0; j < i; j++) t += row[j] * s[j];
    acc += s[i] * (2 * t + row[i] * s[i]);
  }
  return acc;
}

/**
 * Rayleigh–Ritz on the basis: eigenpairs of the projected operator H, largest θ first (largest θ of
 * the inverted operator ↔ eigenvalues closest above the shift).
 */
function ritzPairs(hRows: number[][], want: number): Array<{ theta: number; s: Float64Array }> {
  const b = hRows.length;
  const h = new Float64Array(b * b);
  for (let i = 0; i < b; i++) for (let j = 0; j <= i; j++) h[i * b + j] = h[j * b + i] = hRows[i][j];
  const { values, vectors } = jacobiEigen(h, b);
  return Array.from(values.keys())
    .filter((i) => values[i] > 0)
    .sort((i, j) => values[j] - values[i])
    .slice(0, want)
    .map((i) => ({ theta: values[i], s: Float64Array.from({ length: b }, (_, a) => vectors[a * b + i]) }));
}
