/**
 * Before/after preview of the cleaned signal: stacked sensor traces of a scrollable window on canvas,
 * original and cleaned overlaid or side by side, following every verdict change live. A change of the
 * removed set updates the cleaned window incrementally (± a_i s_i, src/core/review/preview-projection.ts)
 * and repaints the canvas straight from the store subscription, without waiting for React; the time from
 * the store change to the repainted canvas is recorded as the performance measure
 * "winnow:toggle-to-repaint" (and "winnow:toggle-update" for the arithmetic alone, "winnow:toggle-to-frame"
 * up to the next animation frame) and shown under the traces.
 *
 * data-testid hooks for the end-to-end tests:
 *   preview-view               the whole view (section)
 *   preview-traces             the traces canvas
 *   preview-cleaned-checksum   8 hex digits: checksum of the cleaned window (changes when the removed set changes)
 *   preview-removed-count      number of components currently removed
 *   preview-erp-before         ERP peak in the ROI window before cleaning (µV, three decimals; "n/a" without
 *                              epochs; "…" for the moment the epochs are being averaged after opening)
 *   preview-erp-after          the same after cleaning
 *   preview-band-before, preview-band-after   band power in the ROI band (µV², three decimals)
 *   preview-update-ms          last measured toggle-to-repaint time (ms)
 *   preview-mode               overlay / side-by-side toggle button
 */
import { useEffect, useMemo, useRef, useState } from 'react';
import type { Decomposition } from '../../core/decomposition.ts';
import type { LoadedRecording } from '../../core/recording.ts';
import { applyRemovedSet, removedVarianceShare, windowChecksum } from '../../core/review/preview-projection.ts';
import { type RegionErpPlan, regionErpAfter, regionErpPlan, regionMean } from '../../core/review/region-erp.ts';
import { useWorkbench, workbenchStore, type ReviewDecision } from '../../state/index.ts';
import { ExportablePanel } from '../export/ExportablePanel.tsx';
import { decompositionMontage } from '../plots/montage-positions.ts';
import { TopographyMap } from '../plots/TopographyMap.tsx';
import { TracePlot } from '../plots/TracePlot.tsx';
import { drawTraces, type TraceSpec } from '../plots/trace-draw.ts';
import { clampWindowStart, markerEvents, niceScaleNearest, robustRowSpan } from '../plots/trace-layout.ts';
import { useElementWidth } from '../plots/useElementWidth.ts';
import { ComponentStrip } from './ComponentStrip.tsx';
import { ResidualNotice } from './ResidualNotice.tsx';
import { PreviewToolbar, type PreviewSettings } from './PreviewToolbar.tsx';
import { RegionErpPanel, RegionSpectraPanel, type SpectraScope } from './RegionPanels.tsx';
import { RegionControls } from './RegionControls.tsx';
import {
  defaultTraceChannels,
  eventOnsets,
  defaultEventLabel,
  regionChannels,
  regionSpectra,
  removedSetFromDecisions,
} from './preview-logic.ts';
import { usePreviewWindow } from './usePreviewWindow.ts';
import { useWholeSpectra } from './useWholeSpectra.ts';
import './preview.css';

export function PreviewView() {
  const recording = useWorkbench((s) => s.recording);
  const decomposition = useWorkbench((s) => s.decomposition);
  if (!recording || !decomposition) {
    return (
      <section className="preview-view" data-testid="preview-view" aria-label="Cleaned signal preview">
        <p>Open a participant to preview the cleaned signal.</p>
      </section>
    );
  }
  // A new participant starts a fresh workspace (window, channel selection) rather than reusing indices.
  return <PreviewWorkspace key={participantKey(recording, decomposition)} recording={recording} decomposition={decomposition} />;
}

const participantIds = new WeakMap<object, number>();
let nextParticipantId = 1;
/** A stable key per (recording, decomposition) pair of objects. */
function participantKey(recording: LoadedRecording, decomposition: Decomposition): string {
  for (const o of [recording, decomposition]) if (!participantIds.has(o)) participantIds.set(o, nextParticipantId++);
  return `${participantIds.get(recording)}-${participantIds.get(decomposition)}`;
}

