/**
 * Stacked traces on a canvas (sensor traces, a component's activation, original vs cleaned). The drawing
 * itself is `drawTraces`; this component only owns the canvas and repaints when its spec changes.
 */
import { useLayoutEffect, useRef } from 'react';
import { drawTraces, type TraceSpec } from './trace-draw.ts';

export interface TracePlotProps {
  readonly spec: TraceSpec;
  /** data-testid of the canvas (e.g. "preview-traces"). */
  readonly testId?: string;
  readonly ariaLabel: string;
  /** Receives the canvas element, for callers that repaint without a render. */
  readonly canvasRef?: (canvas: HTMLCanvasElement | null) => void;
}

export function TracePlot({ spec, testId, ariaLabel, canvasRef }: TracePlotProps) {
  const ref = useRef<HTMLCanvasElement | null>(null);
  useLayoutEffect(() => {
    if (ref.current) drawTraces(ref.current, spec);
  }, [spec]);
  return (
    <canvas
      className="trace-plot"
      data-testid={testId}
      role="img"
      aria-label={ariaLabel}
      style={{ width: spec.width, height: spec.height }}
      ref={(el) => {
        ref.current = el;
        canvasRef?.(el);
      }}
    />
  );
}
