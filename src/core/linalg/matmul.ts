/**
 * Register-blocked products for the per-sample work of Winnow (unmixing, back-projection, ICA gradients).
 * PERFORMANCE.md measured 4×4 register blocking over 256-sample tiles at ~7 GFLOP/s in plain JavaScript,
 * 5× a naive loop and 8× ml-matrix; these kernels follow that design and allocate nothing.
 */

/** Samples per tile: a 64-channel Float32 tile is 64 KiB and stays in L2 while every row block reads it. */
export const SAMPLE_TILE = 256;

/**
 * out (k × (sampleEnd − sampleStart), channel-major) = W (k × n, row-major) · X[:, sampleStart:sampleEnd]
 * where X is channel-major n × nSamples. Defaults: the whole recording. `out` must hold k·(end − start)
 * values; row i of the result starts at out[i·(end − start)].
 */
export function multiplyChannelMajor(
  W: Float64Array,
  k: number,
  n: number,
  X: Float32Array,
  nSamples: number,
  out: Float32Array | Float64Array,
  sampleStart = 0,
  sampleEnd = nSamples,
): void {
  const m = sampleEnd - sampleStart;
  if (m <= 0 || k <= 0) return;
  if (n === 0) {
    out.fill(0, 0, k * m);
    return;
  }
  const k4 = k - (k % 4);
  for (let t0 = sampleStart; t0 < sampleEnd; t0 += SAMPLE_TILE) {
    const t1 = Math.min(sampleEnd, t0 + SAMPLE_TILE);
    const t4 = t0 + ((t1 - t0) - ((t1 - t0) % 4));
    for (let i = 0; i < k4; i += 4) {
      const r0 = i * n;
      const r1 = r0 + n;
      const r2 = r1 + n;
      const r3 = r2 + n;
      const o0 = i * m - sampleStart;
      const o1 = o0 + m;
      const o2 = o1 + m;
      const o3 = o2 + m;
      for (let t = t0; t < t4; t += 4) {
        let a00 = 0, a01 = 0, a02 = 0, a03 = 0;
        let a10 = 0, a11 = 0, a12 = 0, a13 = 0;
        let a20 = 0, a21 = 0, a22 = 0, a23 = 0;
        let a30 = 0, a31 = 0, a32 = 0, a33 = 0;
        for (let c = 0, xc = t; c < n; c++, xc += nSamples) {
          const x0 = X[xc], x1 = X[xc + 1], x2 = X[xc + 2], x3 = X[xc + 3];
          const w0 = W[r0 + c], w1 = W[r1 + c], w2 = W[r2 + c], w3 = W[r3 + c];
          a00 += w0 * x0; a01 += w0 * x1; a02 += w0 * x2; a03 += w0 * x3;
          a10 += w1 * x0; a11 += w1 * x1; a12 += w1 * x2; a13 += w1 * x3;
          a20 += w2 * x0; a21 += w2 * x1; a22 += w2 * x2; a23 += w2 * x3;
          a30 += w3 * x0; a31 += w3 * x1; a32 += w3 * x2; a33 += w3 * x3;
        }
        out[o0 + t] = a00; out[o0 + t + 1] = a01; out[o0 + t + 2] = a02; out[o0 + t + 3] = a03;
        out[o1 + t] = a10; out[o1 + t + 1] = a11; out[o1 + t + 2] = a12; out[o1 + t + 3] = a13;
        out[o2 + t] = a20; out[o2 + t + 1] = a21; out[o2 + t + 2] = a22; out[o2 + t + 3] = a23;
        out[o3 + t] = a30; out[o3 + t + 1] = a31; out[o3 + t + 2] = a32; out[o3 + t + 3] = a33;
      }
      for (let t = t4; t < t1; t++) {
        let a0 = 0, a1 = 0, a2 = 0, a3 = 0;
        for (let c = 0, xc = t; c < n; c++, xc += nSamples) {
          const x = X[xc];
          a0 += W[r0 + c] * x; a1 += W[r1 + c] * x; a2 += W[r2 + c] * x; a3 += W[r3 + c] * x;
        }
        out[o0 + t] = a0; out[o1 + t] = a1; out[o2 + t] = a2; out[o3 + t] = a3;
      }
    }
    for (let i = k4; i < k; i++) {
      const r0 = i * n;
      const o0 = i * m - sampleStart;
      for (let t = t0; t < t4; t += 4) {
        let a0 = 0, a1 = 0, a2 = 0, a3 = 0;
        for (let c = 0, xc = t; c < n; c++, xc += nSamples) {
          const w = W[r0 + c];
          a0 += w * X[xc]; a1 += w * X[xc + 1]; a2 += w * X[xc + 2]; a3 += w * X[xc + 3];
        }
        out[o0 + t] = a0; out[o0 + t + 1] = a1; out[o0 + t + 2] = a2; out[o0 + t + 3] = a3;
      }
      for (let t = t4; t < t1; t++) {
        let a = 0;
        for (let c = 0, xc = t; c < n; c++, xc += nSamples) a += W[r0 + c] * X[xc];
        out[o0 + t] = a;
      }
    }
  }
}

