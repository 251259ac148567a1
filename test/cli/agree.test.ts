import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdir, mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main } from '../../src/cli/winnow.ts';
import { memoryIo } from '../../src/cli/cli-support.ts';
import type { ReasonCode, Verdict } from '../../src/core/review/vocabulary.ts';
// Reference values from test/fixtures/evidence/kappa.json (made by kappa.py beside it, numpy): Cohen (1968)
// Table 1, published κ = .492 (p_o = .70, p_e = .41; that these repeat Cohen 1960's worked example is recalled
// from memory, not checked), and a computed 24-component example (κ = 0.7163).
import fixture from '../fixtures/evidence/kappa.json';

const REC = 'a'.repeat(64);
const DEC = 'b'.repeat(64);
let dir = '';

interface Entry {
  index: number;
  verdict: Verdict;
  reason?: string | null;
}

function decisions(components: Entry[], over: Record<string, unknown> = {}): string {
  return JSON.stringify({
    format: 'winnow-decisions/2',
    aim: 'erp',
    reviewer: 'r',
    createdAt: '2026-01-01T00:00:00Z',
    software: 'winnow test',
    recordingSha256: REC,
    decompositionSha256: DEC,
    components: components.map((c) => ({ index: c.index, verdict: c.verdict, reason: c.reason ?? null, note: '', suggested: null })),
    ...over,
  });
}

async function put(name: string, text: string): Promise<string> {
  const p = join(dir, name);
  await writeFile(p, text);
  return p;
}

async function agree(a: string, b: string) {
  const io = memoryIo();
  const code = await main(['agree', a, b], io);
  return { code, io, json: code === 0 ? JSON.parse(io.out) : null };
}

/** A deterministic shuffle (32-bit LCG, Numerical Recipes constants) so list order ≠ index order. */
function shuffled<T>(xs: T[], seed = 12345): T[] {
  const out = [...xs];
  let s = seed >>> 0;
  for (let i = out.length - 1; i > 0; i--) {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    const j = s % (i + 1);
    [out[i], out[j]] = [out[j], out[i]];
  }
  return out;
}

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'winnow-agree-'));
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

