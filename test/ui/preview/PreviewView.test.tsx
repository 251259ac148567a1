import { describe, expect, it } from 'vitest';
import { renderToStaticMarkup } from 'react-dom/server';
import { PreviewView } from '../../../src/ui/preview/PreviewView.tsx';
import { RegionErpPanel } from '../../../src/ui/preview/RegionPanels.tsx';

describe('PreviewView', () => {
  it('renders its test hook and a hint before a participant is open', () => {
    const html = renderToStaticMarkup(<PreviewView />);
    expect(html).toContain('data-testid="preview-view"');
  });
});

describe('RegionErpPanel', () => {
  it('prints the ERP peaks in the measurement window before and after as numbers for the e2e hooks', () => {
    const times = Float64Array.from([0, 0.1, 0.2, 0.3, 0.4]);
    const before = Float64Array.from([0, 1, 4, -6, 2]);
    const after = Float64Array.from([0, 1, 3, -2.5, 2]);
    const html = renderToStaticMarkup(
      <RegionErpPanel times={times} before={before} after={after} nEpochs={12} eventLabel="tone" regionLabel="Pz" windowS={[0.15, 0.35]} />,
    );
    expect(html).toContain('<span data-testid="preview-erp-before">-6.000</span>');
    expect(html).toContain('<span data-testid="preview-erp-after">3.000</span>');
  });
  it('says n/a when there are no events', () => {
    const html = renderToStaticMarkup(
      <RegionErpPanel times={null} before={null} after={null} nEpochs={0} eventLabel={null} regionLabel="Pz" windowS={[0.25, 0.5]} />,
    );
    expect(html).toContain('<span data-testid="preview-erp-before">n/a</span>');
    expect(html).toContain('No events');
  });
});