/**
 * out (k × m, row-major) += A (k × len) · B (m × len)ᵀ, where row r of A starts at A[r·strideA] and row r of B
 * at B[r·strideB]; columns [0, len). The accumulation kernel of covariances and ICA gradients
 * (E[ψ(Y) Yᵀ] over one tile). 4×4 register blocks.
 */
export function accumulateProductTransposed(
  A: Float64Array,
  strideA: number,
  k: number,
  B: Float64Array,
  strideB: number,
  m: number,
  len: number,
  out: Float64Array,
): void {
  const k4 = k - (k % 4);
  const m4 = m - (m % 4);
  for (let i = 0; i < k4; i += 4) {
    const p0 = i * strideA, p1 = p0 + strideA, p2 = p1 + strideA, p3 = p2 + strideA;
    for (let j = 0; j < m4; j += 4) {
      const q0 = j * strideB, q1 = q0 + strideB, q2 = q1 + strideB, q3 = q2 + strideB;
      let a00 = 0, a01 = 0, a02 = 0, a03 = 0;
      let a10 = 0, a11 = 0, a12 = 0, a13 = 0;
      let a20 = 0, a21 = 0, a22 = 0, a23 = 0;
      let a30 = 0, a31 = 0, a32 = 0, a33 = 0;
      for (let t = 0; t < len; t++) {
        const x0 = A[p0 + t], x1 = A[p1 + t], x2 = A[p2 + t], x3 = A[p3 + t];
        const y0 = B[q0 + t], y1 = B[q1 + t], y2 = B[q2 + t], y3 = B[q3 + t];
        a00 += x0 * y0; a01 += x0 * y1; a02 += x0 * y2; a03 += x0 * y3;
        a10 += x1 * y0; a11 += x1 * y1; a12 += x1 * y2; a13 += x1 * y3;
        a20 += x2 * y0; a21 += x2 * y1; a22 += x2 * y2; a23 += x2 * y3;
        a30 += x3 * y0; a31 += x3 * y1; a32 += x3 * y2; a33 += x3 * y3;
      }
      const o0 = i * m + j, o1 = o0 + m, o2 = o1 + m, o3 = o2 + m;
      out[o0] += a00; out[o0 + 1] += a01; out[o0 + 2] += a02; out[o0 + 3] += a03;
      out[o1] += a10; out[o1 + 1] += a11; out[o1 + 2] += a12; out[o1 + 3] += a13;
      out[o2] += a20; out[o2 + 1] += a21; out[o2 + 2] += a22; out[o2 + 3] += a23;
      out[o3] += a30; out[o3 + 1] += a31; out[o3 + 2] += a32; out[o3 + 3] += a33;
    }
    for (let j = m4; j < m; j++) {
      const q = j * strideB;
      let a0 = 0, a1 = 0, a2 = 0, a3 = 0;
      for (let t = 0; t < len; t++) {
        const y = B[q + t];
        a0 += A[p0 + t] * y; a1 += A[p1 + t] * y; a2 += A[p2 + t] * y; a3 += A[p3 + t] * y;
      }
      out[i * m + j] += a0; out[(i + 1) * m + j] += a1; out[(i + 2) * m + j] += a2; out[(i + 3) * m + j] += a3;
    }
  }
  for (let i = k4; i < k; i++) {
    const p = i * strideA;
    for (let j = 0; j < m; j++) {
      const q = j * strideB;
      let a = 0;
      for (let t = 0; t < len; t++) a += A[p + t] * B[q + t];
      out[i * m + j] += a;
    }
  }
}
