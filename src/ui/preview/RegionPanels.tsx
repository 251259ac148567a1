/**
 * Beside the traces: the region's ERP before/after (or band power for the oscillations aim), and the
 * region's spectra before/after over the whole recording (computed in a worker) or the shown window.
 */
import type { Aim } from '../../core/review/vocabulary.ts';
import { ExportablePanel } from '../export/ExportablePanel.tsx';
import { ErpPlot } from '../plots/ErpPlot.tsx';
import { SpectrumPlot } from '../plots/SpectrumPlot.tsx';
import { peakInWindow } from '../plots/erp-geometry.ts';
import { formatValue, regionBandPower, type RegionSpectra } from './preview-logic.ts';

export interface RegionErpPanelProps {
  readonly times: Float64Array | null;
  readonly before: Float64Array | null;
  readonly after: Float64Array | null;
  readonly nEpochs: number;
  readonly eventLabel: string | null;
  readonly regionLabel: string;
  readonly windowS: readonly [number, number];
  /** The epochs are still being computed. */
  readonly pending?: boolean;
}

/** ERP at the region before and after, with the peak in the measurement window printed as numbers. */
export function RegionErpPanel({ times, before, after, nEpochs, eventLabel, regionLabel, windowS, pending = false }: RegionErpPanelProps) {
  const pb = times && before ? peakInWindow(times, before, windowS[0], windowS[1]) : null;
  const pa = times && after ? peakInWindow(times, after, windowS[0], windowS[1]) : null;
  return (
    <ExportablePanel title="ERP before / after" context="preview" className="panel-region-erp">
      {times && before && after ? (
        <ErpPlot
          times={times}
          series={[{ values: before, label: 'before' }, { values: after, label: 'after' }]}
          windowS={windowS}
          width={340}
          height={160}
          title={`ERP at ${regionLabel}`}
        />
      ) : (
        <p>
          {pending
            ? 'Averaging the epochs…'
            : eventLabel
              ? `No complete epoch around “${eventLabel}”.`
              : 'No events in this recording, so no ERP.'}
        </p>
      )}
      <dl className="region-figures">
        <dt>Peak {windowS[0]}–{windowS[1]} s before</dt>
        <dd><span data-testid="preview-erp-before">{pending ? '…' : formatValue(pb?.value ?? NaN, 3)}</span> µV</dd>
        <dt>after</dt>
        <dd><span data-testid="preview-erp-after">{pending ? '…' : formatValue(pa?.value ?? NaN, 3)}</span> µV</dd>
      </dl>
      <p className="note">
        Mean of {regionLabel}; {nEpochs} epochs around “{eventLabel ?? '—'}”, −0.2 to 0.8 s, baseline −0.2–0 s. The whole recording is
        averaged, not just the shown window.
      </p>
    </ExportablePanel>
  );
}

/** What the spectra average: the whole recording, or the window shown beside them. */
export type SpectraScope = 'recording' | 'window';

export interface RegionSpectraPanelProps {
  readonly spectra: RegionSpectra | null;
  readonly aim: Aim;
  readonly bandHz: readonly [number, number];
  readonly regionLabel: string;
  readonly scope?: SpectraScope;
  readonly onScope?: (scope: SpectraScope) => void;
  /** Newer spectra are being computed (the ones shown belong to the previous verdicts). */
  readonly pending?: boolean;
  readonly error?: string | null;
}

/** Spectra of the region before/after; band power before/after for the oscillations aim. */
export function RegionSpectraPanel({ spectra, aim, bandHz, regionLabel, scope = 'window', onScope, pending = false, error = null }: RegionSpectraPanelProps) {
  const bp = spectra ? regionBandPower(spectra, bandHz) : null;
  const controls = onScope ? (
    <label>
      Over{' '}
      <select value={scope} onChange={(e) => onScope(e.target.value as SpectraScope)} data-testid="preview-spectra-scope">
        <option value="recording">the whole recording</option>
        <option value="window">the shown window</option>
      </select>
    </label>
  ) : undefined;
  return (
    <ExportablePanel title="Spectra before / after" context="preview" className="panel-region-spectra" controls={controls}>
      {spectra ? (
        <SpectrumPlot
          series={[
            { frequencies: spectra.frequencies, power: spectra.before, label: 'before' },
            { frequencies: spectra.frequencies, power: spectra.after, label: 'after' },
          ]}
          width={340}
          height={170}
          title={`Spectra at ${regionLabel}`}
        />
      ) : (
        <p>{error ?? (scope === 'recording' ? 'Computing the spectra of the whole recording…' : 'The window is too short for a spectrum.')}</p>
      )}
      {bp ? (
        <dl className={`region-figures ${aim === 'oscillations' ? 'emphasis' : ''}`}>
          <dt>Band power {bandHz[0]}–{bandHz[1]} Hz before</dt>
          <dd><span data-testid="preview-band-before">{formatValue(bp.before, 3)}</span> µV²</dd>
          <dt>after</dt>
          <dd><span data-testid="preview-band-after">{formatValue(bp.after, 3)}</span> µV²</dd>
        </dl>
      ) : null}
      <p className="note" data-testid="preview-spectra-note" aria-busy={pending}>
        Welch PSD of the mean of {regionLabel} over {scope === 'recording' ? 'the whole recording' : 'the shown window'}
        {pending && spectra ? ' (updating…)' : ''}.
      </p>
    </ExportablePanel>
  );
}
