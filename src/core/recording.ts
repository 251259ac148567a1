/**
 * The recording model every part of Winnow reads through. Parsers (EDF/EDF+/BDF/BDF+) fill it; the
 * simulator writes through the EDF writer; decomposition, evidence, the workbench and the CLI consume it.
 * Samples are kept channel-major in Float32Array (a 24-bit significand holds 24-bit ADC counts exactly).
 */
import type { Hz, Lenient, Seconds } from './units.ts';
import type { MainsHz } from './formats/power-line.ts';

export type RecordingFormat = 'EDF' | 'EDF+C' | 'EDF+D' | 'BDF' | 'BDF+C' | 'BDF+D';

/** BIDS channel types (BIDS specification, *_channels.tsv). */
export type ChannelType =
  | 'EEG' | 'EOG' | 'HEOG' | 'VEOG' | 'ECG' | 'EMG' | 'MISC' | 'TRIG' | 'REF' | 'RESP' | 'AUDIO'
  | 'EYEGAZE' | 'GSR' | 'PPG' | 'PUPIL' | 'SYSCLOCK' | 'TEMP';

export interface ChannelInfo {
  /** Label with surrounding spaces trimmed. */
  readonly label: string;
  /** Physical unit after normalisation: voltage channels are always 'uV'; others keep the header's text. */
  readonly unit: string;
  /** The unit as written in the header. */
  readonly headerUnit: string;
  readonly sampleRate: Hz;
  readonly samplesPerRecord: number;
  readonly physicalMin: number;
  readonly physicalMax: number;
  readonly digitalMin: number;
  readonly digitalMax: number;
  readonly transducer: string;
  readonly prefilter: string;
  /** From channels.tsv when given; 'EEG' by default for voltage channels. */
  readonly type: ChannelType;
  /** From channels.tsv (status column); 'good' when absent. */
  readonly status: 'good' | 'bad';
}

export interface RecordingEvent {
  /** Seconds from the first stored sample (BIDS convention). */
  readonly onset: Lenient<Seconds>;
  /** Seconds; 0 when absent. */
  readonly duration: Lenient<Seconds>;
  /** UTF-8 text (EDF+ annotation or BIDS trial_type). Never rendered as HTML. */
  readonly label: string;
  /** Where the event came from. 'boundary' marks a gap in an EDF+D/BDF+D file. */
  readonly source: 'annotation' | 'boundary' | 'events-tsv';
  /** Seconds, from events.tsv response_time when present. */
  readonly responseTime?: Seconds;
  /**
   * Every other events.tsv column of this row (column name → cell text, 'n/a' kept as written), e.g.
   * { condition: 'rare' }; the factors a reviewer can select or split events by. BIDS specification,
   * "Task events". Absent for EDF+ annotations.
   */
  readonly columns?: Readonly<Record<string, string>>;
}

export interface RecordingHeader {
  readonly patientId: string;
  readonly recordingId: string;
  /** ISO 8601 local date-time without zone, e.g. "2026-03-04T10:21:00". */
  readonly start: string;
  readonly headerBytes: number;
  readonly records: number;
  readonly recordDurationSeconds: Seconds;
  /** Start time of each data record in seconds from the file start (from time-keeping TALs in EDF+/BDF+). */
  readonly recordOnsets: Float64Array;
}

/** Header-level description of a recording: everything except the samples. */
export interface RecordingInfo {
  readonly fileName: string;
  readonly format: RecordingFormat;
  readonly header: RecordingHeader;
  /** Signal channels only (annotation channels excluded). */
  readonly channels: readonly ChannelInfo[];
  readonly durationSeconds: Seconds;
  readonly events: readonly RecordingEvent[];
}

/**
 * Samples of channels that share one rate, channel-major: channel c occupies
 * data[c * nSamples, (c + 1) * nSamples). Time of sample j is j / sampleRate (plus the record onset
 * mapping for discontinuous files: `sampleTimes` is set then).
 */
export interface SignalBlock {
  readonly labels: readonly string[];
  readonly sampleRate: Hz;
  readonly nSamples: number;
  readonly data: Float32Array;
  /** Only for discontinuous files: the time in seconds of each sample. */
  readonly sampleTimes?: Float64Array;
}

/** Mains (power-line) frequency as the recording's *_eeg.json states it (BIDS PowerLineFrequency). */
export interface PowerLine {
  /** Hz (50 or 60); null when no sidecar was paired or it gave none ("n/a", missing, or another value). */
  readonly hz: MainsHz | null;
  /** Base name of the *_eeg.json read, or null when none was paired. */
  readonly sidecar: string | null;
}

/** The reference as the sidecars state it (BIDS: channels.tsv `reference` column, *_eeg.json EEGReference). */
export interface RecordingReference {
  /** Distinct `reference` values of the EEG rows of channels.tsv, joined by "; "; null when none given. */
  readonly channels: string | null;
  /** EEGReference of the paired *_eeg.json; null when none given. */
  readonly eegJson: string | null;
}

/** A sidecar read with the recording (paired by name, or named on the command line). */
export interface PairedSidecar {
  readonly kind: 'channels' | 'events' | 'electrodes' | 'coordsystem' | 'eeg';
  /** Base name of the file. */
  readonly file: string;
}

/** A recording ready for review: info plus the samples of its main-rate channels (µV). */
export interface LoadedRecording extends RecordingInfo {
  /** The sidecars read with it, in the order read; absent when read without the loader. */
  readonly sidecars?: readonly PairedSidecar[];
  /** The reference the sidecars state; absent when read without the loader. */
  readonly reference?: RecordingReference;
  /** From the paired *_eeg.json (recording-loader.ts); absent when the recording was read without sidecars. */
  readonly powerLine?: PowerLine;
  readonly signals: SignalBlock;
  /** Electrode positions (unit vectors on the sphere, RAS) for the channels in `signals`, NaN when unknown. */
  readonly positions?: Float64Array;
  readonly warnings: readonly string[];
}
