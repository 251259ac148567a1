/**
 * File forms of a simulated session (pure: bytes and text, no file system): EDF+C recordings (the sensor
 * data and the neural-only back-projection), BIDS sidecars (channels, electrodes, coordinate system,
 * events, *_eeg.json; BIDS specification v1.11, docs/methods.md §12) and the truth files. `winnow simulate` and
 * the demo-data script write these under plain or BIDS names.
 */
import { formatTsv } from '../formats/bids.ts';
import { writeEdf } from '../formats/edf-writer.ts';
import { truthFiles, float32LeBytes, type SimulatedSession, type TruthFile } from './truth.ts';

/** BIDS task label of the scenario. */
export const TASK_NAME = 'walkoddball';

/** Fixed start of every simulated recording (EDF start date/time; no real session took place). */
export const SIMULATED_START = '2026-01-15T10:00:00';

/** Seconds as text with at most 9 decimals and no trailing zeros (as the EDF+ TALs write them). */
export function formatSeconds(v: number): string {
  let s = v.toFixed(9);
  if (s.includes('.')) s = s.replace(/0+$/, '').replace(/\.$/, '');
  return s === '-0' ? '0' : s;
}

/**
 * EDF+C bytes of the sensor data (`which = 'data'`) or of the neural-only back-projection ('neural'),
 * 1 s records, µV, per-channel physical range ±max|x| (the writer's default), with the tone and step
 * events as annotations (their trial_type; the condition and foot columns live in *_events.tsv, which a
 * reader pairs with the annotations by onset and type). Needs an integer sampling rate (samples per 1 s record).
 */
export function sessionEdf(session: SimulatedSession, which: 'data' | 'neural'): Uint8Array {
  const n = session.nSamples;
  const src = which === 'data' ? session.data : session.neuralOnly;
  return writeEdf({
    format: 'EDF+C',
    start: SIMULATED_START,
    recordDurationSeconds: 1,
    channels: session.labels.map((label, c) => ({
      label,
      unit: 'uV',
      sampleRate: session.sampleRate,
      transducer: 'simulated electrode',
      prefilter: which === 'data' ? 'none (simulated)' : 'neural sources only (simulated)',
      data: src.subarray(c * n, (c + 1) * n),
    })),
    annotations: session.events.map((e) => ({ onset: e.onset, duration: e.duration, label: e.label })),
  });
}

/** *_channels.tsv: one EEG row per channel, in data order. */
export function channelsTsv(session: SimulatedSession): string {
  return formatTsv(
    ['name', 'type', 'units', 'sampling_frequency', 'reference', 'low_cutoff', 'high_cutoff', 'status', 'status_description'],
    session.labels.map((l) => [l, 'EEG', 'uV', session.sampleRate, 'average', 'n/a', 'n/a', 'good', 'n/a']),
  );
}

const mm = (v: number) => Number(v.toFixed(4));

/** *_electrodes.tsv in mm (see coordsystemJson). */
export function electrodesTsv(session: SimulatedSession): string {
  return formatTsv(
    ['name', 'x', 'y', 'z', 'type'],
    session.labels.map((l, c) => [
      l,
      mm(session.electrodesMm[3 * c]),
      mm(session.electrodesMm[3 * c + 1]),
      mm(session.electrodesMm[3 * c + 2]),
      'simulated',
    ]),
  );
}

/** *_coordsystem.json: RAS mm on the idealised sphere ("Other" system, so a description is required). */
export function coordsystemJson(session: SimulatedSession): string {
  return (
    JSON.stringify(
      {
        EEGCoordinateSystem: 'Other',
        EEGCoordinateUnits: 'mm',
        EEGCoordinateSystemDescription:
          `Idealised 10-20/10-10 positions on a sphere of radius ${session.headRadiusMm} mm centred at the origin; ` +
          'RAS: +x towards the right pre-auricular point, +y towards the nasion, +z towards the vertex (simulated head).',
      },
      null,
      2,
    ) + '\n'
  );
}

/**
 * *_events.tsv: onset (s, from the first sample), duration, trial_type (tone | step), condition (tones:
 * standard | rare), foot (steps: left | right), sample (0-based index); n/a where a column does not apply
 * (BIDS specification v1.11, "Task events").
 */
export function eventsTsv(session: SimulatedSession): string {
  return formatTsv(
    ['onset', 'duration', 'trial_type', 'condition', 'foot', 'sample'],
    session.events.map((e) => [
      formatSeconds(e.onset),
      formatSeconds(e.duration),
      e.label,
      e.columns.condition,
      e.columns.foot,
      Math.round(e.onset * session.sampleRate),
    ]),
  );
}

