/**
 * The rule for reusing a batch run's evidence file (issue 11): only evidence of the very files opened — same
 * format version, same recording and decomposition (SHA-256 of their bytes), same components and channels —
 * is loaded; what is loaded gives the same suggestions, with the same fired rules, as the evidence written.
 */
import { describe, expect, it } from 'vitest';
import { formatEvidenceJson, parseEvidenceJson, type EvidenceFile } from '../../../src/core/formats/evidence-file.ts';
import { matchBatchEvidence, type LoadedFacts } from '../../../src/core/study/batch-evidence.ts';
import { suggestWithRules } from '../../../src/core/review/suggest.ts';
import { defaultThresholds } from '../../../src/core/review/thresholds.ts';
import { syntheticEvidence } from '../../ui/plots/synthetic-evidence.ts';

const R = 'a'.repeat(64);
const D = 'b'.repeat(64);
const header = {
  recording: 'sub-01_task-a_eeg.edf', decomposition: 'sub-01_task-a_desc-winnow_decomposition.json', recordingSha256: R, decompositionSha256: D,
  aim: 'erp' as const, lineHz: 50, lineHzSource: 'sidecar', epochEvent: 'stimulus', epochWindowS: [-0.2, 0.8] as const, thresholds: defaultThresholds, warnings: [],
};
const written = [syntheticEvidence(1), syntheticEvidence(2, { erp: null, dipole: null, alphaPeakHz: null, alphaProminence: 0, timeLocking: [] })];
const loaded: LoadedFacts = { recordingSha256: R, decompositionSha256: D, nComponents: 2, channels: ['Fz', 'Cz', 'Oz'], sampleRate: 256 };

function file(text = formatEvidenceJson(header, written)): EvidenceFile {
  const r = parseEvidenceJson(text, 'e.json');
  if (!r.ok) throw new Error(r.error.message);
  return r.value;
}

describe('batch evidence reuse', () => {
  it('loads evidence of the same recording and decomposition, equal to what was written (trial stacks are not in the file)', () => {
    const f = file();
    expect(f.recordingSha256).toBe(R);
    expect(f.decompositionSha256).toBe(D);
    const m = matchBatchEvidence(f, loaded);
    if (!m.ok) throw new Error(m.why);
    expect(m.evidence).toHaveLength(2);
    m.evidence.forEach((e, k) => {
      const w = written[k];
      expect(e.trialStack).toBeNull();
      expect(e.cardiac.bpm).toBe(w.cardiac.bpm);
      expect(e.cardiac.peak).toBe(w.cardiac.peak);
      expect({ ...e, trialStack: w.trialStack, cardiac: w.cardiac }).toEqual(w);
      // the suggestions and fired rules of every aim are those of the evidence written
      for (const aim of ['erp', 'oscillations', 'conservative'] as const) expect(suggestWithRules(e, aim, defaultThresholds)).toEqual(suggestWithRules(w, aim, defaultThresholds));
    });
  });

  it('refuses another recording, another decomposition, a file without hashes, another format, other components or channels, naming why', () => {
    const why = (f: EvidenceFile, facts: LoadedFacts = loaded) => {
      const m = matchBatchEvidence(f, facts);
      return m.ok ? 'matched' : m.why;
    };
    expect(why(file(), { ...loaded, recordingSha256: 'c'.repeat(64) })).toBe('made for another recording (SHA-256 aaaaaaaaaaaa…, this one is cccccccccccc…)');
    expect(why(file(), { ...loaded, decompositionSha256: 'c'.repeat(64) })).toBe('made for another decomposition (SHA-256 bbbbbbbbbbbb…, this one is cccccccccccc…)');
    const { recordingSha256: _r, decompositionSha256: _d, ...older } = header;
    expect(why(file(formatEvidenceJson(older, written)))).toMatch(/does not record the hashes/);
    expect(why({ ...file(), format: 'winnow-evidence/2' as EvidenceFile['format'] })).toMatch(/^format "winnow-evidence\/2", this version reads winnow-evidence\/1$/);
    expect(why(file(), { ...loaded, nComponents: 3 })).toBe('2 components, the decomposition has 3');
    expect(why(file(), { ...loaded, channels: ['Fz', 'Cz'] })).toBe('component 1: its map has 3 values for 2 channels');
    expect(why(file(), { ...loaded, channels: ['Fz', 'Cz', 'O2'] })).toBe('component 1: its strongest channel Oz is not channel 3 of the decomposition');
    // a file from before the per-channel variance was written
    const json = JSON.parse(formatEvidenceJson(header, written)) as { components: Record<string, unknown>[] };
    for (const c of json.components) delete c.variancePerChannel;
    expect(why(file(JSON.stringify(json)))).toBe('component 1: no variance per channel for these channels (written by an older version)');
  });
});
