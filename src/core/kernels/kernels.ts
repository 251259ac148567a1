/**
 * The per-sample kernels of Winnow behind one interface, with two implementations that agree to float32
 * tolerance (test/core/kernels/kernels.test.ts):
 *   - 'wasm-simd': asm/kernels.ts compiled by AssemblyScript to WebAssembly with 128-bit SIMD (f32x4 lanes),
 *     float32 arithmetic inside a tile, float64 sums across tiles (wasm-kernels.ts);
 *   - 'js': the register-blocked plain-JS loops (linalg/matmul.ts, ica/fast-tanh.ts), float64 arithmetic.
 *
 * Core stays pure: it never reads files or fetches. The host hands the compiled module (or its bytes) to
 * installKernelModule — the CLI and the bench read build/wasm/kernels.wasm (src/cli/wasm-kernels.ts), the page's
 * workers fetch it through a Vite `?url` import. Without a module, or where WebAssembly SIMD is missing
 * (simdSupported: WebAssembly.validate of a tiny SIMD module), the JS kernels are used.
 * Each thread has its own active kernels; helper threads get the module with their setup (pass-threads.ts).
 */
import { accumulateProductTransposed, multiplyChannelMajor, SAMPLE_TILE } from '../linalg/matmul.ts';
import { fastLogCosh, fastTanh } from '../ica/fast-tanh.ts';
import { createWasmKernels, type WasmApi, type WasmModuleHandle } from './wasm-kernels.ts';

/** Unnormalised sums of one Picard data pass over samples [t0, t1) (see ica/picard-pass.ts). */
export interface PassSums {
  readonly logcosh: Float64Array;
  readonly sech2: Float64Array;
  readonly gTanh: Float64Array;
}

export interface Kernels {
  readonly name: 'wasm-simd' | 'js';
  /** Unit roundoff of the per-sample arithmetic: 2⁻²⁴ (float32 lanes) or 2⁻⁵³ (float64). */
  readonly unitRoundoff: number;
  /**
   * out (k × (end − start), channel-major, row i at out[i·(end − start)]) = W (k × n, row-major) · X[:, start:end]
   * for channel-major X (n × nSamples).
   */
  multiply(W: Float64Array, k: number, n: number, X: Float32Array, nSamples: number, out: Float32Array | Float64Array, start?: number, end?: number): void;
  /**
   * Adds to `out` over samples [t0, t1) of Z (k × T) with Y = W Z: logcosh_i += Σ ln cosh y_i,
   * sech2_i += Σ (1 − tanh² y_i), gTanh_ij += Σ tanh(y_i) y_j. `poll` every 32 tiles; true stops (returns false).
   */
  passSums(Z: Float32Array, k: number, T: number, W: Float64Array, t0: number, t1: number, out: PassSums, poll?: () => boolean): boolean;
  /** out (n × n) += Σ_t X[:, t] X[:, t]ᵀ over samples [t0, t1) of channel-major X (n × T); no centring. */
  accumulateGram(X: Float32Array, n: number, T: number, t0: number, t1: number, out: Float64Array): void;
  /**
   * The data part of one extended-Infomax block (≤ 512 samples [t0, t0 + b) of Z, U = W Z, density signs K):
   * sets M = Σ_t (K tanh U + U) Uᵀ (k × k), th2_i = Σ_t tanh² u_i, u2_i = Σ_t u_i², tu_i = Σ_t tanh(u_i) u_i.
   * Only the wasm kernels have it; the JS path keeps infomax.ts's own fused loop.
   */
  infomaxBlock?(W: Float64Array, k: number, Z: Float32Array, T: number, t0: number, b: number, K: Float64Array, M: Float64Array, th2: Float64Array, u2: Float64Array, tu: Float64Array): void;
}

