// Eigenvalues of a 2×2 block of a Hessenberg–triangular pencil, det(A − λB) = 0 with
// A = [a11 a12; a21 a22], B = [b11 b12; 0 b22] (b11, b22 nonzero). Dividing by b11·b22 gives
// λ² − 2pλ + q = 0 with d1 = a11/b11, d2 = a22/b22, e = a21/b22, g = b12/b11:
//   p = (d1 + d2 − e·g)/2,  q = det(A)/(b11·b22),
// and the discriminant written without the cancelling term p² (common practice):
//   p² − q = r² + e·(a12 − d2·b12)/b11,  r = (d1 − d2 − e·g)/2.
// Real roots: the larger one from p ± √disc with the sign of p, the other as q/λ₁ (Vieta).

/** Writes (alphaRe, alphaIm, beta) of the two eigenvalues into out[0..2] and out[3..5]; a complex
 *  pair comes out as exact conjugates, positive imaginary part first. */
export function pencil2x2(A: Float64Array, B: Float64Array, m: number, f: number, out: Float64Array): void {
  const a11 = A[f * m + f], a12 = A[f * m + f + 1];
  const a21 = A[(f + 1) * m + f], a22 = A[(f + 1) * m + f + 1];
  const b11 = B[f * m + f], b12 = B[f * m + f + 1], b22 = B[(f + 1) * m + f + 1];
  const d1 = a11 / b11, d2 = a22 / b22, e = a21 / b22, g = b12 / b11;
  const p = (d1 + d2 - e * g) / 2;
  const r = (d1 - d2 - e * g) / 2;
  const disc = r * r + e * ((a12 - d2 * b12) / b11);
  const beta = Math.sqrt(Math.abs(b11 * b22));
  if (disc >= 0) {
    const root = Math.sqrt(disc);
    const l1 = p >= 0 ? p + root : p - root;
    const det = (a11 * a22 - a12 * a21) / (b11 * b22);
    const l2 = l1 !== 0 ? det / l1 : 0;
    out[0] = l1 * beta; out[1] = 0; out[2] = beta;
    out[3] = l2 * beta; out[4] = 0; out[5] = beta;
  } else {
    const im = Math.sqrt(-disc);
    out[0] = p * beta; out[1] = im * beta; out[2] = beta;
    out[3] = p * beta; out[4] = -im * beta; out[5] = beta;
  }
}
