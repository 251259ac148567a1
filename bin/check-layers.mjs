#!/usr/bin/env node
// Layering rule (DEVELOPERS.md): src/core is pure numeric/IO code. It may not import React, zustand,
// comlink, d3-selection or anything from src/ui, src/state, src/bridge or workers, and may not touch the DOM.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';

const forbidden = [/from ['"]react/, /from ['"]zustand/, /from ['"]comlink/, /from ['"][./]*\.\.\/(ui|state|bridge)\//, /\bdocument\.(createElement|querySelector|getElementById|body|addEventListener)/, /\bwindow\.(addEventListener|location|localStorage|sessionStorage|navigator|document)/, /\blocalStorage\b/];
const bad = [];
function walk(dir) {
  for (const name of readdirSync(dir)) {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) walk(p);
    else if (/\.tsx?$/.test(name)) {
      const text = readFileSync(p, 'utf8');
      for (const re of forbidden) if (re.test(text)) bad.push(`${p}: matches ${re}`);
    }
  }
}
walk(new URL('../src/core', import.meta.url).pathname);
if (bad.length) {
  console.error(`error: src/core must stay free of UI, state and DOM code:\n${bad.join('\n')}`);
  process.exit(1);
}
console.log('layers ok');
