/**
 * How much of each channel's variance the component carries (ComponentEvidence.variancePerChannel, 0…1),
 * as a scalp map on a sequential scale: where removing it would change the recording most.
 */
import { ExportablePanel } from '../export/ExportablePanel.tsx';
import { TopographyMap } from '../plots/TopographyMap.tsx';

export interface VarianceMapPanelProps {
  readonly index: number;
  readonly shares: Float64Array;
  readonly positions: Float64Array;
  readonly drawable: boolean;
  readonly labels: readonly string[];
  readonly context: string;
}

export function VarianceMapPanel({ index, shares, positions, drawable, labels, context }: VarianceMapPanelProps) {
  let top = 0;
  for (let c = 1; c < shares.length; c++) if ((shares[c] ?? -1) > (shares[top] ?? -1)) top = c;
  const topShare = shares[top];
  return (
    <ExportablePanel title="Variance per channel" context={context} testId="focus-variance-map" className="panel-variance-map">
      {drawable ? (
        <TopographyMap
          weights={shares} positionsUnit={positions} size={125} title={`Share of each channel's variance carried by component ${index}`}
          labels={labels} colourBar unit="share" scale="sequential"
        />
      ) : (
        <p>No electrode positions, so no map.</p>
      )}
      <p className="note">
        Share of each channel's variance this component carries (A²·var(s) / var(x)).{' '}
        {Number.isFinite(topShare) ? `Most at ${labels[top] ?? '?'}: ${Math.round(topShare * 100)}\u00a0%.` : ''}
      </p>
    </ExportablePanel>
  );
}
