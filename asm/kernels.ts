/**
 * WebAssembly SIMD kernels (AssemblyScript, f32x4 lanes) for the per-sample loops of Winnow: the unmixing /
 * back-projection product, the Picard nonlinearity sums and the gradient / covariance accumulation.
 * Built from this source by `npm run build:wasm` (asc from npm) into build/wasm/kernels.wasm; never edited as
 * a binary. The loader and the plain-JS twins that must agree with these are src/core/kernels/*.ts.
 *
 * All arrays live in this module's linear memory; the caller (src/core/kernels/wasm-kernels.ts) lays them
 * out above heapBase() and passes byte addresses. Data are float32, row-major, rows `ld` floats apart; sample
 * counts are multiples of 8 (multiply) or 4 (the others): the caller zero-pads the last tile.
 */

/** First free byte above the module's static data. */
export function heapBase(): usize {
  return (__heap_base + 15) & ~15;
}

/**
 * Y[i, t] = Σ_c W[i, c] · X[c, t] for i < k, t < len (len a multiple of 8). W is k × n (row stride n),
 * X n × ldx, Y k × ldy. Blocks of 4 rows × 8 samples (eight f32x4 accumulators) per step, as in the issue's probe.
 */
export function multiply(W: usize, k: i32, n: i32, X: usize, ldx: i32, Y: usize, ldy: i32, len: i32): void {
  const k4 = k & ~3;
  const sx = <usize>ldx << 2;
  const sy = <usize>ldy << 2;
  const sw = <usize>n << 2;
  for (let t = 0; t < len; t += 8) {
    const xt = X + (<usize>t << 2);
    let i = 0;
    for (; i < k4; i += 4) {
      let a0 = f32x4.splat(0), b0 = f32x4.splat(0);
      let a1 = f32x4.splat(0), b1 = f32x4.splat(0);
      let a2 = f32x4.splat(0), b2 = f32x4.splat(0);
      let a3 = f32x4.splat(0), b3 = f32x4.splat(0);
      let w0 = W + <usize>i * sw;
      const w1 = sw, w2 = sw * 2, w3 = sw * 3;
      let xp = xt;
      for (let c = 0; c < n; c++) {
        const x0 = v128.load(xp);
        const x1 = v128.load(xp, 16);
        let w = v128.load32_splat(w0);
        a0 = f32x4.add(a0, f32x4.mul(w, x0));
        b0 = f32x4.add(b0, f32x4.mul(w, x1));
        w = v128.load32_splat(w0 + w1);
        a1 = f32x4.add(a1, f32x4.mul(w, x0));
        b1 = f32x4.add(b1, f32x4.mul(w, x1));
        w = v128.load32_splat(w0 + w2);
        a2 = f32x4.add(a2, f32x4.mul(w, x0));
        b2 = f32x4.add(b2, f32x4.mul(w, x1));
        w = v128.load32_splat(w0 + w3);
        a3 = f32x4.add(a3, f32x4.mul(w, x0));
        b3 = f32x4.add(b3, f32x4.mul(w, x1));
        w0 += 4;
        xp += sx;
      }
      const yp = Y + <usize>i * sy + (<usize>t << 2);
      v128.store(yp, a0);
      v128.store(yp, b0, 16);
      v128.store(yp + sy, a1);
      v128.store(yp + sy, b1, 16);
      v128.store(yp + 2 * sy, a2);
      v128.store(yp + 2 * sy, b2, 16);
      v128.store(yp + 3 * sy, a3);
      v128.store(yp + 3 * sy, b3, 16);
    }
    for (; i < k; i++) {
      let a0 = f32x4.splat(0), b0 = f32x4.splat(0);
      let w0 = W + <usize>i * sw;
      let xp = xt;
      for (let c = 0; c < n; c++) {
        const w = v128.load32_splat(w0);
        a0 = f32x4.add(a0, f32x4.mul(w, v128.load(xp)));
        b0 = f32x4.add(b0, f32x4.mul(w, v128.load(xp, 16)));
        w0 += 4;
        xp += sx;
      }
      const yp = Y + <usize>i * sy + (<usize>t << 2);
      v128.store(yp, a0);
      v128.store(yp, b0, 16);
    }
  }
}

