/**
 * The WebAssembly SIMD kernels (asm/kernels.ts) behind the Kernels interface of kernels.ts. The data stay in
 * JavaScript memory (a recording is never copied whole); each tile of samples is copied into the module's
 * linear memory, worked on there in float32 with f32x4 lanes, and its sums come back as float64. Tiles are
 * TILE samples (a 64-channel tile is 128 KiB per buffer, three buffers stay in L2); the last tile is
 * zero-padded to a multiple of 8 samples, which adds nothing to the sums but a ln cosh(0) error < 1e-7.
 */
import type { Kernels, PassSums } from './kernels.ts';

/** The parts of the host's WebAssembly API used here (core has no DOM or node types). */
export interface WasmApi {
  validate(bytes: Uint8Array): boolean;
  Module: new (bytes: Uint8Array) => WasmModuleHandle;
  Instance: new (module: WasmModuleHandle, imports?: object) => { readonly exports: unknown };
}

/** A compiled WebAssembly.Module (opaque here; structured-cloneable to workers). */
export type WasmModuleHandle = object;

interface KernelExports {
  memory: { buffer: ArrayBuffer; grow(pages: number): number };
  heapBase(): number;
  multiply(W: number, k: number, n: number, X: number, ldx: number, Y: number, ldy: number, len: number): void;
  tanhSums(Y: number, P: number, k: number, ld: number, len: number, lc: number, th2: number): void;
  accumulateAbT(A: number, lda: number, k: number, B: number, ldb: number, m: number, len: number, out: number): void;
  infomaxNonlin(Y: number, F: number, K: number, k: number, ld: number, len: number, th2: number, u2: number, tu: number): void;
}

/** Samples per tile of the wasm kernels (a multiple of 8). */
export const WASM_TILE = 512;

