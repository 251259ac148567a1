import { describe, expect, it } from 'vitest';
import {
  buildDecisionsFile, decisionsFromFile, formatDecisionsJson, formatDecisionsTsv, parseDecisionsJson, parseDecisionsTsv,
  type ReviewDecision,
} from '../../../src/core/review/decisions-file.ts';
import type { Suggestion } from '../../../src/core/review/vocabulary.ts';

const decisions: Record<number, ReviewDecision> = {
  1: { verdict: 'remove', reason: 'blink', note: 'classic blink map\nr = 0.9 with "VEOG"' },
  3: { verdict: 'keep', reason: 'neural', note: '' },
  4: { verdict: 'undecided', reason: 'unclear', note: '=HYPERLINK("x") \\ back\tslash' },
};
const suggestion = (i: number): Suggestion | null =>
  i === 1 ? { verdict: 'remove', reason: 'blink', because: ['map 71 % frontal'] } : null;

const file = buildDecisionsFile({
  aim: 'erp', reviewer: 'A. Reviewer', createdAt: '2026-12-02T00:00:00.000Z', software: 'winnow 0.1.0',
  recordingSha256: 'a'.repeat(64), decompositionSha256: 'b'.repeat(64), nComponents: 5, decisions, suggestions: suggestion,
});

describe('decisions file (issue 7 contract)', () => {
  it('lists every component 1…n with the contract fields in order', () => {
    const json = JSON.parse(formatDecisionsJson(file));
    expect(Object.keys(json)).toEqual(['format', 'aim', 'reviewer', 'createdAt', 'software', 'recordingSha256', 'decompositionSha256', 'components']);
    expect(json.format).toBe('winnow-decisions/2');
    expect(json.components.map((c: { index: number }) => c.index)).toEqual([1, 2, 3, 4, 5]);
    expect(json.components[0]).toEqual({
      index: 1, verdict: 'remove', reason: 'blink', note: decisions[1].note,
      suggested: { verdict: 'remove', reason: 'blink', because: ['map 71 % frontal'] },
    });
    expect(json.components[1]).toEqual({ index: 2, verdict: 'undecided', reason: null, note: '', suggested: null });
  });

  it('restores exactly the same decisions from its JSON (round trip)', () => {
    const parsed = parseDecisionsJson(formatDecisionsJson(file), 'd.json');
    expect(parsed.ok).toBe(true);
    if (!parsed.ok) return;
    expect(parsed.value).toEqual(file);
    expect(decisionsFromFile(parsed.value)).toEqual(decisions);
  });

  it('restores the same decisions from its TSV, notes with line breaks, tabs and formulas included', () => {
    const tsv = formatDecisionsTsv(file);
    expect(tsv.split('\n')[0]).toBe('index\tverdict\treason\tnote');
    // OWASP "CSV injection": a cell starting with = is written with a leading apostrophe (common practice).
    expect(tsv).toContain("'=HYPERLINK");
    expect(tsv.trimEnd().split('\n')).toHaveLength(6);
    const parsed = parseDecisionsTsv(tsv, 'd.tsv');
    expect(parsed.ok && parsed.value).toEqual(decisions);
  });

  it('names the file and the field when the JSON breaks the contract', () => {
    const bad = (patch: object) => parseDecisionsJson(JSON.stringify({ ...JSON.parse(formatDecisionsJson(file)), ...patch }), 'x.json');
    const r1 = bad({ format: 'other/1' });
    expect(!r1.ok && r1.error.message).toMatch(/^x\.json: "format"/);
    const r2 = bad({ aim: 'sleep' });
    expect(!r2.ok && r2.error.message).toMatch(/"aim"/);
    const r3 = bad({ components: [{ index: 1, verdict: 'maybe', reason: null, note: '' }] });
    expect(!r3.ok && r3.error.message).toMatch(/components\[0\]\.verdict/);
    const r4 = bad({ components: [{ index: 2, verdict: 'keep', reason: 'ghost', note: '' }] });
    expect(!r4.ok && r4.error.message).toMatch(/reason/);
    const r5 = parseDecisionsJson('{not json', 'y.json');
    expect(!r5.ok && r5.error.message).toMatch(/^y\.json: not valid JSON/);
  });

  it('rejects a TSV without the contract columns', () => {
    const r = parseDecisionsTsv('index\tverdict\n1\tkeep\n', 'z.tsv');
    expect(!r.ok && r.error.code).toBe('missing-column');
  });

  it('loads a winnow-decisions/1 file, mapping its reason codes to today\'s words', () => {
    const v1 = {
      format: 'winnow-decisions/1', aim: 'erp', reviewer: 'B', createdAt: '2026-01-01T00:00:00Z', software: 'winnow 0.1.0',
      recordingSha256: 'a'.repeat(64), decompositionSha256: 'b'.repeat(64),
      components: [
        { index: 1, verdict: 'remove', reason: 'eye-movement', note: '', suggested: { verdict: 'remove', reason: 'line-noise', because: [] } },
        { index: 2, verdict: 'remove', reason: 'electrode', note: '', suggested: null },
        { index: 3, verdict: 'remove', reason: 'motion', note: '', suggested: null },
      ],
    };
    const r = parseDecisionsJson(JSON.stringify(v1), 'old.json');
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value.format).toBe('winnow-decisions/2');
    expect(r.value.components.map((c) => c.reason)).toEqual(['gaze', 'contact', 'movement']);
    expect(r.value.components[0].suggested?.reason).toBe('mains');
    // A version 2 file must use today's words: the old codes are refused there.
    expect(parseDecisionsJson(JSON.stringify({ ...v1, format: 'winnow-decisions/2' }), 'new.json').ok).toBe(false);
  });

  it('loads a file written by a script with only the required fields, warning about the optional ones', () => {
    const minimal = { format: 'winnow-decisions/2', aim: 'oscillations', recordingSha256: 'a'.repeat(64), decompositionSha256: 'b'.repeat(64),
      components: [{ index: 2, verdict: 'remove', reason: 'muscle' }, { index: 1, verdict: 'keep' }] };
    const r = parseDecisionsJson(JSON.stringify(minimal), 'script.json');
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.warnings.join('\n')).toMatch(/script\.json: no "reviewer"/);
    expect(r.warnings).toHaveLength(3);
    expect(decisionsFromFile(r.value)).toEqual({ 1: { verdict: 'keep', reason: null, note: '' }, 2: { verdict: 'remove', reason: 'muscle', note: '' } });
    const noHash = parseDecisionsJson(JSON.stringify({ ...minimal, recordingSha256: undefined }), 'script.json');
    expect(!noHash.ok && noHash.error.message).toMatch(/"recordingSha256"/);
  });
});
