/** Vite `?url` imports of the built WebAssembly kernels (build/wasm/*.wasm): the asset's URL. */
declare module '*.wasm?url' {
  const url: string;
  export default url;
}
