/**
 * Canvas drawing of stacked traces (browser only). Kept out of the React component so a caller can repaint
 * straight after a data change without a render (zustand's transient-update pattern).
 */
import { eventsInWindow, minMaxColumns, rowCentres, type WindowEvent } from './trace-layout.ts';

export interface TraceLayer {
  /** rows × length, channel-major, µV (or a.u.). */
  readonly data: ArrayLike<number>;
  readonly colour: string;
  readonly lineWidth: number;
  /** Which panel the layer goes to in side-by-side mode (0 = left, 1 = right). */
  readonly panel?: 0 | 1;
}

export interface TraceSpec {
  readonly width: number;
  readonly height: number;
  readonly rowLabels: readonly string[];
  readonly length: number;
  readonly sampleRate: number;
  /** Time of the first sample in the window, s. */
  readonly startS: number;
  readonly layers: readonly TraceLayer[];
  /** Value (µV) that spans one row's height. */
  readonly rowSpan: number;
  /** Optional per-row span overriding `rowSpan` (rows in other units, e.g. an activation). */
  readonly rowSpans?: ArrayLike<number>;
  /**
   * Which data row each drawn row shows (default: row r shows data row r). Lets a caller draw a channel
   * selection straight from a full channel-major buffer that it keeps updating in place.
   */
  readonly rowIndex?: ArrayLike<number>;
  readonly events: readonly WindowEvent[];
  /** Draw the layers in two panels side by side (panel 0 left, 1 right) instead of overlaid. */
  readonly sideBySide?: boolean;
  /** Titles of the two panels in side-by-side mode. */
  readonly panelTitles?: readonly [string, string];
}

const LABEL_W = 52;
const BOTTOM = 18;

