// Dense LU factorisation with partial pivoting (Golub & Van Loan, Alg. 3.4.1), real and complex.
// Matrices are row-major Float64Array (see src/engine/types.ts). The factor is stored in place of
// a copy of the input; `perm[k]` is the original row placed at row k.

export interface RealLU {
  n: number;
  lu: Float64Array;
  perm: Int32Array;
  /** Index of the first column whose pivot was (numerically) zero, or −1. */
  singularAt: number;
  /** Smallest |pivot| relative to the largest entry of the matrix. */
  minPivotRatio: number;
}

export interface ComplexLU {
  n: number;
  re: Float64Array;
  im: Float64Array;
  perm: Int32Array;
  singularAt: number;
  minPivotRatio: number;
}

const TINY = 1e-300;

export function luReal(A: Float64Array, n: number, relTol = 1e-14): RealLU {
  const lu = Float64Array.from(A);
  const perm = new Int32Array(n);
  for (let i = 0; i < n; i++) perm[i] = i;
  let maxAbs = 0;
  for (let i = 0; i < n * n; i++) maxAbs = Math.max(maxAbs, Math.abs(lu[i]));
  let singularAt = -1;
  let minPivot = Infinity;
  for (let k = 0; k < n; k++) {
    let p = k;
    let best = Math.abs(lu[k * n + k]);
    for (let i = k + 1; i < n; i++) {
      const v = Math.abs(lu[i * n + k]);
      if (v > best) { best = v; p = i; }
    }
    minPivot = Math.min(minPivot, best);
    if (best <= Math.max(TINY, relTol * maxAbs)) {
      if (singularAt < 0) singularAt = k;
      continue;
    }
    if (p !== k) {
      for (let j = 0; j < n; j++) {
        const t = lu[k * n + j]; lu[k * n + j] = lu[p * n + j]; lu[p * n + j] = t;
      }
      const t = perm[k]; perm[k] = perm[p]; perm[p] = t;
    }
    const pivot = lu[k * n + k];
    for (let i = k + 1; i < n; i++) {
      const f = lu[i * n + k] / pivot;
      if (f === 0) continue;
      lu[i * n + k] = f;
      for (let j = k + 1; j < n; j++) lu[i * n + j] -= f * lu[k * n + j];
    }
  }
  return { n, lu, perm, singularAt, minPivotRatio: maxAbs > 0 ? minPivot / maxAbs : 0 };
}

/** Solve A·x = b for one right-hand side (b is not modified). */
export function solveReal(f: RealLU, b: Float64Array): Float64Array {
  const { n, lu, perm } = f;
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) x[i] = b[perm[i]];
  for (let i = 0; i < n; i++) {
    let s = x[i];
    for (let j = 0; j < i; j++) s -= lu[i * n + j] * x[j];
    x[i] = s;
  }
  for (let i = n - 1; i >= 0; i--) {
    let s = x[i];
    for (let j = i + 1; j < n; j++) s -= lu[i * n + j] * x[j];
    x[i] = s / lu[i * n + i];
  }
  return x;
}

/** Solve Aᵀ·x = b (used for left eigenvectors and adjoint sensitivities). */
export function solveRealTransposed(f: RealLU, b: Float64Array): Float64Array {
  const { n, lu, perm } = f;
  const z = Float64Array.from(b);
  for (let i = 0; i < n; i++) {
    let s = z[i];
    for (let j = 0; j < i; j++) s -= lu[j * n + i] * z[j];
    z[i] = s / lu[i * n + i];
  }
  for (let i = n - 1; i >= 0; i--) {
    let s = z[i];
    for (let j = i + 1; j < n; j++) s -= lu[j * n + i] * z[j];
    z[i] = s;
  }
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) x[perm[i]] = z[i];
  return x;
}