export function createWasmKernels(api: WasmApi, module: WasmModuleHandle): Kernels {
  const inst = new api.Instance(module, {
    env: {
      abort: () => {
        throw new Error('kernel module aborted');
      },
    },
  });
  const ex = inst.exports as KernelExports;
  const base = ex.heapBase();
  let f32 = new Float32Array(ex.memory.buffer);
  let f64 = new Float64Array(ex.memory.buffer);
  /** Makes the linear memory at least `bytes` long above the heap base. */
  const ensure = (bytes: number) => {
    const need = base + bytes;
    const have = ex.memory.buffer.byteLength;
    if (need > have) ex.memory.grow(Math.ceil((need - have) / 65536));
    if (f32.buffer !== ex.memory.buffer || f32.length === 0) {
      f32 = new Float32Array(ex.memory.buffer);
      f64 = new Float64Array(ex.memory.buffer);
    }
  };
  /** Byte layout of one call: consecutive 16-byte-aligned blocks above the heap base. */
  const layout = (sizes: number[]): number[] => {
    const out: number[] = [];
    let p = base;
    for (const s of sizes) {
      out.push(p);
      p += (s + 15) & ~15;
    }
    ensure(p - base);
    return out;
  };
  /** Copies rows [0, rows) of samples [a, a + len) of channel-major X (rows × T) into a tile at byte `dst`, padding to `padTo`. */
  const loadTile = (X: Float32Array, rows: number, T: number, a: number, len: number, dst: number, padTo: number) => {
    const d = dst >> 2;
    for (let i = 0; i < rows; i++) {
      const o = d + i * WASM_TILE;
      f32.set(X.subarray(i * T + a, i * T + a + len), o);
      if (padTo > len) f32.fill(0, o + len, o + padTo);
    }
  };
  const putWeights = (W: Float64Array, count: number, dst: number) => {
    const d = dst >> 2;
    for (let i = 0; i < count; i++) f32[d + i] = W[i];
  };

  return {
    name: 'wasm-simd',
    unitRoundoff: 2 ** -24,
    multiply(W, k, n, X, nSamples, out, start = 0, end = nSamples) {
      const m = end - start;
      if (m <= 0 || k <= 0) return;
      if (n === 0) {
        out.fill(0, 0, k * m);
        return;
      }
      const [pW, pX, pY] = layout([4 * k * n, 4 * n * WASM_TILE, 4 * k * WASM_TILE]);
      putWeights(W, k * n, pW);
      for (let a = start; a < end; a += WASM_TILE) {
        const len = Math.min(WASM_TILE, end - a);
        const len8 = (len + 7) & ~7;
        loadTile(X, n, nSamples, a, len, pX, len8);
        ex.multiply(pW, k, n, pX, WASM_TILE, pY, WASM_TILE, len8);
        const y = pY >> 2;
        for (let i = 0; i < k; i++) {
          const src = f32.subarray(y + i * WASM_TILE, y + i * WASM_TILE + len);
          out.set(src, i * m + (a - start));
        }
      }
    },
    passSums(Z, k, T, W, t0, t1, out: PassSums, poll) {
      const [pW, pZ, pY, pP, pLc, pTh, pG] = layout([4 * k * k, 4 * k * WASM_TILE, 4 * k * WASM_TILE, 4 * k * WASM_TILE, 8 * k, 8 * k, 8 * k * k]);
      putWeights(W, k * k, pW);
      f64.fill(0, pLc >> 3, (pLc >> 3) + k);
      f64.fill(0, pTh >> 3, (pTh >> 3) + k);
      f64.fill(0, pG >> 3, (pG >> 3) + k * k);
      let tiles = 0;
      let ok = true;
      let a = t0;
      for (; a < t1; a += WASM_TILE) {
        const len = Math.min(WASM_TILE, t1 - a);
        const len8 = (len + 7) & ~7;
        loadTile(Z, k, T, a, len, pZ, len8);
        ex.multiply(pW, k, k, pZ, WASM_TILE, pY, WASM_TILE, len8);
        ex.tanhSums(pY, pP, k, WASM_TILE, len8, pLc, pTh);
        ex.accumulateAbT(pP, WASM_TILE, k, pY, WASM_TILE, k, len8, pG);
        if (poll && ++tiles % 32 === 0 && poll()) {
          ok = false;
          a += WASM_TILE;
          break;
        }
      }
      const counted = Math.min(a, t1) - t0;
      for (let i = 0; i < k; i++) {
        out.logcosh[i] += f64[(pLc >> 3) + i];
        out.sech2[i] += counted - f64[(pTh >> 3) + i];
      }
      const g = pG >> 3;
      for (let i = 0; i < k * k; i++) out.gTanh[i] += f64[g + i];
      return ok;
    },
    infomaxBlock(W, k, Z, T, t0, b, K, M, th2, u2, tu) {
      if (b > WASM_TILE) throw new RangeError(`infomaxBlock takes at most ${WASM_TILE} samples, got ${b}`);
      const [pW, pZ, pY, pF, pK, pS, pM] = layout([4 * k * k, 4 * k * WASM_TILE, 4 * k * WASM_TILE, 4 * k * WASM_TILE, 8 * k, 3 * 8 * k, 8 * k * k]);
      putWeights(W, k * k, pW);
      f64.set(K.subarray(0, k), pK >> 3);
      const s = pS >> 3;
      f64.fill(0, s, s + 3 * k);
      f64.fill(0, pM >> 3, (pM >> 3) + k * k);
      const b8 = (b + 7) & ~7;
      loadTile(Z, k, T, t0, b, pZ, b8);
      ex.multiply(pW, k, k, pZ, WASM_TILE, pY, WASM_TILE, b8);
      ex.infomaxNonlin(pY, pF, pK, k, WASM_TILE, b8, pS, pS + 8 * k, pS + 16 * k);
      ex.accumulateAbT(pF, WASM_TILE, k, pY, WASM_TILE, k, b8, pM);
      M.set(f64.subarray(pM >> 3, (pM >> 3) + k * k));
      th2.set(f64.subarray(s, s + k));
      u2.set(f64.subarray(s + k, s + 2 * k));
      tu.set(f64.subarray(s + 2 * k, s + 3 * k));
    },
    accumulateGram(X, n, T, t0, t1, out) {
      const [pX, pG] = layout([4 * n * WASM_TILE, 8 * n * n]);
      const g = pG >> 3;
      f64.fill(0, g, g + n * n);
      for (let a = t0; a < t1; a += WASM_TILE) {
        const len = Math.min(WASM_TILE, t1 - a);
        const len8 = (len + 7) & ~7;
        loadTile(X, n, T, a, len, pX, len8);
        ex.accumulateAbT(pX, WASM_TILE, n, pX, WASM_TILE, n, len8, pG);
      }
      for (let i = 0; i < n * n; i++) out[i] += f64[g + i];
    },
  };
}
