/**
 * The mains (power-line) frequency used for evidence and how it was decided: a caller's explicit choice,
 * the recording's BIDS PowerLineFrequency (read by recording-loader.ts), or 50 Hz assumed. Kept apart from
 * the loader so the workbench's main thread can word it without importing the readers.
 */
import type { PowerLine } from '../recording.ts';
import { hz, type Hz } from '../units.ts';

/** A mains frequency: 50 or 60 Hz. */
export type MainsHz = Hz & (50 | 60);

/** `mainsHz(60)`: 50 or 60 as a frequency in Hz. */
export const mainsHz = (v: 50 | 60): MainsHz => hz(v) as MainsHz;

/** Where the mains frequency used for evidence came from. */
export interface MainsFrequency {
  readonly hz: MainsHz;
  readonly origin: 'option' | 'sidecar' | 'assumed';
  /** The *_eeg.json for origin 'sidecar'. */
  readonly sidecar: string | null;
  /** One line for people: "mains 60 Hz (from sub-01_task-x_eeg.json)", "mains 50 Hz (assumed; no PowerLineFrequency)". */
  readonly text: string;
}

/**
 * The mains frequency for evidence: an explicit choice (`override`, e.g. `--line-frequency`) wins, then the
 * sidecar's PowerLineFrequency, else 50 Hz, assumed (our default; the text says so).
 */
export function mainsFrequency(powerLine: PowerLine | undefined, override?: 50 | 60): MainsFrequency {
  if (override !== undefined) return { hz: mainsHz(override), origin: 'option', sidecar: null, text: `mains ${override} Hz (given)` };
  if (powerLine?.hz != null)
    return { hz: powerLine.hz, origin: 'sidecar', sidecar: powerLine.sidecar, text: `mains ${powerLine.hz} Hz (from ${powerLine.sidecar})` };
  return { hz: mainsHz(50), origin: 'assumed', sidecar: null, text: 'mains 50 Hz (assumed; no PowerLineFrequency)' };
}