/** Complex LU of (Ar + i·Ai) with partial pivoting on |a|. */
export function luComplex(Ar: Float64Array, Ai: Float64Array, n: number, relTol = 1e-14): ComplexLU {
  const re = Float64Array.from(Ar);
  const im = Float64Array.from(Ai);
  const perm = new Int32Array(n);
  for (let i = 0; i < n; i++) perm[i] = i;
  let maxAbs = 0;
  for (let i = 0; i < n * n; i++) maxAbs = Math.max(maxAbs, Math.hypot(re[i], im[i]));
  let singularAt = -1;
  let minPivot = Infinity;
  for (let k = 0; k < n; k++) {
    let p = k;
    let best = Math.hypot(re[k * n + k], im[k * n + k]);
    for (let i = k + 1; i < n; i++) {
      const v = Math.hypot(re[i * n + k], im[i * n + k]);
      if (v > best) { best = v; p = i; }
    }
    minPivot = Math.min(minPivot, best);
    if (best <= Math.max(TINY, relTol * maxAbs)) {
      if (singularAt < 0) singularAt = k;
      continue;
    }
    if (p !== k) {
      for (let j = 0; j < n; j++) {
        let t = re[k * n + j]; re[k * n + j] = re[p * n + j]; re[p * n + j] = t;
        t = im[k * n + j]; im[k * n + j] = im[p * n + j]; im[p * n + j] = t;
      }
      const t = perm[k]; perm[k] = perm[p]; perm[p] = t;
    }
    const pr = re[k * n + k];
    const pi = im[k * n + k];
    const d = pr * pr + pi * pi;
    for (let i = k + 1; i < n; i++) {
      const ar = re[i * n + k];
      const ai = im[i * n + k];
      if (ar === 0 && ai === 0) continue;
      const fr = (ar * pr + ai * pi) / d;
      const fi = (ai * pr - ar * pi) / d;
      re[i * n + k] = fr;
      im[i * n + k] = fi;
      for (let j = k + 1; j < n; j++) {
        const br = re[k * n + j];
        const bi = im[k * n + j];
        re[i * n + j] -= fr * br - fi * bi;
        im[i * n + j] -= fr * bi + fi * br;
      }
    }
  }
  return { n, re, im, perm, singularAt, minPivotRatio: maxAbs > 0 ? minPivot / maxAbs : 0 };
}

/** Solve (LU)·x = b for a complex right-hand side; returns [xr, xi]. */
export function solveComplex(f: ComplexLU, br: Float64Array, bi: Float64Array): [Float64Array, Float64Array] {
  const { n, re, im, perm } = f;
  const xr = new Float64Array(n);
  const xi = new Float64Array(n);
  for (let i = 0; i < n; i++) { xr[i] = br[perm[i]]; xi[i] = bi[perm[i]]; }
  for (let i = 0; i < n; i++) {
    let sr = xr[i];
    let si = xi[i];
    for (let j = 0; j < i; j++) {
      const lr = re[i * n + j];
      const li = im[i * n + j];
      sr -= lr * xr[j] - li * xi[j];
      si -= lr * xi[j] + li * xr[j];
    }
    xr[i] = sr; xi[i] = si;
  }
  for (let i = n - 1; i >= 0; i--) {
    let sr = xr[i];
    let si = xi[i];
    for (let j = i + 1; j < n; j++) {
      const ur = re[i * n + j];
      const ui = im[i * n + j];
      sr -= ur * xr[j] - ui * xi[j];
      si -= ur * xi[j] + ui * xr[j];
    }
    const dr = re[i * n + i];
    const di = im[i * n + i];
    const d = dr * dr + di * di;
    xr[i] = (sr * dr + si * di) / d;
    xi[i] = (si * dr - sr * di) / d;
  }
  return [xr, xi];
}

/** Solve (LU)ᴴ·x = b (conjugate transpose), for left vectors; returns [xr, xi]. */
export function solveComplexAdjoint(f: ComplexLU, br: Float64Array, bi: Float64Array): [Float64Array, Float64Array] {
  const { n, re, im, perm } = f;
  const zr = Float64Array.from(br);
  const zi = Float64Array.from(bi);
  // Uᴴ z = b (forward), entries of Uᴴ are conj(U[j][i]).
  for (let i = 0; i < n; i++) {
    let sr = zr[i];
    let si = zi[i];
    for (let j = 0; j < i; j++) {
      const ur = re[j * n + i];
      const ui = -im[j * n + i];
      sr -= ur * zr[j] - ui * zi[j];
      si -= ur * zi[j] + ui * zr[j];
    }
    const dr = re[i * n + i];
    const di = -im[i * n + i];
    const d = dr * dr + di * di;
    zr[i] = (sr * dr + si * di) / d;
    zi[i] = (si * dr - sr * di) / d;
  }
  // Lᴴ w = z (backward, unit diagonal).
  for (let i = n - 1; i >= 0; i--) {
    let sr = zr[i];
    let si = zi[i];
    for (let j = i + 1; j < n; j++) {
      const lr = re[j * n + i];
      const li = -im[j * n + i];
      sr -= lr * zr[j] - li * zi[j];
      si -= lr * zi[j] + li * zr[j];
    }
    zr[i] = sr; zi[i] = si;
  }
  const xr = new Float64Array(n);
  const xi = new Float64Array(n);
  for (let i = 0; i < n; i++) { xr[perm[i]] = zr[i]; xi[perm[i]] = zi[i]; }
  return [xr, xi];
}
