/** Scalp map of the component with electrode dots, head outline and colour bar. */
import { ExportablePanel } from '../export/ExportablePanel.tsx';
import { TopographyMap } from '../plots/TopographyMap.tsx';

export interface MapPanelProps {
  readonly index: number;
  readonly map: Float64Array;
  readonly positions: Float64Array;
  readonly drawable: boolean;
  readonly labels: readonly string[];
  readonly context: string;
  /** Drawn head size in px (default 200). */
  readonly size?: number;
}

export function MapPanel({ index, map, positions, drawable, labels, context, size = 200 }: MapPanelProps) {
  return (
    <ExportablePanel title="Scalp map" context={context} testId="focus-topography" className="panel-map">
      {drawable ? (
        <TopographyMap weights={map} positionsUnit={positions} size={size} title={`Component ${index} scalp map`} labels={labels} colourBar unit="a.u." />
      ) : (
        <p>No electrode positions for this recording, so no scalp map can be drawn.</p>
      )}
      <p className="note">
        Painted over the electrodes only. Polarity is arbitrary (the sign can flip with the time course). Nose at the top, left
        ear on the left.
      </p>
    </ExportablePanel>
  );
}
