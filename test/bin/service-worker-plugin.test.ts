/**
 * The offline cache's build step (bin/service-worker-plugin.ts): sw.js lists every built file but source maps,
 * and its cache name changes whenever a cached file's bytes change (a versioned cache, so a new build never
 * serves an old file). The browser behaviour is covered by e2e/offline.spec.ts.
 */
import { describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { CACHE_PREFIX, serviceWorkerPlugin, serviceWorkerSource } from '../../bin/service-worker-plugin.ts';

type Bundle = Record<string, { type: 'chunk'; code: string } | { type: 'asset'; source: string | Uint8Array }>;

/** Runs the plugin's generateBundle on a fake bundle; returns the emitted sw.js text. */
function emitted(bundle: Bundle, publicDir: string): string {
  const plugin = serviceWorkerPlugin(publicDir);
  let out = '';
  const ctx = { emitFile: (f: { fileName: string; source: string }) => ((out = f.fileName === 'sw.js' ? f.source : out), 'id') };
  (plugin.generateBundle as unknown as (this: typeof ctx, o: unknown, b: Bundle) => void).call(ctx, {}, bundle);
  return out;
}

describe('service worker build step', () => {
  const pub = mkdtempSync(join(tmpdir(), 'winnow-sw-'));
  writeFileSync(join(pub, 'favicon.svg'), '<svg xmlns="http://www.w3.org/2000/svg"/>');
  const bundle: Bundle = {
    'assets/index-abc.js': { type: 'chunk', code: 'console.log(1)' },
    'assets/index-abc.js.map': { type: 'asset', source: '{}' },
    'assets/sub-01_eeg-xyz.edf': { type: 'asset', source: new Uint8Array([0x30, 0x20]) },
    'methods.html': { type: 'asset', source: '<p>methods</p>' },
  };

  it('lists the page, every chunk and asset (the demo recording included) and the public files, not source maps', () => {
    const sw = emitted(bundle, pub);
    const files = JSON.parse(/const FILES = (\[.*\]);/.exec(sw)![1]) as string[];
    expect(files).toEqual(['assets/index-abc.js', 'assets/sub-01_eeg-xyz.edf', 'favicon.svg', 'index.html', 'methods.html']);
    expect(sw).toMatch(new RegExp(`const CACHE = "${CACHE_PREFIX}[0-9a-f]{16}";`));
    expect(() => new Function(sw)).not.toThrow(); // parses as a script (not run: it needs a worker global)
  });

  it('gives a new cache name when any cached byte changes, the same one when nothing does', () => {
    const name = (b: Bundle) => /const CACHE = "([^"]+)"/.exec(emitted(b, pub))![1];
    const a = name(bundle);
    expect(name({ ...bundle })).toBe(a);
    expect(name({ ...bundle, 'assets/sub-01_eeg-xyz.edf': { type: 'asset', source: new Uint8Array([0x30, 0x21]) } })).not.toBe(a);
    expect(name({ ...bundle, 'assets/index-abc.js.map': { type: 'asset', source: '{"changed":1}' } })).toBe(a); // maps are not cached
    rmSync(pub, { recursive: true, force: true });
  });

  it('keeps only its own caches: old builds are deleted by prefix, other caches of the origin are left alone', () => {
    const sw = serviceWorkerSource('0123456789abcdef', ['index.html']);
    expect(sw).toContain(`k.startsWith(${JSON.stringify(CACHE_PREFIX)}) && k !== CACHE`);
    expect(sw).toContain("if (url.origin !== scope.origin) return;"); // other origins: never touched
  });
});
