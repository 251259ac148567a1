/** The region of interest shows the channels in use as chips, not a short list box that hides them (issue 15). */
import { describe, expect, it } from 'vitest';
import { renderToStaticMarkup } from 'react-dom/server';
import { RegionControls } from '../../../src/ui/preview/RegionControls.tsx';

describe('RegionControls', () => {
  it('shows every channel of the region as a chip, whatever their number', () => {
    const channels = ['Fp1', 'T7', 'C3', 'Cz', 'P3', 'Pz'];
    const html = renderToStaticMarkup(
      <RegionControls channels={channels} rows={Int32Array.from([0, 1, 2, 3, 4, 5])} regionRows={[5, 3, 4]} events={[]} eventLabel={null} />,
    );
    for (const l of ['Pz', 'Cz', 'P3']) expect(html).toContain(`aria-label="remove ${l}"`);
    expect(html).not.toContain('aria-label="remove T7"');
    expect(html).not.toContain('multiple');
  });
});
