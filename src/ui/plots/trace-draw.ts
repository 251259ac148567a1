/**
 * Canvas drawing of stacked traces (browser only). Kept out of the React component so a caller can repaint
 * straight after a data change without a render (zustand's transient-update pattern).
 *
 * Layers marked `fixed` (e.g. the original signal) are drawn once per spec into an offscreen canvas together
 * with the grid, labels and events; a repaint then copies that picture and draws only the other layers
 * (e.g. the cleaned signal). The cache is keyed by the spec object, so a new spec redraws everything.
 */
import { eventsInWindow, formatScale, minMaxColumns, niceScaleBelow, rowCentres, type WindowEvent } from './trace-layout.ts';

export interface TraceLayer {
  /** rows × length, channel-major, µV (or a.u.). */
  readonly data: ArrayLike<number>;
  readonly colour: string;
  readonly lineWidth: number;
  /** Which panel the layer goes to in side-by-side mode (0 = left, 1 = right). */
  readonly panel?: 0 | 1;
  /** The data never change while this spec is shown: drawn once into the cached background. */
  readonly fixed?: boolean;
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
  /**
   * Unit of the rows' values, written on the scale bars (default "µV"). A bar of a 1-2-5 length that fits
   * one row is drawn at the right end of the last row for the shared `rowSpan`, and beside each row whose
   * own span (`rowSpans`) differs from it; null draws no bar.
   */
  readonly unit?: string | null;
}

const BOTTOM = 18;
const FONT = '10px system-ui, sans-serif';

interface Geometry {
  /** Width of the row-label column, px. */
  readonly labelW: number;
  readonly top: number;
  readonly centres: Float64Array;
  readonly rowH: number;
  readonly panels: number;
  readonly plotW: number;
  readonly durS: number;
}

/** Row-label column wide enough for the longest label (measured in the canvas font), at least 40 px. */
function labelWidth(ctx: CanvasRenderingContext2D, labels: readonly string[]): number {
  ctx.font = FONT;
  let w = 0;
  for (const l of labels) w = Math.max(w, ctx.measureText(l).width);
  return Math.ceil(Math.max(40, w + 10));
}

function geometry(spec: TraceSpec, labelW: number): Geometry {
  // Side by side, the panel titles take the first line and the event labels the second.
  const top = spec.sideBySide ? 28 : 14;
  const nRows = spec.rowLabels.length;
  const panels = spec.sideBySide ? 2 : 1;
  return {
    labelW,
    top,
    centres: rowCentres(nRows, top, spec.height - BOTTOM),
    rowH: nRows ? (spec.height - top - BOTTOM) / nRows : 0,
    panels,
    plotW: (spec.width - labelW - 8 * panels) / panels,
    durS: spec.length / spec.sampleRate,
  };
}

const panelX = (g: Geometry, p: number) => g.labelW + p * (g.plotW + 8);

/** Background, row labels, time grid, events and panel titles. */
function paintFrame(ctx: CanvasRenderingContext2D, spec: TraceSpec, g: Geometry): void {
  ctx.fillStyle = '#fffdf8';
  ctx.fillRect(0, 0, spec.width, spec.height);
  ctx.font = FONT;
  ctx.fillStyle = '#333';
  ctx.textBaseline = 'middle';
  for (let r = 0; r < spec.rowLabels.length; r++) ctx.fillText(spec.rowLabels[r], 4, g.centres[r]);
  const eventLabelY = spec.sideBySide ? 23 : 10;
  ctx.textBaseline = 'alphabetic';
  for (let p = 0; p < g.panels; p++) {
    const x0 = panelX(g, p);
    ctx.strokeStyle = '#e6e1d3';
    ctx.lineWidth = 1;
    ctx.fillStyle = '#555';
    const step = g.durS > 20 ? 5 : g.durS > 6 ? 1 : 0.5;
    for (let t = Math.ceil(spec.startS / step) * step; t <= spec.startS + g.durS + 1e-9; t += step) {
      const x = x0 + ((t - spec.startS) / g.durS) * g.plotW;
      ctx.beginPath();
      ctx.moveTo(x, g.top);
      ctx.lineTo(x, spec.height - BOTTOM);
      ctx.stroke();
      const tick = `${+t.toFixed(2)} s`;
      // keep the last tick label inside the panel
      ctx.fillText(tick, Math.min(x + 2, x0 + g.plotW - ctx.measureText(tick).width), spec.height - 5);
    }
    ctx.strokeStyle = '#7a5cc2';
    ctx.setLineDash([3, 3]);
    let labelEnd = -Infinity;
    for (const e of eventsInWindow(spec.events, spec.startS, spec.startS + g.durS)) {
      const x = x0 + ((e.onset - spec.startS) / g.durS) * g.plotW;
      ctx.beginPath();
      ctx.moveTo(x, g.top);
      ctx.lineTo(x, spec.height - BOTTOM);
      ctx.stroke();
      // Label only where it does not run into the previous one; every event keeps its line.
      const text = e.label.slice(0, 16);
      const w = ctx.measureText(text).width;
      if (x + 2 > labelEnd + 4 && x + 2 + w <= x0 + g.plotW) {
        ctx.fillStyle = '#5b3fa0';
        ctx.fillText(text, x + 2, eventLabelY);
        labelEnd = x + 2 + w;
      }
    }
    ctx.setLineDash([]);
    if (spec.sideBySide && spec.panelTitles) {
      ctx.fillStyle = '#1d232b';
      ctx.font = `bold ${FONT}`;
      ctx.fillText(spec.panelTitles[p], x0 + 2, 10);
      ctx.font = FONT;
    }
  }
}