/** Paints `spec` into `canvas` at the device pixel ratio. */
export function drawTraces(canvas: HTMLCanvasElement, spec: TraceSpec): void {
  const dpr = typeof window !== 'undefined' ? window.devicePixelRatio || 1 : 1;
  const W = Math.round(spec.width * dpr);
  const H = Math.round(spec.height * dpr);
  if (canvas.width !== W) canvas.width = W;
  if (canvas.height !== H) canvas.height = H;
  const ctx = canvas.getContext('2d');
  if (!ctx) return;
  ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
  ctx.fillStyle = '#fffdf8';
  ctx.fillRect(0, 0, spec.width, spec.height);

  // Side by side, the panel titles take the first line and the event labels the second.
  const TOP = spec.sideBySide ? 28 : 14;
  const eventLabelY = spec.sideBySide ? 23 : 10;
  const nRows = spec.rowLabels.length;
  const centres = rowCentres(nRows, TOP, spec.height - BOTTOM);
  const rowH = nRows ? (spec.height - TOP - BOTTOM) / nRows : 0;
  const panels = spec.sideBySide ? 2 : 1;
  const plotW = (spec.width - LABEL_W - 8 * panels) / panels;
  const durS = spec.length / spec.sampleRate;

  ctx.font = '10px system-ui, sans-serif';
  ctx.fillStyle = '#333';
  ctx.textBaseline = 'middle';
  for (let r = 0; r < nRows; r++) ctx.fillText(spec.rowLabels[r], 4, centres[r]);

  for (let p = 0; p < panels; p++) {
    const x0 = LABEL_W + p * (plotW + 8);
    // events and time grid
    ctx.strokeStyle = '#e6e1d3';
    ctx.lineWidth = 1;
    const step = durS > 20 ? 5 : durS > 6 ? 1 : 0.5;
    ctx.fillStyle = '#555';
    ctx.textBaseline = 'alphabetic';
    for (let t = Math.ceil(spec.startS / step) * step; t <= spec.startS + durS + 1e-9; t += step) {
      const x = x0 + ((t - spec.startS) / durS) * plotW;
      ctx.beginPath();
      ctx.moveTo(x, TOP);
      ctx.lineTo(x, spec.height - BOTTOM);
      ctx.stroke();
      const tick = `${+t.toFixed(2)} s`;
      // keep the last tick label inside the panel
      ctx.fillText(tick, Math.min(x + 2, x0 + plotW - ctx.measureText(tick).width), spec.height - 5);
    }
    ctx.strokeStyle = '#7a5cc2';
    ctx.setLineDash([3, 3]);
    let labelEnd = -Infinity;
    for (const e of eventsInWindow(spec.events, spec.startS, spec.startS + durS)) {
      const x = x0 + ((e.onset - spec.startS) / durS) * plotW;
      ctx.beginPath();
      ctx.moveTo(x, TOP);
      ctx.lineTo(x, spec.height - BOTTOM);
      ctx.stroke();
      // Label only where it does not run into the previous one; every event keeps its line.
      const text = e.label.slice(0, 16);
      const w = ctx.measureText(text).width;
      if (x + 2 > labelEnd + 4 && x + 2 + w <= x0 + plotW) {
        ctx.fillStyle = '#5b3fa0';
        ctx.fillText(text, x + 2, eventLabelY);
        labelEnd = x + 2 + w;
      }
    }
    ctx.setLineDash([]);
    if (spec.sideBySide && spec.panelTitles) {
      ctx.fillStyle = '#1d232b';
      ctx.font = 'bold 11px system-ui, sans-serif';
      ctx.fillText(spec.panelTitles[p], x0 + 2, 10);
      ctx.font = '10px system-ui, sans-serif';
    }

    ctx.save();
    ctx.beginPath();
    ctx.rect(x0, TOP - 2, plotW, spec.height - TOP - BOTTOM + 4);
    ctx.clip();
    const cols = Math.max(1, Math.floor(plotW));
    const mn = new Float64Array(cols);
    const mx = new Float64Array(cols);
    for (const layer of spec.layers) {
      if (spec.sideBySide && (layer.panel ?? 0) !== p) continue;
      ctx.strokeStyle = layer.colour;
      ctx.lineWidth = layer.lineWidth;
      ctx.beginPath();
      for (let r = 0; r < nRows; r++) {
        const off = (spec.rowIndex ? spec.rowIndex[r] : r) * spec.length;
        const yc = centres[r];
        const span = spec.rowSpans ? spec.rowSpans[r] : spec.rowSpan;
        const pxPerUnit = span > 0 ? rowH / span : 0;
        if (spec.length > 2 * cols) {
          minMaxColumns(layer.data, off, off + spec.length, cols, mn, mx);
          let rowMean = 0;
          let cnt = 0;
          for (let j = 0; j < cols; j++) if (Number.isFinite(mn[j])) { rowMean += mn[j] + mx[j]; cnt += 2; }
          rowMean = cnt ? rowMean / cnt : 0;
          let started = false;
          for (let j = 0; j < cols; j++) {
            if (!Number.isFinite(mn[j])) continue;
            const x = x0 + j + 0.5;
            const ya = yc - (mx[j] - rowMean) * pxPerUnit;
            const yb = yc - (mn[j] - rowMean) * pxPerUnit;
            if (!started) ctx.moveTo(x, ya);
            else ctx.lineTo(x, ya);
            started = true;
            ctx.lineTo(x, yb + 0.5);
          }
        } else {
          let rowMean = 0;
          for (let t = 0; t < spec.length; t++) rowMean += layer.data[off + t];
          rowMean /= spec.length || 1;
          for (let t = 0; t < spec.length; t++) {
            const x = x0 + (t / Math.max(1, spec.length - 1)) * plotW;
            const y = yc - (layer.data[off + t] - rowMean) * pxPerUnit;
            if (t === 0) ctx.moveTo(x, y);
            else ctx.lineTo(x, y);
          }
        }
      }
      ctx.stroke();
    }
    ctx.restore();
  }
}