function PreviewWorkspace({ recording, decomposition }: { recording: LoadedRecording; decomposition: Decomposition }) {
  const aim = useWorkbench((s) => s.aim);
  const roi = useWorkbench((s) => s.roi);
  const montage = decompositionMontage(recording, decomposition);
  const { rows } = montage;
  const fs = recording.signals.sampleRate;
  const durationS = recording.signals.nSamples / fs;
  const n = decomposition.nChannels;
  const k = decomposition.nComponents;

  const [settings, setSettings] = useState<PreviewSettings>(() => ({
    startS: 0,
    lengthS: 10,
    channels: defaultTraceChannels(rows, 16),
    mode: 'overlay',
    uvPerDiv: null,
    markers: null,
  }));
  const startS = clampWindowStart(settings.startS, settings.lengthS, durationS);
  const start = Math.round(startS * fs);
  const end = Math.min(recording.signals.nSamples, start + Math.round(settings.lengthS * fs));
  const { win, original, length } = usePreviewWindow(recording, decomposition, rows, start, end);

  // --- live incremental update, repainted straight from the store subscription -------------------------
  const canvas = useRef<HTMLCanvasElement | null>(null);
  const specRef = useRef<TraceSpec | null>(null);
  // Bumped after each applied change (the cleaned window is updated in place); carries the removed set.
  const [applied, setApplied] = useState<{ version: number; removed: ReadonlySet<number> }>({ version: 0, removed: new Set() });
  const version = applied.version;
  const [updateMs, setUpdateMs] = useState<number | null>(null);
  useEffect(() => {
    if (!win) return;
    const sync = (d: Readonly<Record<number, ReviewDecision>>, initial: boolean) => {
      performance.mark('winnow:toggle');
      const removedNow = removedSetFromDecisions(d, k);
      const toggled = applyRemovedSet(win, decomposition.mixing, removedNow);
      if (toggled === 0 && !initial) return;
      performance.measure('winnow:toggle-update', 'winnow:toggle');
      if (canvas.current && specRef.current) drawTraces(canvas.current, specRef.current);
      const m = performance.measure('winnow:toggle-to-repaint', 'winnow:toggle');
      // The figures beside the traces (checksum, ERP, spectra, variance map) re-render after the frame that
      // shows the new traces, so React's work never delays that frame.
      requestAnimationFrame(() => {
        performance.measure('winnow:toggle-to-frame', 'winnow:toggle');
        setTimeout(() => {
          if (!initial) setUpdateMs(m.duration);
          setApplied((a) => ({ version: a.version + 1, removed: removedNow }));
        }, 0);
      });
    };
    sync(workbenchStore.getState().decisions, true);
    return workbenchStore.subscribe((s, prev) => {
      if (s.decisions !== prev.decisions) sync(s.decisions, false);
    });
  }, [win, decomposition, k]);

  // --- traces ------------------------------------------------------------------------------------------
  const [tracesBox, tracesWidth] = useElementWidth<HTMLDivElement>(900);
  // µV per division (one row spacing): the reviewer's choice, else ±3 robust SD, the nearest 1-2-5 value.
  const autoSpan = useMemo(() => niceScaleNearest(robustRowSpan(original, n, length)), [original, n, length]);
  const uvPerDiv = settings.uvPerDiv ?? autoSpan;
  const spec = useMemo((): TraceSpec | null => {
    if (!win) return null;
    const labels = settings.channels.map((c) => decomposition.channels[c]);
    const side = settings.mode === 'side-by-side';
    return {
      width: Math.max(480, tracesWidth),
      // 26 px per row for a few channels, down to 12 px so 64 channels fit on one screen.
      height: Math.max(160, 40 + Math.round(Math.min(26, Math.max(12, 720 / Math.max(1, settings.channels.length)))) * settings.channels.length),
      rowLabels: labels,
      rowIndex: settings.channels,
      length,
      sampleRate: fs,
      startS: start / fs,
      layers: [
        { data: win.original, colour: side ? '#1d232b' : '#b9b3a4', lineWidth: side ? 1 : 1.6, panel: 0, fixed: true },
        { data: win.cleaned, colour: side ? '#1d232b' : '#1f4e8c', lineWidth: 1, panel: 1 },
      ],
      rowSpan: uvPerDiv,
      events: markerEvents(recording.events, settings.markers),
      sideBySide: side,
      panelTitles: ['original', 'cleaned'],
    };
  }, [win, settings.channels, settings.mode, uvPerDiv, settings.markers, decomposition.channels, length, fs, start, recording.events, tracesWidth]);
  specRef.current = spec;

  // --- figures that follow the verdicts (recomputed per version) ---------------------------------------
  const removed = applied.removed;
  const checksum = useMemo(() => (win ? windowChecksum(win.cleaned) : ''), [win, version]);
  const varianceRemoved = useMemo(() => (win ? removedVarianceShare(win) : null), [win, version]);

  const roiRows = useMemo(() => regionChannels(aim, roi.channels, decomposition.channels, rows), [aim, roi.channels, decomposition.channels, rows]);
  const regionLabel = roiRows.map((c) => decomposition.channels[c]).join(', ') || '—';
  const eventLabel = roi.epochEvent ?? defaultEventLabel(recording.events);
  // Epoching every channel of the whole recording takes a few tens of ms: done after the first paint of the
  // traces (a macrotask later), and dropped if the inputs changed meanwhile.
  const [erp, setErp] = useState<{ key: unknown[]; plan: RegionErpPlan | null } | null>(null);
  const erpKey = [recording, fs, rows, roiRows, decomposition, k, eventLabel];
  useEffect(() => {
    let stale = false;
    const key = [recording, fs, rows, roiRows, decomposition, k, eventLabel];
    const timer = setTimeout(() => {
      const plan = regionErpPlan({
        data: recording.signals.data,
        nSamples: recording.signals.nSamples,
        sampleRate: fs,
        rows,
        roi: roiRows,
        unmixing: decomposition.unmixing,
        mixing: decomposition.mixing,
        nComponents: k,
        onsetsS: eventOnsets(recording.events, eventLabel),
      });
      if (!stale) setErp({ key, plan });
    }, 0);
    return () => {
      stale = true;
      clearTimeout(timer);
    };
  }, [recording, fs, rows, roiRows, decomposition, k, eventLabel]);
  const erpPlan = erp && erp.key.every((v, i) => v === erpKey[i]) ? erp.plan : null;
  const erpAfter = useMemo(
    () => (erpPlan ? regionErpAfter(erpPlan.before, erpPlan.componentErps, erpPlan.regionWeights, removed) : null),
    [erpPlan, removed],
  );
  const [spectraScope, setSpectraScope] = useState<SpectraScope>('recording');
  const windowSpectra = useMemo(() => {
    if (spectraScope !== 'window' || !win || length < 16) return null;
    return regionSpectra(regionMean(win.original, length, roiRows), regionMean(win.cleaned, length, roiRows), fs);
  }, [spectraScope, win, version, length, roiRows, fs]);
  const whole = useWholeSpectra(spectraScope === 'recording', recording, decomposition, rows, roiRows, removed);
  const spectra = spectraScope === 'window' ? windowSpectra : whole.spectra;

  return (
    <section className="preview-view" data-testid="preview-view" aria-label="Cleaned signal preview">
      <ComponentStrip nComponents={k} />
      <ResidualNotice recording={recording} decomposition={decomposition} removed={removed} />
      <PreviewToolbar
        settings={{ ...settings, startS }}
        uvPerDiv={uvPerDiv}
        durationS={durationS}
        channels={decomposition.channels}
        rows={rows}
        regionRows={roiRows}
        events={recording.events}
        positions={montage.drawable ? montage.positions : null}
        onChange={(p) => setSettings((s) => ({ ...s, ...p }))}
      />
      <div className="preview-grid">
        <ExportablePanel title="Traces" context="preview" className="panel-traces">
          <div ref={tracesBox} className="trace-box" />
          {spec ? (
            <TracePlot
              spec={spec}
              testId="preview-traces"
              ariaLabel={`${settings.channels.length} channels, ${settings.lengthS} s from ${startS.toFixed(1)} s, original and cleaned`}
              canvasRef={(el) => {
                canvas.current = el;
              }}
            />
          ) : (
            <canvas data-testid="preview-traces" width={900} height={160} aria-label="computing the window" />
          )}
          <p className="note">
            {settings.mode === 'overlay' ? 'Grey: original; blue: cleaned.' : 'Left: original; right: cleaned.'} One row
            spacing is {uvPerDiv} µV (scale bar, bottom right). Removed:{' '}
            <span data-testid="preview-removed-count">{removed.size}</span> of {k} components.
            {/* For tests only, never shown: a checksum of the cleaned window and the last update's duration. */}
            <span hidden data-testid="preview-cleaned-checksum">{checksum}</span>
            <span hidden data-testid="preview-update-ms">{updateMs === null ? '' : updateMs.toFixed(1)}</span>
          </p>
        </ExportablePanel>
        <div className="preview-side">
          <RegionControls
            channels={decomposition.channels}
            rows={rows}
            regionRows={roiRows}
            events={recording.events}
            eventLabel={eventLabel}
            positions={montage.drawable ? montage.positions : null}
          />
          <ExportablePanel title="Variance removed per channel" context="preview" className="panel-variance">
            {varianceRemoved && montage.drawable ? (
              <TopographyMap
                weights={varianceRemoved}
                positionsUnit={montage.positions}
                size={150}
                title="Share of each channel's variance removed in the shown window"
                labels={decomposition.channels}
                colourBar
                unit="share"
                maxAbs={1}
                scale="sequential"
              />
            ) : (
              <p>{montage.drawable ? 'Computing…' : 'No electrode positions, so no map.'}</p>
            )}
            <p className="note">var(original − cleaned) / var(original) per channel, shown window.</p>
          </ExportablePanel>
          <RegionErpPanel
            times={erpPlan?.times ?? null}
            before={erpPlan?.before ?? null}
            after={erpAfter}
            nEpochs={erpPlan?.nEpochs ?? 0}
            eventLabel={eventLabel}
            regionLabel={regionLabel}
            windowS={roi.windowS}
            pending={erpPlan === null && !(erp && erp.key.every((v, i) => v === erpKey[i]))}
          />
          <RegionSpectraPanel
            spectra={spectra}
            aim={aim}
            bandHz={roi.bandHz}
            regionLabel={regionLabel}
            scope={spectraScope}
            onScope={setSpectraScope}
            pending={spectraScope === 'recording' && whole.pending}
            error={spectraScope === 'recording' ? whole.error : null}
          />
        </div>
      </div>
    </section>
  );
}
