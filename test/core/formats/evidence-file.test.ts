import { describe, expect, it } from 'vitest';
import { EVIDENCE_FORMAT, formatEvidenceJson, parseEvidenceJson } from '../../../src/core/formats/evidence-file.ts';
import { suggestWithRules } from '../../../src/core/review/suggest.ts';
import { defaultThresholds } from '../../../src/core/review/thresholds.ts';
import { syntheticEvidence } from '../../ui/plots/synthetic-evidence.ts';

const header = {
  recording: 'sub-01_eeg.edf', decomposition: 'dec.json', aim: 'oscillations' as const, lineHz: 60, lineHzSource: 'sidecar',
  epochEvent: 'stimulus', epochWindowS: [-0.2, 0.8] as const, thresholds: defaultThresholds, warnings: ['w'],
};

describe('evidence file (winnow-evidence/1)', () => {
  const components = [syntheticEvidence(1), syntheticEvidence(2, { oneOverF: { exponent: NaN, offset: 1, rangeHz: [2, 40], fitR2: NaN }, erp: null })];
  const text = formatEvidenceJson(header, components);

  it('writes one JSON line with NaN as null, and reads back what it wrote', () => {
    expect(text.endsWith('}\n')).toBe(true);
    expect(text.split('\n')).toHaveLength(2);
    const r = parseEvidenceJson(text, 'e.json');
    if (!r.ok) throw new Error(r.error.message);
    expect(r.warnings).toEqual([]);
    const f = r.value;
    expect(f).toMatchObject({ format: EVIDENCE_FORMAT, aim: 'oscillations', lineHz: 60, lineHzSource: 'sidecar', epochEvent: 'stimulus', epochWindowS: [-0.2, 0.8], warnings: ['w'] });
    expect(f.components.map((c) => c.index)).toEqual([1, 2]);
    expect(f.components[1].oneOverFExponent).toBeNull();
    expect(f.permutations).toEqual({
      maxShuffles: 999, stopAfter: 10,
      components: [{ index: 1, shuffles: 999, fitR2: 0.95 }, { index: 2, shuffles: null, fitR2: null }],
    });
  });

  it('computes the suggestion of every aim with its fired rules at writing time', () => {
    const r = parseEvidenceJson(text, 'e.json');
    if (!r.ok) throw new Error(r.error.message);
    for (const aim of ['erp', 'oscillations', 'conservative'] as const) {
      const expected = suggestWithRules(components[0], aim, defaultThresholds);
      const got = r.value.components[0].suggestions[aim];
      expect(got.verdict).toBe(expected.suggestion.verdict);
      expect(got.reason).toBe(expected.suggestion.reason);
      expect(got.rules).toEqual(expected.rules);
    }
    expect(r.value.components[0].suggestion).toEqual(r.value.components[0].suggestions.oscillations);
  });

  it('names the file and the fault for bad input', () => {
    const bad = (t: string) => {
      const r = parseEvidenceJson(t, 'x.json');
      return r.ok ? '' : r.error.message;
    };
    expect(bad('{')).toMatch(/^x\.json: not JSON/);
    expect(bad('{"format":"other"}')).toMatch(/x\.json: format must be "winnow-evidence\/1"/);
    const o = JSON.parse(text);
    o.components[1].suggestions.erp.verdict = 'maybe';
    expect(bad(JSON.stringify(o))).toMatch(/x\.json: component 2: suggestions\.erp\.verdict must be keep, remove or undecided/);
  });

  it('reads files written before the permutations record, with a warning', () => {
    const o = JSON.parse(text);
    delete o.permutations;
    const r = parseEvidenceJson(JSON.stringify(o), 'old.json');
    expect(r.ok && r.warnings[0]).toMatch(/old\.json: no permutations record/);
  });
});
