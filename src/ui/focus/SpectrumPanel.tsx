/** Spectrum of the component at its strongest channel, with the 1/f fit and the alpha peak. */
import type { ComponentEvidence } from '../../core/evidence/types.ts';
import { ExportablePanel } from '../export/ExportablePanel.tsx';
import { SpectrumPlot } from '../plots/SpectrumPlot.tsx';
import { useElementWidth } from '../plots/useElementWidth.ts';

export function SpectrumPanel({ evidence, context }: { evidence: ComponentEvidence; context: string }) {
  const { spectrum, oneOverF, alphaPeakHz, strongestChannel } = evidence;
  const top = spectrum.frequencies.length ? spectrum.frequencies[spectrum.frequencies.length - 1] : 45;
  const [box, boxWidth] = useElementWidth<HTMLDivElement>(380);
  const width = Math.max(320, Math.min(640, boxWidth));
  return (
    <ExportablePanel title="Spectrum" context={context} testId="focus-spectrum" className="panel-spectrum">
      <div ref={box} className="trace-box" />
      <SpectrumPlot
        series={[{ frequencies: spectrum.frequencies, power: spectrum.power, label: `at ${strongestChannel.label}` }]}
        oneOverF={oneOverF}
        alphaPeakHz={alphaPeakHz}
        rangeHz={[1, Math.min(60, top)]}
        width={width}
        height={Math.round(width * 0.55)}
        title={`Power spectral density at ${strongestChannel.label}`}
      />
      <p className="note">
        Welch PSD at {strongestChannel.label} (back-projected, µV²/Hz, {spectrum.df.toFixed(2)} Hz bins). 1/f exponent{' '}
        {Number.isFinite(oneOverF.exponent) ? oneOverF.exponent.toFixed(2) : 'n/a'} over {oneOverF.rangeHz[0]}–{oneOverF.rangeHz[1]} Hz;{' '}
        {alphaPeakHz === null ? 'no alpha peak.' : `alpha peak ${alphaPeakHz.toFixed(1)} Hz.`}
      </p>
    </ExportablePanel>
  );
}