/** *_events.json: describes the columns and trial types of eventsTsv. */
export function eventsJson(): string {
  return (
    JSON.stringify(
      {
        trial_type: {
          Description: 'What happened at the onset.',
          Levels: {
            tone: 'A tone played to the participant (see condition).',
            step: 'A heel strike (see foot).',
          },
        },
        condition: {
          Description: 'Which tone was played; n/a for steps.',
          Levels: {
            standard: 'Frequent low tone (about 80 % of tones); ignored.',
            rare: 'Rare high tone (about 20 % of tones); silently counted by the participant.',
          },
        },
        foot: {
          Description: 'Which heel struck the ground; n/a for tones.',
          Levels: {
            left: 'Heel strike of the left foot.',
            right: 'Heel strike of the right foot.',
          },
        },
        sample: { Description: 'Index of the onset sample in the recording (first sample = 0).' },
      },
      null,
      2,
    ) + '\n'
  );
}

/** *_eeg.json with the required BIDS fields and a plain statement that the data are simulated. */
export function eegJson(session: SimulatedSession): string {
  return (
    JSON.stringify(
      {
        TaskName: TASK_NAME,
        TaskDescription:
          'Walking auditory oddball: the participant walks laps along a corridor while hearing frequent low and rare high tones and silently counts the high ones.',
        Instructions: 'Walk at your own pace along the corridor and count the high tones silently.',
        EEGReference: 'common average of all EEG electrodes (simulated)',
        SamplingFrequency: session.sampleRate,
        PowerLineFrequency: session.lineHz,
        SoftwareFilters: 'n/a',
        HardwareFilters: 'n/a',
        Manufacturer: 'n/a (simulated by Winnow)',
        CapManufacturer: 'n/a (simulated by Winnow)',
        EEGChannelCount: session.labels.length,
        EOGChannelCount: 0,
        ECGChannelCount: 0,
        EMGChannelCount: 0,
        MiscChannelCount: 0,
        TriggerChannelCount: 0,
        RecordingDuration: session.nSamples / session.sampleRate,
        RecordingType: 'continuous',
        EEGPlacementScheme: session.labels.length === 64 ? '10-10 (idealised sphere)' : '10-20 (idealised sphere)',
        EEGGround: 'n/a (simulated)',
        SubjectArtefactDescription:
          'Simulated: eye blinks and horizontal eye movements, jaw and neck muscle bursts, heartbeat, cable sway at each step, mains interference and one loose electrode (P7).',
        GeneratedBy: `winnow simulate --seed ${session.seed} --channels ${session.labels.length} --minutes ${session.nSamples / session.sampleRate / 60} --rate ${session.sampleRate} --line ${session.lineHz}`,
      },
      null,
      2,
    ) + '\n'
  );
}

/** One BIDS sidecar of a session: its suffix (`channels.tsv` …) and text. */
export interface SessionSidecar {
  readonly suffix: 'channels.tsv' | 'electrodes.tsv' | 'coordsystem.json' | 'events.tsv' | 'events.json' | 'eeg.json';
  /**
   * Whether the BIDS name carries the task entity (`sub-01_task-X_channels.tsv`); electrodes and coordinate
   * system files have none (`sub-01_electrodes.tsv`; BIDS specification v1.11, EEG "Electrodes description").
   */
  readonly taskEntity: boolean;
  readonly text: string;
}

/**
 * Every BIDS sidecar of a session, in the order `winnow simulate` lists them: channels, electrodes,
 * coordinate system, events, events description, recording sidecar. Both writers name files from this list.
 */
export function sessionSidecars(session: SimulatedSession): SessionSidecar[] {
  return [
    { suffix: 'channels.tsv', taskEntity: true, text: channelsTsv(session) },
    { suffix: 'electrodes.tsv', taskEntity: false, text: electrodesTsv(session) },
    { suffix: 'coordsystem.json', taskEntity: false, text: coordsystemJson(session) },
    { suffix: 'events.tsv', taskEntity: true, text: eventsTsv(session) },
    { suffix: 'events.json', taskEntity: true, text: eventsJson() },
    { suffix: 'eeg.json', taskEntity: true, text: eegJson(session) },
  ];
}

/** truth.json text plus the activations and sensor-noise bytes, under the given file names. */
export function sessionTruthFiles(
  session: SimulatedSession,
  names: { activations: string | null; sensorNoise: string | null },
): { truth: TruthFile; truthJson: string; activations: Uint8Array; sensorNoise: Uint8Array } {
  const { truth, activations } = truthFiles(session, names);
  return { truth, truthJson: JSON.stringify(truth) + '\n', activations, sensorNoise: float32LeBytes(session.sensorNoise) };
}
