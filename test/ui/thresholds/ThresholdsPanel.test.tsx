/**
 * The thresholds panel as rendered (react-dom/server): one row per threshold of review/thresholds.ts with its
 * value, default, source and a link to its docs/methods.md section; a changed threshold is marked and counted.
 */
import { renderToStaticMarkup } from 'react-dom/server';
import { afterEach, describe, expect, it } from 'vitest';
import { defaultThresholds, thresholdSources } from '../../../src/core/review/thresholds.ts';
import { workbenchStore } from '../../../src/state/index.ts';
import { ThresholdsPanel, ThresholdsView } from '../../../src/ui/thresholds/ThresholdsPanel.tsx';

afterEach(() => workbenchStore.setState(workbenchStore.getInitialState(), true));

describe('ThresholdsPanel', () => {
  it('lists every threshold with its source and methods section', () => {
    const html = renderToStaticMarkup(<ThresholdsPanel onClose={() => {}} />);
    const keys = Object.keys(defaultThresholds) as (keyof typeof defaultThresholds)[];
    expect(html.match(/data-testid="threshold-row-/g)).toHaveLength(keys.length);
    for (const k of keys) {
      const row = html.slice(html.indexOf(`data-testid="threshold-row-${k}"`)).split('</tr>')[0];
      expect(row).toContain(`value="${defaultThresholds[k]}"`);
      expect(row).toContain(`<td>${thresholdSources[k]}</td>`);
      expect(row).toMatch(/href="methods\.html#s\d+"/);
    }
    expect(html).toContain('All thresholds at their defaults.');
    expect(html).toContain('not for clinical diagnosis');
  });

  it('marks and counts a changed threshold', () => {
    const thresholds = { mainsShare: 0.3 };
    const html = renderToStaticMarkup(<ThresholdsView thresholds={thresholds} current={() => thresholds} setThresholds={() => {}} onClose={() => {}} />);
    expect(html).toContain(`1 of ${Object.keys(defaultThresholds).length} thresholds differ from the defaults.`);
    const row = html.slice(html.indexOf('data-testid="threshold-row-mainsShare"')).split('</tr>')[0];
    expect(row).toContain('class="changed"');
    expect(row).toContain('value="0.3"');
  });
});