/** One layer's traces in panel `p`, min/max-decimated to one column per pixel when denser than that. */
function paintLayer(ctx: CanvasRenderingContext2D, spec: TraceSpec, g: Geometry, layer: TraceLayer, p: number): void {
  const x0 = panelX(g, p);
  ctx.save();
  ctx.beginPath();
  ctx.rect(x0, g.top - 2, g.plotW, spec.height - g.top - BOTTOM + 4);
  ctx.clip();
  const cols = Math.max(1, Math.floor(g.plotW));
  const mn = new Float64Array(cols);
  const mx = new Float64Array(cols);
  ctx.strokeStyle = layer.colour;
  ctx.lineWidth = layer.lineWidth;
  ctx.beginPath();
  for (let r = 0; r < spec.rowLabels.length; r++) {
    const off = (spec.rowIndex ? spec.rowIndex[r] : r) * spec.length;
    const yc = g.centres[r];
    const span = spec.rowSpans ? spec.rowSpans[r] : spec.rowSpan;
    const pxPerUnit = span > 0 ? g.rowH / span : 0;
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
        const x = x0 + (t / Math.max(1, spec.length - 1)) * g.plotW;
        const y = yc - (layer.data[off + t] - rowMean) * pxPerUnit;
        if (t === 0) ctx.moveTo(x, y);
        else ctx.lineTo(x, y);
      }
    }
  }
  ctx.stroke();
  ctx.restore();
}

function paintLayers(ctx: CanvasRenderingContext2D, spec: TraceSpec, g: Geometry, fixed: boolean): void {
  for (let p = 0; p < g.panels; p++) {
    for (const layer of spec.layers) {
      if (Boolean(layer.fixed) !== fixed) continue;
      if (spec.sideBySide && (layer.panel ?? 0) !== p) continue;
      paintLayer(ctx, spec, g, layer, p);
    }
  }
}

/**
 * Rows that carry a scale bar: the last row for the shared span, and each row whose own span differs from
 * the shared one (e.g. a component's row above sensors). Returns [row, span] pairs.
 */
export function scaleBarRows(spec: Pick<TraceSpec, 'rowLabels' | 'rowSpan' | 'rowSpans'>): [number, number][] {
  const n = spec.rowLabels.length;
  if (n === 0) return [];
  const spanOf = (r: number) => (spec.rowSpans ? spec.rowSpans[r] : spec.rowSpan);
  const out: [number, number][] = [];
  let sharedAt = -1;
  for (let r = 0; r < n; r++) {
    const s = spanOf(r);
    if (Math.abs(s - spec.rowSpan) > 1e-9 * Math.max(1, Math.abs(spec.rowSpan))) out.push([r, s]);
    else sharedAt = r;
  }
  if (sharedAt >= 0) out.push([sharedAt, spec.rowSpan]);
  return out.sort((a, b) => a[0] - b[0]);
}

/** A vertical bar of a 1-2-5 length with its value, at the right end of the row (last panel). */
function paintScaleBars(ctx: CanvasRenderingContext2D, spec: TraceSpec, g: Geometry): void {
  const unit = spec.unit === undefined ? 'µV' : spec.unit;
  if (unit === null || g.rowH <= 0) return;
  const x = panelX(g, g.panels - 1) + g.plotW - 4;
  ctx.font = FONT;
  ctx.textBaseline = 'middle';
  for (const [r, span] of scaleBarRows(spec)) {
    if (!(span > 0) || !Number.isFinite(span)) continue;
    const value = niceScaleBelow(span);
    const h = (value / span) * g.rowH;
    const yc = g.centres[r];
    const text = formatScale(value, unit);
    const w = ctx.measureText(text).width;
    ctx.fillStyle = 'rgba(255, 253, 248, 0.85)';
    ctx.fillRect(x - w - 8, yc - 7, w + 6, 14);
    ctx.strokeStyle = '#1d232b';
    ctx.lineWidth = 2;
    ctx.beginPath();
    ctx.moveTo(x, yc - h / 2);
    ctx.lineTo(x, yc + h / 2);
    ctx.moveTo(x - 3, yc - h / 2);
    ctx.lineTo(x + 3, yc - h / 2);
    ctx.moveTo(x - 3, yc + h / 2);
    ctx.lineTo(x + 3, yc + h / 2);
    ctx.stroke();
    ctx.fillStyle = '#1d232b';
    ctx.fillText(text, x - w - 5, yc);
  }
  ctx.textBaseline = 'alphabetic';
}

const backgrounds = new WeakMap<TraceSpec, HTMLCanvasElement>();

/** Paints `spec` into `canvas` at the device pixel ratio, reusing the cached background of the spec. */
export function drawTraces(canvas: HTMLCanvasElement, spec: TraceSpec): void {
  const dpr = typeof window !== 'undefined' ? window.devicePixelRatio || 1 : 1;
  const W = Math.round(spec.width * dpr);
  const H = Math.round(spec.height * dpr);
  if (canvas.width !== W) canvas.width = W;
  if (canvas.height !== H) canvas.height = H;
  const ctx = canvas.getContext('2d');
  if (!ctx) return;
  const g = geometry(spec, labelWidth(ctx, spec.rowLabels));
  let bg = backgrounds.get(spec);
  if (!bg || bg.width !== W || bg.height !== H) {
    bg = document.createElement('canvas');
    bg.width = W;
    bg.height = H;
    const bctx = bg.getContext('2d');
    if (!bctx) return;
    bctx.setTransform(dpr, 0, 0, dpr, 0, 0);
    paintFrame(bctx, spec, g);
    paintLayers(bctx, spec, g, true);
    backgrounds.set(spec, bg);
  }
  ctx.setTransform(1, 0, 0, 1, 0, 0);
  ctx.drawImage(bg, 0, 0);
  ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
  paintLayers(ctx, spec, g, false);
  paintScaleBars(ctx, spec, g);
}