/** The plain-JS kernels (float64 arithmetic). */
export function createJsKernels(): Kernels {
  let Ytile = new Float64Array(0);
  let Ptile = new Float64Array(0);
  const scratch = (k: number) => {
    if (Ytile.length < k * SAMPLE_TILE) {
      Ytile = new Float64Array(k * SAMPLE_TILE);
      Ptile = new Float64Array(k * SAMPLE_TILE);
    }
  };
  return {
    name: 'js',
    unitRoundoff: 2 ** -53,
    multiply: (W, k, n, X, nSamples, out, start = 0, end = nSamples) => multiplyChannelMajor(W, k, n, X, nSamples, out, start, end),
    passSums(Z, k, T, W, t0, t1, out, poll) {
      scratch(k);
      let tiles = 0;
      for (let a = t0; a < t1; a += SAMPLE_TILE) {
        const b = Math.min(t1, a + SAMPLE_TILE);
        const len = b - a;
        multiplyChannelMajor(W, k, k, Z, T, Ytile, a, b);
        // The kernel writes rows with stride `len`; the accumulation below reads stride SAMPLE_TILE.
        if (len !== SAMPLE_TILE) for (let i = k - 1; i >= 0; i--) Ytile.copyWithin(i * SAMPLE_TILE, i * len, i * len + len);
        for (let i = 0; i < k; i++) {
          let lc = 0;
          let s2 = 0;
          const o = i * SAMPLE_TILE;
          for (let t = 0; t < len; t++) {
            const y = Ytile[o + t];
            const th = fastTanh(y);
            Ptile[o + t] = th;
            s2 += th * th;
            lc += fastLogCosh(y);
          }
          out.logcosh[i] += lc;
          out.sech2[i] += len - s2;
        }
        accumulateProductTransposed(Ptile, SAMPLE_TILE, k, Ytile, SAMPLE_TILE, k, len, out.gTanh);
        if (poll && ++tiles % 32 === 0 && poll()) return false;
      }
      return true;
    },
    accumulateGram(X, n, T, t0, t1, out) {
      const tile = new Float64Array(n * SAMPLE_TILE);
      for (let a = t0; a < t1; a += SAMPLE_TILE) {
        const len = Math.min(SAMPLE_TILE, t1 - a);
        for (let i = 0; i < n; i++) for (let t = 0; t < len; t++) tile[i * SAMPLE_TILE + t] = X[i * T + a + t];
        accumulateProductTransposed(tile, SAMPLE_TILE, n, tile, SAMPLE_TILE, n, len, out);
      }
    },
  };
}

/*
 * A tiny module whose one function uses a v128 instruction: (func (result v128) v128.const i32x4 0 0 0 0).
 * Validation succeeds exactly where the engine implements fixed-width SIMD (the usual feature probe).
 */
const SIMD_PROBE = new Uint8Array([
  0x00, 0x61, 0x73, 0x6d, 0x01, 0x00, 0x00, 0x00, // magic, version 1
  0x01, 0x05, 0x01, 0x60, 0x00, 0x01, 0x7b, // type section: () → v128
  0x03, 0x02, 0x01, 0x00, // function section: one function of type 0
  0x0a, 0x16, 0x01, 0x14, 0x00, 0xfd, 0x0c, // code: body of 20 bytes, no locals, v128.const
  0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0x0b, // 16 immediate bytes, end
]);

function wasmApi(): WasmApi | undefined {
  return (globalThis as unknown as { WebAssembly?: WasmApi }).WebAssembly;
}

/** True when this engine runs WebAssembly with fixed-width SIMD. */
export function simdSupported(): boolean {
  const api = wasmApi();
  try {
    return api !== undefined && api.validate(SIMD_PROBE);
  } catch {
    return false;
  }
}

const js = createJsKernels();
let active: Kernels = js;
let activeModule: WasmModuleHandle | null = null;

/** The kernels this thread uses now ('js' until a module is installed). */
export function activeKernels(): Kernels {
  return active;
}

/** The installed compiled module (to hand to helper threads), or null. */
export function installedKernelModule(): WasmModuleHandle | null {
  return activeModule;
}

/**
 * Makes the wasm kernels this thread's active kernels, from a compiled WebAssembly.Module or the .wasm bytes.
 * Falls back to (and returns) the JS kernels where WebAssembly SIMD is missing or the module cannot be
 * instantiated; `reason` then says why.
 */
export function installKernelModule(moduleOrBytes: WasmModuleHandle | Uint8Array | null): { kernels: Kernels; reason?: string } {
  const api = wasmApi();
  if (moduleOrBytes === null) {
    active = js;
    activeModule = null;
    return { kernels: js, reason: 'no kernel module given' };
  }
  if (!api || !simdSupported()) {
    active = js;
    activeModule = null;
    return { kernels: js, reason: 'WebAssembly SIMD is not available here' };
  }
  try {
    const mod = moduleOrBytes instanceof Uint8Array ? new api.Module(moduleOrBytes) : moduleOrBytes;
    active = createWasmKernels(api, mod);
    activeModule = mod;
    return { kernels: active };
  } catch (e) {
    active = js;
    activeModule = null;
    return { kernels: js, reason: `the kernel module could not be instantiated: ${(e as Error).message}` };
  }
}

/** Back to the plain-JS kernels (tests compare the two). */
export function useJsKernels(): Kernels {
  active = js;
  activeModule = null;
  return js;
}