// exp on (−∞, 0]: Cody–Waite reduction x = n·ln2 + r, |r| ≤ ln2/2, degree-7 Taylor polynomial (error
// ≤ r⁸/8! ≈ 5e-9 relative), scaled by 2ⁿ built from the exponent bits; x is clamped at −87 (2ⁿ stays normal).
// docs/methods.md §7.7.
// @ts-ignore: decorator
@inline
function expNeg(x: v128): v128 {
  x = f32x4.max(x, f32x4.splat(-87.0));
  const n = f32x4.floor(f32x4.add(f32x4.mul(x, f32x4.splat(1.4426950408889634)), f32x4.splat(0.5)));
  let r = f32x4.sub(x, f32x4.mul(n, f32x4.splat(0.693359375)));
  r = f32x4.sub(r, f32x4.mul(n, f32x4.splat(-2.12194440e-4)));
  let p = f32x4.splat(1.0 / 5040.0);
  p = f32x4.add(f32x4.mul(p, r), f32x4.splat(1.0 / 720.0));
  p = f32x4.add(f32x4.mul(p, r), f32x4.splat(1.0 / 120.0));
  p = f32x4.add(f32x4.mul(p, r), f32x4.splat(1.0 / 24.0));
  p = f32x4.add(f32x4.mul(p, r), f32x4.splat(1.0 / 6.0));
  p = f32x4.add(f32x4.mul(p, r), f32x4.splat(0.5));
  p = f32x4.add(f32x4.mul(p, r), f32x4.splat(1.0));
  p = f32x4.add(f32x4.mul(p, r), f32x4.splat(1.0));
  const scale = i32x4.shl(i32x4.add(i32x4.trunc_sat_f32x4_s(n), i32x4.splat(127)), 23);
  return f32x4.mul(p, scale);
}

/**
 * For each row i < k of Y (k × ld, len a multiple of 4): P[i, t] = tanh(Y[i, t]); lc[i] += Σ_t ln cosh Y[i, t];
 * th2[i] += Σ_t tanh² Y[i, t] (lc and th2 float64). With a = |y| and e = exp(−2a):
 *   tanh a = (1 − e)/(1 + e),  ln cosh a = a − ln 2 + ln(1 + e),  ln(1 + e) = 2 atanh(s), s = e/(2 + e) ≤ 1/3,
 * the atanh series to s¹³ (truncation < 2e-8). Zero padding adds 0 to th2 and |err| < 1e-7 to lc.
 */
export function tanhSums(Y: usize, P: usize, k: i32, ld: i32, len: i32, lc: usize, th2: usize): void {
  const s = <usize>ld << 2;
  const signMask = i32x4.splat(0x80000000);
  const one = f32x4.splat(1.0);
  const two = f32x4.splat(2.0);
  const ln2 = f32x4.splat(0.6931471805599453);
  for (let i = 0; i < k; i++) {
    let yp = Y + <usize>i * s;
    let pp = P + <usize>i * s;
    // float64 accumulators (two f64x2 each): float32 running sums would round at the size of the sum and make
    // the mean loss too coarse for Picard's line search (docs/methods.md §7.7).
    let lcLo = f64x2.splat(0), lcHi = f64x2.splat(0);
    let thLo = f64x2.splat(0), thHi = f64x2.splat(0);
    for (let t = 0; t < len; t += 4) {
      const y = v128.load(yp);
      const a = f32x4.abs(y);
      const e = expNeg(f32x4.mul(a, f32x4.splat(-2.0)));
      const th = f32x4.div(f32x4.sub(one, e), f32x4.add(one, e));
      v128.store(pp, v128.or(th, v128.and(y, signMask)));
      const th2v = f32x4.mul(th, th);
      thLo = f64x2.add(thLo, f64x2.promote_low_f32x4(th2v));
      thHi = f64x2.add(thHi, f64x2.promote_low_f32x4(f32x4.shuffle(th2v, th2v, 2, 3, 0, 1)));
      const q = f32x4.div(e, f32x4.add(two, e));
      const q2 = f32x4.mul(q, q);
      let ser = f32x4.splat(1.0 / 13.0);
      ser = f32x4.add(f32x4.mul(ser, q2), f32x4.splat(1.0 / 11.0));
      ser = f32x4.add(f32x4.mul(ser, q2), f32x4.splat(1.0 / 9.0));
      ser = f32x4.add(f32x4.mul(ser, q2), f32x4.splat(1.0 / 7.0));
      ser = f32x4.add(f32x4.mul(ser, q2), f32x4.splat(1.0 / 5.0));
      ser = f32x4.add(f32x4.mul(ser, q2), f32x4.splat(1.0 / 3.0));
      ser = f32x4.add(f32x4.mul(ser, q2), one);
      const l1p = f32x4.mul(f32x4.mul(two, q), ser);
      const lcv = f32x4.add(f32x4.sub(a, ln2), l1p);
      lcLo = f64x2.add(lcLo, f64x2.promote_low_f32x4(lcv));
      lcHi = f64x2.add(lcHi, f64x2.promote_low_f32x4(f32x4.shuffle(lcv, lcv, 2, 3, 0, 1)));
      yp += 16;
      pp += 16;
    }
    store<f64>(lc + (<usize>i << 3), load<f64>(lc + (<usize>i << 3)) + hsum2(f64x2.add(lcLo, lcHi)));
    store<f64>(th2 + (<usize>i << 3), load<f64>(th2 + (<usize>i << 3)) + hsum2(f64x2.add(thLo, thHi)));
  }
}

