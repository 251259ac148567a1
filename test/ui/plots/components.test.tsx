/**
 * Static rendering of the plot components in node (react-dom/server; no DOM, so raster pictures render as
 * empty image links). Checks what the reviewer must always see: outline, dots, markers, cautions, units.
 */
import { describe, expect, it } from 'vitest';
import { renderToStaticMarkup } from 'react-dom/server';
import { SpectrumSparkline } from '../../../src/ui/plots/SpectrumSparkline.tsx';
import { TopographyMap } from '../../../src/ui/plots/TopographyMap.tsx';
import { EvidenceTable } from '../../../src/ui/plots/EvidenceTable.tsx';
import { evidenceRows } from '../../../src/ui/plots/evidence-rows.ts';
import { DipoleViews } from '../../../src/ui/plots/DipoleViews.tsx';
import { ErpPlot } from '../../../src/ui/plots/ErpPlot.tsx';
import { syntheticEvidence } from './synthetic-evidence.ts';

// Idealised 10-20 directions (docs/methods.md §10): Fpz, Oz, T7, T8, Cz, plus one channel without a position.
const positions = Float64Array.from([0, 0.951057, 0.309017, 0, -0.951057, 0.309017, -0.951057, 0, 0.309017, 0.951057, 0, 0.309017, 0, 0, 1, NaN, NaN, NaN]);

describe('TopographyMap', () => {
  const html = renderToStaticMarkup(
    <TopographyMap weights={Float64Array.from([1, -1, 0.5, -0.5, 0, 0])} positionsUnit={positions} size={120} title="map of IC 3" colourBar unit="a.u." />,
  );
  it('draws one dot per electrode with a known position', () => {
    expect(html.match(/<circle/g)?.length).toBe(5);
  });
  it('draws the head outline with nose and ears, and the colour bar with its unit', () => {
    expect(html.match(/<path/g)?.length).toBe(3);
    expect(html).toContain('class="colour-scale"');
    expect(html).toContain('a.u.');
    expect(html).toContain('aria-label="map of IC 3"');
  });
});

describe('SpectrumSparkline', () => {
  it('marks the alpha peak and the 1/f fit and says so in words', () => {
    const html = renderToStaticMarkup(<SpectrumSparkline evidence={syntheticEvidence()} />);
    expect(html).toContain('stroke-dasharray="3 2"');
    expect(html).toContain('<circle');
    expect(html).toContain('alpha peak 10.0 Hz');
    expect(html).toContain('1/f exponent 2.00');
  });
  it('draws no alpha marker without a peak', () => {
    const html = renderToStaticMarkup(<SpectrumSparkline evidence={syntheticEvidence(1, { alphaPeakHz: null })} />);
    expect(html).not.toContain('<circle');
    expect(html).toContain('no alpha peak');
  });
});

describe('EvidenceTable', () => {
  it('renders every evidence row and marks flagged values with a symbol as well as a class', () => {
    const focality = { measure: 'focality.share', value: 0.7, threshold: 0.6, direction: '≥' as const, source: 'common practice' as const };
    const rows = evidenceRows(syntheticEvidence(), { suggestion: { verdict: 'remove', reason: 'contact', because: [] }, rules: [focality] });
    const html = renderToStaticMarkup(<EvidenceTable rows={rows} />);
    expect(html.match(/<tr/g)?.length).toBe(rows.length + 1);
    expect(html).toContain('▲ 70.0');
  });
  it('escapes text that came from a file', () => {
    const rows = evidenceRows(syntheticEvidence(1, { strongestChannel: { index: 0, label: '<img src=x>', weight: 1 } }));
    const html = renderToStaticMarkup(<EvidenceTable rows={rows} />);
    expect(html).not.toContain('<img');
    expect(html).toContain('&lt;img src=x&gt;');
  });
});

describe('DipoleViews', () => {
  it('shows residual variance, region and the model-estimate caution', () => {
    const html = renderToStaticMarkup(<DipoleViews dipole={syntheticEvidence().dipole!} />);
    expect(html).toContain('4.0\u00a0%'); // a non-breaking space keeps % with its number
    expect(html).toContain('frontal, midline, superficial');
    // the caution once per figure, as its caption (issue 15: it was repeated three times)
    expect(html.match(/model estimate/gi)).toHaveLength(1);
    expect(html).toContain('<p class="caution note">Approximate model estimate');
    expect(html).toContain('from above');
  });
});

