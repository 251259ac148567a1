import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import { serviceWorkerPlugin } from './bin/service-worker-plugin.ts';
import { methodsPagePlugin } from './bin/methods-page.mjs';

/**
 * Cross-origin isolation (COOP + COEP) lets the page share one copy of the recording with the workers
 * through a SharedArrayBuffer. The Content-Security-Policy allows only the page's own origin, so a
 * recording never leaves the machine. A static host must send the same three headers (see DEVELOPERS.md).
 */
export const securityHeaders: Record<string, string> = {
  'Cross-Origin-Opener-Policy': 'same-origin',
  'Cross-Origin-Embedder-Policy': 'require-corp',
  'Content-Security-Policy':
    "default-src 'self'; script-src 'self' 'wasm-unsafe-eval'; worker-src 'self' blob:; style-src 'self' 'unsafe-inline'; " +
    "img-src 'self' data: blob:; connect-src 'self'; font-src 'self'; object-src 'none'; base-uri 'self'; form-action 'self'",
};

// The dev server needs inline scripts and a websocket for hot reload; it is still limited to this origin.
const devHeaders: Record<string, string> = {
  ...securityHeaders,
  'Content-Security-Policy':
    "default-src 'self'; script-src 'self' 'unsafe-inline' 'wasm-unsafe-eval'; worker-src 'self' blob:; style-src 'self' 'unsafe-inline'; " +
    "img-src 'self' data: blob:; connect-src 'self' ws://localhost:* ws://127.0.0.1:*; object-src 'none'",
};

export default defineConfig({
  plugins: [react(), methodsPagePlugin(), serviceWorkerPlugin('public')], // sw.js: the offline cache (bin/service-worker-plugin.ts)
  publicDir: 'public',
  server: { headers: devHeaders, port: 5173 },
  preview: { headers: securityHeaders, port: 4173 },
  worker: { format: 'es' },
  build: { target: 'es2022', sourcemap: true },
});