/**
 * Extended-Infomax nonlinearity over rows i < k of Y (k × ld, len a multiple of 4), with K (float64, k) the
 * density signs: F[i, t] = K_i tanh(y) + y; th2[i] += Σ tanh² y, u2[i] += Σ y², tu[i] += Σ tanh(y) y (float64).
 * tanh as in tanhSums. Zero padding adds nothing.
 */
export function infomaxNonlin(Y: usize, F: usize, K: usize, k: i32, ld: i32, len: i32, th2: usize, u2: usize, tu: usize): void {
  const s = <usize>ld << 2;
  const signMask = i32x4.splat(0x80000000);
  const one = f32x4.splat(1.0);
  for (let i = 0; i < k; i++) {
    let yp = Y + <usize>i * s;
    let fp = F + <usize>i * s;
    const ki = f32x4.splat(<f32>load<f64>(K + (<usize>i << 3)));
    let a0 = f64x2.splat(0), a1 = f64x2.splat(0);
    let b0 = f64x2.splat(0), b1 = f64x2.splat(0);
    let c0 = f64x2.splat(0), c1 = f64x2.splat(0);
    for (let t = 0; t < len; t += 4) {
      const y = v128.load(yp);
      const e = expNeg(f32x4.mul(f32x4.abs(y), f32x4.splat(-2.0)));
      const th = v128.or(f32x4.div(f32x4.sub(one, e), f32x4.add(one, e)), v128.and(y, signMask));
      v128.store(fp, f32x4.add(f32x4.mul(ki, th), y));
      const t2 = f32x4.mul(th, th);
      const yy = f32x4.mul(y, y);
      const ty = f32x4.mul(th, y);
      a0 = f64x2.add(a0, f64x2.promote_low_f32x4(t2));
      a1 = f64x2.add(a1, f64x2.promote_low_f32x4(f32x4.shuffle(t2, t2, 2, 3, 0, 1)));
      b0 = f64x2.add(b0, f64x2.promote_low_f32x4(yy));
      b1 = f64x2.add(b1, f64x2.promote_low_f32x4(f32x4.shuffle(yy, yy, 2, 3, 0, 1)));
      c0 = f64x2.add(c0, f64x2.promote_low_f32x4(ty));
      c1 = f64x2.add(c1, f64x2.promote_low_f32x4(f32x4.shuffle(ty, ty, 2, 3, 0, 1)));
      yp += 16;
      fp += 16;
    }
    const o = <usize>i << 3;
    store<f64>(th2 + o, load<f64>(th2 + o) + hsum2(f64x2.add(a0, a1)));
    store<f64>(u2 + o, load<f64>(u2 + o) + hsum2(f64x2.add(b0, b1)));
    store<f64>(tu + o, load<f64>(tu + o) + hsum2(f64x2.add(c0, c1)));
  }
}

// @ts-ignore: decorator
@inline
function hsum2(v: v128): f64 {
  return f64x2.extract_lane(v, 0) + f64x2.extract_lane(v, 1);
}

// @ts-ignore: decorator
@inline
function hsum(v: v128): f64 {
  return <f64>f32x4.extract_lane(v, 0) + <f64>f32x4.extract_lane(v, 1) + <f64>f32x4.extract_lane(v, 2) + <f64>f32x4.extract_lane(v, 3);
}

