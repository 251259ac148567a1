// Source: the project's contributor guide, DEVELOPERS.md "Layout" (the module-boundary table): core imports
// only core and pure libraries; workers only src/core and comlink; bridge comlink, core and types from
// workers; state core and bridge; ui never loads a worker at run time; cli core and node only.
import { describe, expect, it } from 'vitest';
import { layerViolations, parseImports } from '../../bin/layer-rules.mjs';
import { checkRepository } from '../../bin/check-layers.mjs';

const specifiers = (file: string, source: string) => layerViolations({ file, source }).map((v) => v.specifier);

describe('layer rules (DEVELOPERS.md, Layout)', () => {
  it('reports core importing react, node:fs, another src/ folder or a worker', () => {
    const source = [
      "import { useState } from 'react';",
      "import { readFileSync } from 'node:fs';",
      "import path from 'path';",
      "import { store } from '../state/x.ts';",
      "export { thing } from '../../workers/recording.worker.ts';",
      "const ui = await import('../ui/App.tsx');",
      "import type { Slice } from '../state/slices.ts';",
    ].join('\n');
    expect(specifiers('src/core/bad.ts', source)).toEqual([
      'react',
      'node:fs',
      'path',
      '../state/x.ts',
      '../../workers/recording.worker.ts',
      '../ui/App.tsx',
      '../state/slices.ts',
    ]);
  });

  it('lets core import core and pure libraries', () => {
    const source = "import FFT from 'fft.js';\nimport { Matrix } from 'ml-matrix';\nimport { matmul } from '../linalg/matmul.ts';\nimport type { Hz } from '../units.ts';";
    expect(layerViolations({ file: 'src/core/signal/ok.ts', source })).toEqual([]);
  });

  it('reports a worker importing state, zustand or react', () => {
    const source = "import { useStore } from '../src/state/index.ts';\nimport { create } from 'zustand';\nimport { expose } from 'comlink';\nimport { welch } from '../src/core/signal/welch.ts';";
    expect(specifiers('workers/x.worker.ts', source)).toEqual(['../src/state/index.ts', 'zustand']);
  });

  it('reports ui loading a worker at run time, but not a type import from one', () => {
    const source = [
      "import { run } from '../../workers/decomposition.worker.ts';",
      "import type { DecompositionApi } from '../../workers/decomposition.worker.ts';",
      "import { type EvidenceApi } from '../../workers/evidence.worker.ts';",
      "const w = new Worker(new URL('../../workers/projection.worker.ts', import.meta.url));",
      "const m = import('../../workers/recording.worker.ts');",
    ].join('\n');
    expect(specifiers('src/ui/Board.tsx', source)).toEqual([
      '../../workers/decomposition.worker.ts',
      '../../workers/projection.worker.ts',
      '../../workers/recording.worker.ts',
    ]);
  });

  it('lets bridge start workers by URL and import their types, but not their values', () => {
    const source = [
      "import * as Comlink from 'comlink';",
      "import type { EvidenceApi } from '../../workers/evidence.worker.ts';",
      "const w = new Worker(new URL('../../workers/evidence.worker.ts', import.meta.url), { type: 'module' });",
      "import { compute } from '../../workers/evidence.worker.ts';",
      "import { useStore } from '../state/index.ts';",
    ].join('\n');
    expect(specifiers('src/bridge/evidence-client.ts', source)).toEqual(['../../workers/evidence.worker.ts', '../state/index.ts']);
  });

  it('reports state importing ui or workers', () => {
    const source = "import { create } from 'zustand';\nimport { Board } from '../ui/board/Board.tsx';\nimport type { Api } from '../../workers/evidence.worker.ts';\nimport { client } from '../bridge/evidence-client.ts';";
    expect(specifiers('src/state/slice.ts', source)).toEqual(['../ui/board/Board.tsx', '../../workers/evidence.worker.ts']);
  });

  it('reports cli importing ui, state, bridge or workers, not core or node', () => {
    const source = [
      "import { readFile } from 'node:fs/promises';",
      "import { writeEdf } from '../core/formats/edf-writer.ts';",
      "import { store } from '../state/index.ts';",
      "import { App } from '../ui/App.tsx';",
      "import { client } from '../bridge/evidence-client.ts';",
      "import type { Api } from '../../workers/evidence.worker.ts';",
    ].join('\n');
    expect(specifiers('src/cli/bad.ts', source)).toEqual(['../state/index.ts', '../ui/App.tsx', '../bridge/evidence-client.ts', '../../workers/evidence.worker.ts']);
  });

  it('reports cli importing the EDF reader instead of going through recording-files.ts', () => {
    const source = [
      "import { readEdfInfo } from '../core/formats/edf.ts';",
      "import { parseEdfHeader } from '../core/formats/edf-header.ts';",
      "import type { SampleReader } from '../core/formats/edf-samples.ts';",
      "export { readEdfSignals } from '../core/formats/edf.ts';",
      "import { loadRecording } from '../core/formats/recording-loader.ts';",
      "import { writeEdf } from '../core/formats/edf-writer.ts';",
      "import { parseTal } from '../core/formats/tal.ts';",
      "import { openRecording } from './recording-files.ts';",
    ].join('\n');
    const found = layerViolations({ file: 'src/cli/read.ts', source });
    expect(found.map((v) => v.specifier)).toEqual([
      '../core/formats/edf.ts',
      '../core/formats/edf-header.ts',
      '../core/formats/edf-samples.ts',
      '../core/formats/edf.ts',
    ]);
    expect(found[0].message).toContain('src/cli/recording-files.ts');
    // The rule is the CLI's: core (the loader itself) still reads through the EDF modules.
    expect(layerViolations({ file: 'src/core/formats/recording-loader.ts', source: "import { readEdfInfo } from './edf.ts';" })).toEqual([]);
  });

  it('parses every import form and tells type-only ones apart', () => {
    const refs = parseImports(
      'src/x.ts',
      "import a from 'a';\nimport type { B } from 'b';\nexport * from 'c';\nexport type { D } from 'd';\nimport('e');\ntype F = import('f').F;\nnew URL('./g.worker.ts', import.meta.url);\n// import h from 'h';\nconst s = \"import i from 'i'\";",
    );
    expect(refs.map((r) => [r.specifier, r.typeOnly, r.kind])).toEqual([
      ['a', false, 'import'],
      ['b', true, 'import'],
      ['c', false, 'export'],
      ['d', true, 'export'],
      ['e', false, 'dynamic'],
      ['f', true, 'import'],
      ['./g.worker.ts', false, 'url'],
    ]);
  });

  it('finds no violation in this repository', () => {
    expect(checkRepository()).toEqual([]);
  });
});