describe('winnow agree', () => {
  it('reproduces the Cohen worked example (N = 200, κ = .492) with components matched by index in different orders', async () => {
    const t = fixture.cohen1968_table1;
    const cats: Verdict[] = ['keep', 'remove', 'undecided'];
    const a: Entry[] = [];
    const b: Entry[] = [];
    const expectedDisagreements: number[] = [];
    let index = 1;
    for (let i = 0; i < 3; i++)
      for (let j = 0; j < 3; j++) {
        const count = Math.round(t.proportions[i][j] * t.N);
        for (let k = 0; k < count; k++, index++) {
          a.push({ index, verdict: cats[i], reason: cats[i] === 'remove' ? 'blink' : null });
          b.push({ index, verdict: cats[j], reason: cats[j] === 'remove' ? 'blink' : null });
          if (i !== j) expectedDisagreements.push(index);
        }
      }
    expect(index - 1).toBe(t.N);
    // A lists components in index order, B in a shuffled order: matching by position would give another table.
    const pa = await put('cohen-a.json', decisions(a));
    const pb = await put('cohen-b.json', decisions(shuffled(b)));
    const { code, io, json } = await agree(pa, pb);
    expect(io.err).toBe('');
    expect(code).toBe(0);
    expect(json.components).toBe(200);
    expect(json.observedAgreement).toBeCloseTo(t.computed.p_o, 12);
    expect(json.expectedAgreement).toBeCloseTo(t.computed.p_e, 12);
    expect(json.kappa).toBeCloseTo(t.computed.kappa, 12);
    expect(json.kappa.toFixed(3)).toBe(t.published_kappa.toFixed(3));
    expect(json.note).toBeUndefined();
    expect(json.disagreements).toEqual(expectedDisagreements);
    // Both removed: 40 components, all "blink" for both → reasons κ undefined, with a note.
    expect(json.reasons.components).toBe(Math.round(t.proportions[1][1] * t.N));
    expect(json.reasons.observedAgreement).toBe(1);
    expect(json.reasons.expectedAgreement).toBe(1);
    expect(json.reasons.kappa).toBeNull();
    expect(json.reasons.note).toMatch(/expected agreement is 1/);

    // Swapping the raters transposes the table: κ is unchanged.
    const swapped = await agree(pb, pa);
    expect(swapped.json.kappa).toBeCloseTo(t.computed.kappa, 12);
  });

  it('gives reasons κ = 0.7163 for the 24-component example, and null verdict κ with a note when both removed everything', async () => {
    const ex = fixture.ic_review_example;
    const toReason: Record<string, ReasonCode> = { brain: 'neural', eye: 'blink', muscle: 'muscle', heart: 'cardiac', line: 'mains', channel: 'contact', other: 'unclear' };
    const a = ex.reviewer_a.map((l, i) => ({ index: i + 1, verdict: 'remove' as const, reason: toReason[l] }));
    const b = ex.reviewer_b.map((l, i) => ({ index: i + 1, verdict: 'remove' as const, reason: toReason[l] }));
    const pa = await put('ic-a.json', decisions(shuffled(a, 7)));
    const pb = await put('ic-b.json', decisions([...b].reverse()));
    const { code, json } = await agree(pa, pb);
    expect(code).toBe(0);
    expect(json.components).toBe(24);
    expect(json.kappa).toBeNull();
    expect(json.note).toMatch(/same verdict \("remove"\).*expected agreement is 1/);
    expect(json.observedAgreement).toBe(1);
    expect(json.disagreements).toEqual([]);
    expect(json.reasons.components).toBe(24);
    expect(json.reasons.observedAgreement).toBeCloseTo(ex.p_o, 12);
    expect(json.reasons.expectedAgreement).toBeCloseTo(ex.p_e, 12);
    expect(json.reasons.kappa).toBeCloseTo(ex.kappa_from_labels, 12);
  });

  it('matches by index, not by list position (same decisions, reversed list → perfect agreement)', async () => {
    const a: Entry[] = [
      { index: 1, verdict: 'keep' },
      { index: 2, verdict: 'remove', reason: 'blink' },
      { index: 3, verdict: 'undecided' },
      { index: 4, verdict: 'remove', reason: 'muscle' },
    ];
    const pa = await put('small-a.json', decisions(a));
    const pb = await put('small-b.json', decisions([...a].reverse()));
    const { json } = await agree(pa, pb);
    expect(json.kappa).toBe(1);
    expect(json.disagreements).toEqual([]);
    expect(json.reasons.kappa).toBe(1);
  });

  it('loads a winnow-decisions/1 file (legacy reason codes mapped) against a version 2 file', async () => {
    const v2 = decisions([
      { index: 1, verdict: 'remove', reason: 'mains' },
      { index: 2, verdict: 'remove', reason: 'contact' },
      { index: 3, verdict: 'keep' },
    ]);
    const v1 = decisions(
      [
        { index: 3, verdict: 'keep' },
        { index: 2, verdict: 'remove', reason: 'electrode' },
        { index: 1, verdict: 'remove', reason: 'line-noise' },
      ],
      { format: 'winnow-decisions/1' },
    );
    const { code, json } = await agree(await put('v2.json', v2), await put('v1.json', v1));
    expect(code).toBe(0);
    expect(json.kappa).toBe(1);
    expect(json.reasons.kappa).toBe(1);
  });

  it('counts a component missing from one file as undecided, with a warning', async () => {
    const pa = await put('miss-a.json', decisions([{ index: 1, verdict: 'keep' }, { index: 2, verdict: 'remove', reason: 'blink' }]));
    const pb = await put('miss-b.json', decisions([{ index: 1, verdict: 'keep' }]));
    const { code, io, json } = await agree(pa, pb);
    expect(code).toBe(0);
    expect(json.components).toBe(2);
    expect(json.disagreements).toEqual([2]);
    expect(io.err).toMatch(/warning: .*miss-b\.json: no entry for component 2/);
  });

  it('refuses files for different recordings or decompositions (exit 2, error names the files)', async () => {
    const comps: Entry[] = [{ index: 1, verdict: 'keep' }];
    const pa = await put('hash-a.json', decisions(comps));
    for (const key of ['recordingSha256', 'decompositionSha256']) {
      const pb = await put(`hash-${key}.json`, decisions(comps, { [key]: 'c'.repeat(64) }));
      const { code, io } = await agree(pa, pb);
      expect(code).toBe(2);
      expect(io.out).toBe('');
      expect(io.err).toMatch(/^error: /);
      expect(io.err).toContain(`hash-${key}.json`);
      expect(io.err).toContain(key);
      expect(io.err).not.toMatch(/\n\s+at /);
    }
  });

  it('refuses a malformed or missing file (exit 2, error names the file)', async () => {
    const good = await put('good.json', decisions([{ index: 1, verdict: 'keep' }]));
    const cases: [string, string][] = [
      ['broken.json', '{"format": "winnow-decisions/2", '],
      ['wrong-format.json', decisions([{ index: 1, verdict: 'keep' }], { format: 'winnow-decisions/9' })],
      ['bad-verdict.json', decisions([{ index: 1, verdict: 'maybe' as Verdict }])],
    ];
    for (const [name, text] of cases) {
      const p = await put(name, text);
      const { code, io } = await agree(good, p);
      expect(code).toBe(2);
      expect(io.err).toMatch(/^error: /);
      expect(io.err).toContain(name);
    }
    const missing = await agree(join(dir, 'nope.json'), good);
    expect(missing.code).toBe(2);
    expect(missing.io.err).toMatch(/^error: .*nope\.json/);
  });

  it('needs exactly two files', async () => {
    const io = memoryIo();
    expect(await main(['agree', 'one.json'], io)).toBe(2);
    expect(io.err).toMatch(/^error: winnow agree: give exactly two decisions files/);
  });

  it('two study folders: one row per recording matched by hashes, and the pooled κ over all of them equals the Cohen example (N = 200, κ = .492)', async () => {
    const t = fixture.cohen1968_table1;
    const cats: Verdict[] = ['keep', 'remove', 'undecided'];
    // the 200 rated components split over two recordings (odd and even positions), so only the pooled table is Cohen's
    const rec: { a: Entry[]; b: Entry[] }[] = [{ a: [], b: [] }, { a: [], b: [] }];
    let n = 0;
    for (let i = 0; i < 3; i++)
      for (let j = 0; j < 3; j++)
        for (let k = 0; k < Math.round(t.proportions[i][j] * t.N); k++, n++) {
          const r = rec[n % 2];
          const index = r.a.length + 1;
          r.a.push({ index, verdict: cats[i], reason: cats[i] === 'remove' ? 'blink' : null });
          r.b.push({ index, verdict: cats[j], reason: cats[j] === 'remove' ? 'blink' : null });
        }
    const hash = (c: string) => c.repeat(64);
    const folders = ['study-a', 'study-b'].map((f) => join(dir, f));
    for (const [r, data] of rec.entries()) {
      for (const [k, folder] of folders.entries()) {
        // reviewer B's export names its files differently: matching is by hashes, never by name
        const sub = join(folder, `sub-0${r + 1}`, 'eeg');
        await mkdir(sub, { recursive: true });
        const name = k === 0 ? `sub-0${r + 1}_task-x_desc-winnow_decisions.json` : `sub-0${r + 1}_task-x_desc-second_decisions.json`;
        await writeFile(join(sub, name), decisions(k === 0 ? data.a : shuffled(data.b, 99 + r), { recordingSha256: hash(String(r + 1)), decompositionSha256: hash('d') }));
      }
    }
    // a recording only reviewer A has: reported, not compared
    await mkdir(join(folders[0], 'sub-09', 'eeg'), { recursive: true });
    await writeFile(join(folders[0], 'sub-09', 'eeg', 'sub-09_task-x_desc-winnow_decisions.json'), decisions([{ index: 1, verdict: 'keep' }], { recordingSha256: hash('9') }));
    const { code, io, json } = await agree(folders[0], folders[1]);
    expect(code, io.err).toBe(0);
    expect(json.recordings).toHaveLength(2);
    expect(json.recordings.map((r: { components: number }) => r.components)).toEqual([100, 100]);
    expect(json.pooled.recordings).toBe(2);
    expect(json.pooled.components).toBe(200);
    expect(json.pooled.observedAgreement).toBeCloseTo(t.computed.p_o, 12);
    expect(json.pooled.expectedAgreement).toBeCloseTo(t.computed.p_e, 12);
    expect(json.pooled.kappa.toFixed(3)).toBe(t.published_kappa.toFixed(3));
    expect(json.unmatched.a).toEqual(['sub-09/eeg/sub-09_task-x_desc-winnow_decisions.json']);
    expect(io.err).toMatch(/^warning: .*study-a: 1 decisions file with no counterpart/m);
  });

  it('a file and a folder, or folders without decisions files, exit 2 naming them', async () => {
    const empty = join(dir, 'empty-study');
    await mkdir(empty, { recursive: true });
    const one = await agree(empty, join(dir, 'cohen-a.json'));
    expect(one.code).toBe(2);
    expect(one.io.err).toMatch(/^error: .*not one of each/);
    const none = await agree(empty, empty);
    expect(none.code).toBe(2);
    expect(none.io.err).toMatch(/^error: .*empty-study: no \*_decisions\.json files/);
  });
});