/**
 * out[i, j] += Σ_t A[i, t] · B[j, t] for i < k, j < m, t < len (len a multiple of 4); A rows lda floats apart,
 * B rows ldb apart, out float64 k × m. Blocks of 2 rows of A × 4 rows of B (eight f32x4 accumulators).
 * The gradient E[ψ(Y) Yᵀ] of the ICA passes and covariances Z Zᵀ (A = B).
 */
export function accumulateAbT(A: usize, lda: i32, k: i32, B: usize, ldb: i32, m: i32, len: i32, out: usize): void {
  const sa = <usize>lda << 2;
  const sb = <usize>ldb << 2;
  const k2 = k & ~1;
  const m4 = m & ~3;
  const bytes = <usize>len << 2;
  let i = 0;
  for (; i < k2; i += 2) {
    const a0p = A + <usize>i * sa;
    const a1p = a0p + sa;
    let j = 0;
    for (; j < m4; j += 4) {
      const b0p = B + <usize>j * sb;
      let c00 = f32x4.splat(0), c01 = f32x4.splat(0), c02 = f32x4.splat(0), c03 = f32x4.splat(0);
      let c10 = f32x4.splat(0), c11 = f32x4.splat(0), c12 = f32x4.splat(0), c13 = f32x4.splat(0);
      for (let o: usize = 0; o < bytes; o += 16) {
        const x0 = v128.load(a0p + o);
        const x1 = v128.load(a1p + o);
        const bp = b0p + o;
        let y = v128.load(bp);
        c00 = f32x4.add(c00, f32x4.mul(x0, y));
        c10 = f32x4.add(c10, f32x4.mul(x1, y));
        y = v128.load(bp + sb);
        c01 = f32x4.add(c01, f32x4.mul(x0, y));
        c11 = f32x4.add(c11, f32x4.mul(x1, y));
        y = v128.load(bp + 2 * sb);
        c02 = f32x4.add(c02, f32x4.mul(x0, y));
        c12 = f32x4.add(c12, f32x4.mul(x1, y));
        y = v128.load(bp + 3 * sb);
        c03 = f32x4.add(c03, f32x4.mul(x0, y));
        c13 = f32x4.add(c13, f32x4.mul(x1, y));
      }
      const o0 = out + ((<usize>i * m + j) << 3);
      const o1 = o0 + (<usize>m << 3);
      store<f64>(o0, load<f64>(o0) + hsum(c00));
      store<f64>(o0 + 8, load<f64>(o0 + 8) + hsum(c01));
      store<f64>(o0 + 16, load<f64>(o0 + 16) + hsum(c02));
      store<f64>(o0 + 24, load<f64>(o0 + 24) + hsum(c03));
      store<f64>(o1, load<f64>(o1) + hsum(c10));
      store<f64>(o1 + 8, load<f64>(o1 + 8) + hsum(c11));
      store<f64>(o1 + 16, load<f64>(o1 + 16) + hsum(c12));
      store<f64>(o1 + 24, load<f64>(o1 + 24) + hsum(c13));
    }
    for (; j < m; j++) {
      const bp = B + <usize>j * sb;
      let c0 = f32x4.splat(0), c1 = f32x4.splat(0);
      for (let o: usize = 0; o < bytes; o += 16) {
        const y = v128.load(bp + o);
        c0 = f32x4.add(c0, f32x4.mul(v128.load(a0p + o), y));
        c1 = f32x4.add(c1, f32x4.mul(v128.load(a1p + o), y));
      }
      const o0 = out + ((<usize>i * m + j) << 3);
      const o1 = o0 + (<usize>m << 3);
      store<f64>(o0, load<f64>(o0) + hsum(c0));
      store<f64>(o1, load<f64>(o1) + hsum(c1));
    }
  }
  for (; i < k; i++) {
    const ap = A + <usize>i * sa;
    for (let j = 0; j < m; j++) {
      const bp = B + <usize>j * sb;
      let c = f32x4.splat(0);
      for (let o: usize = 0; o < bytes; o += 16) c = f32x4.add(c, f32x4.mul(v128.load(ap + o), v128.load(bp + o)));
      const o0 = out + ((<usize>i * m + j) << 3);
      store<f64>(o0, load<f64>(o0) + hsum(c));
    }
  }
}
