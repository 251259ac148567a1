#!/usr/bin/env node
// `npm run lint`: the module-boundary rules of DEVELOPERS.md ("Layout"), applied to every file of src/ and
// workers/ by bin/layer-rules.mjs. The type check (tsconfig.core.json etc.) keeps the DOM and node types out
// of the layers that must not use them; this keeps out the imports.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import { layerViolations } from './layer-rules.mjs';

const root = fileURLToPath(new URL('..', import.meta.url));

/** Every .ts/.tsx file under `dir`, as repository-relative POSIX paths. */
export function sourceFiles(dir = root) {
  /** @type {string[]} */
  const out = [];
  /** @param {string} d */
  const walk = (d) => {
    for (const name of readdirSync(d)) {
      const p = join(d, name);
      if (statSync(p).isDirectory()) walk(p);
      else if (/\.tsx?$/.test(name)) out.push(relative(dir, p).split(sep).join('/'));
    }
  };
  for (const top of ['src', 'workers']) walk(join(dir, top));
  return out.sort();
}

/** All violations in the repository at `dir`. */
export function checkRepository(dir = root) {
  return sourceFiles(dir).flatMap((file) => layerViolations({ file, source: readFileSync(join(dir, file), 'utf8') }));
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const bad = checkRepository();
  if (bad.length) {
    console.error(`error: ${bad.length} layering violation(s) (DEVELOPERS.md, Layout):`);
    for (const v of bad) console.error(`${v.file}:${v.line}: ${v.message}`);
    process.exit(1);
  }
  console.log('layers ok');
}
