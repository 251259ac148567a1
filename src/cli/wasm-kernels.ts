/**
 * Node side of the WebAssembly SIMD kernels (src/core/kernels/kernels.ts): reads build/wasm/kernels.wasm
 * (built from asm/kernels.ts by `npm install` / `npm run build:wasm`), compiles it and installs it as this
 * thread's kernels. Core never reads the file itself. Without the file, or without WebAssembly SIMD, the
 * plain-JS kernels stay and `reason` says why.
 */
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { installKernelModule, type Kernels } from '../core/kernels/kernels.ts';

/** The build output (a data file read at run time, not a module import). */
export const KERNEL_WASM_PATH = join(dirname(fileURLToPath(import.meta.url)), '..', '..', 'build', 'wasm', 'kernels.wasm');

let loaded: WebAssembly.Module | null | undefined;

/** The compiled kernel module, or null when build/wasm/kernels.wasm is missing or does not compile. */
export function loadKernelModule(): WebAssembly.Module | null {
  if (loaded !== undefined) return loaded;
  try {
    loaded = new WebAssembly.Module(readFileSync(KERNEL_WASM_PATH));
  } catch {
    loaded = null;
  }
  return loaded;
}

/** Installs the wasm kernels on this thread when possible; returns what is active and why not wasm. */
export function installNodeKernels(): { kernels: Kernels; reason?: string } {
  const mod = loadKernelModule();
  if (mod === null) return { ...installKernelModule(null), reason: `${KERNEL_WASM_PATH} is missing (run npm run build:wasm)` };
  return installKernelModule(mod);
}