describe('ErpPlot', () => {
  it('draws both series with different dash patterns and a legend', () => {
    const t = [0, 0.1, 0.2];
    const html = renderToStaticMarkup(<ErpPlot times={t} series={[{ values: [0, 1, 2], label: 'before' }, { values: [0, 0.5, 1], label: 'after' }]} />);
    expect(html).toContain('>before<');
    expect(html).toContain('>after<');
    expect(html).toContain('stroke-dasharray="5 3"');
  });
});

describe('TopographyMap on the sequential scale (shares 0 … 1)', () => {
  const html = renderToStaticMarkup(
    <TopographyMap weights={Float64Array.from([0.1, 0.9, 0.3, 0.2, 0.5, NaN])} positionsUnit={positions} size={120} colourBar unit="share" scale="sequential" maxAbs={1} />,
  );
  it('says so and labels its bar from 0 to the top, never negative', () => {
    expect(html).toContain('data-scale="sequential"');
    const ticks = [...html.matchAll(/<text x="5" dy="0.32em"[^>]*>([^<]*)<\/text>/g)].map((m) => m[1]);
    expect(ticks[0]).toBe('0');
    expect(ticks[ticks.length - 1]).toBe('1');
    expect(ticks.some((t) => t.startsWith('−') || t.startsWith('-'))).toBe(false);
  });
});

describe('EvidenceTable, compact', () => {
  it('folds the unit into the value and the source and threshold under them (two columns)', () => {
    const html = renderToStaticMarkup(
      <EvidenceTable compact rows={[{ key: 'hf', label: 'High-frequency share', value: '40.0', unit: '%', threshold: '≥ 35 % (ours)', source: 'BP ratio', flagged: true, rules: [] }]} />,
    );
    expect(html.match(/<th scope="col">/g)?.length).toBe(2);
    expect(html).toContain('▲ 40.0\u00a0%');
    expect(html).toContain('<span class="threshold">≥ 35 % (ours)</span>');
    expect(html).toContain('class="flagged"');
  });
});

describe('TrialStack split by a column', () => {
  it('fences and names each block of rows', async () => {
    const { TrialStack } = await import('../../../src/ui/plots/TrialStack.tsx');
    const times = Float64Array.from([-0.1, 0, 0.1]);
    const rows = { rows: new Float64Array(12), order: [0, 1, 2, 3], keys: new Float64Array(4).fill(NaN), sortApplied: 'order' as const };
    const html = renderToStaticMarkup(
      <TrialStack rows={rows} nEpochs={4} length={3} times={times} maxAbs={1} groups={[{ label: 'standard', start: 0, count: 3 }, { label: 'rare', start: 3, count: 1 }]} />,
    );
    expect(html).toContain('standard (3)');
    expect(html).toContain('rare (1)');
    expect(html.match(/stroke-width="1.5"/g)?.length).toBe(1); // one fence between two blocks
  });
});

describe('SensorPicker', () => {
  it('shows the chosen channels as chips, offers the others to add, and draws the usable electrodes', async () => {
    const { SensorPicker } = await import('../../../src/ui/plots/SensorPicker.tsx');
    const labels = ['Fpz', 'Oz', 'T7', 'T8', 'Cz', 'X1'];
    const html = renderToStaticMarkup(
      <SensorPicker label="Sensors" labels={labels} positions={positions} usable={(c) => c !== 3} selected={[4, 0]} onChange={() => {}} />,
    );
    expect(html).toContain('aria-label="remove Cz"');
    expect(html).toContain('aria-label="remove Fpz"');
    expect(html).toContain('<option value="1">Oz</option>');
    expect(html).not.toContain('<option value="3">T8</option>'); // not usable
    expect(html).not.toContain('<option value="4">'); // already chosen
    // dots for the usable channels with a position: Fpz, Oz, T7, Cz (T8 unusable, X1 has none)
    expect(html.match(/<circle/g)?.length).toBe(4);
  });
  it('toggles a channel, keeping at most `max` (the oldest goes)', async () => {
    const { toggleChannel } = await import('../../../src/ui/plots/SensorPicker.tsx');
    expect(toggleChannel([1, 2], 2, 3)).toEqual([1]);
    expect(toggleChannel([1, 2], 5, 3)).toEqual([1, 2, 5]);
    expect(toggleChannel([1, 2, 5], 7, 3)).toEqual([2, 5, 7]);
  });
});
