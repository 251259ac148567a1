/**
 * `winnow simulate-study --out DIR --participants N [--seed S] [--minutes M] [--channels 32|64]`: writes a
 * BIDS dataset of N simulated participants (the walking-oddball session of src/core/simulate, one seed
 * per participant so that the timing of every blink, step, burst and pop differs, and an individual alpha
 * peak and artefact mix per participant: src/core/simulate/study-participants.ts) for tests and the demo
 * study. One participant — the last — is recorded with four times the sensor noise, the "noisy participant"
 * a study review should notice. Layout (BIDS specification v1.10, EEG):
 *
 *   dataset_description.json, participants.tsv, participants.json, README, task-<task>_events.json
 *   sub-<NN>/eeg/sub-<NN>_task-<task>_eeg.edf, _channels.tsv, _events.tsv, _eeg.json
 *   sub-<NN>/eeg/sub-<NN>_electrodes.tsv, sub-<NN>_coordsystem.json
 *
 * Prints a one-line JSON summary on stdout. Files are written atomically.
 */
import { mkdir } from 'node:fs/promises';
import { join } from 'node:path';
import { writeFileAtomic } from './atomic-write.ts';
import { CliError, numberOption, parseCommandArgs, type CliIo } from './cli-support.ts';
import { simulateSession } from '../core/simulate/simulate.ts';
import { PARTICIPANT_COLUMNS, participantOptions, participantRow, studyParticipant } from '../core/simulate/study-participants.ts';
import { sessionEdf, sessionSidecars, TASK_NAME } from '../core/simulate/session-files.ts';
import { formatTsv } from '../core/formats/bids.ts';
import { hz } from '../core/units.ts';

const USAGE = 'usage: winnow simulate-study --out DIR --participants N [--seed S] [--minutes M] [--channels 32|64]';

export const usage = `${USAGE}

Writes a simulated BIDS dataset of N participants (different seeds, alpha peaks and artefact mix; the last one noisy) for tests and the
demo study; prints a one-line JSON summary.

options:
  --out DIR                 dataset folder; required
  --participants N          number of participants, 1…200; required
  --seed S                  first participant's seed (participant k gets S + k − 1; default 1)
  --minutes M               length of each recording in minutes, > 0 and ≤ 60 (default 2)
  --channels 32|64          EEG channels (default 32)
  -h, --help                show this help
`;


export async function run(args: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseCommandArgs('simulate-study', args, {
    out: { type: 'string' },
    participants: { type: 'string' },
    seed: { type: 'string' },
    minutes: { type: 'string' },
    channels: { type: 'string' },
  });
  if (positionals.length > 0) throw new CliError(`winnow simulate-study: unexpected argument "${positionals[0]}"\n${USAGE}`);
  if (!values.out) throw new CliError(`winnow simulate-study: --out DIR is required\n${USAGE}`);
  if (values.participants === undefined) throw new CliError(`winnow simulate-study: --participants N is required\n${USAGE}`);
  const n = numberOption('simulate-study', 'participants', values.participants, 0);
  if (!Number.isInteger(n) || n < 1 || n > 200) throw new CliError(`winnow simulate-study: --participants must be an integer in 1…200, got "${values.participants}"`);
  const seed = numberOption('simulate-study', 'seed', values.seed, 1);
  if (!Number.isInteger(seed) || seed < 0 || seed + n - 1 > 0xffffffff) throw new CliError(`winnow simulate-study: --seed must be an integer in 0…${0xffffffff - n + 1}, got "${values.seed}"`);
  const minutes = numberOption('simulate-study', 'minutes', values.minutes, 2);
  if (!(minutes > 0) || minutes > 60) throw new CliError(`winnow simulate-study: --minutes must be > 0 and ≤ 60, got "${values.minutes}"`);
  const channels = numberOption('simulate-study', 'channels', values.channels, 32);
  if (channels !== 32 && channels !== 64) throw new CliError(`winnow simulate-study: --channels must be 32 or 64, got "${values.channels}"`);

  const out = values.out;
  await mkdir(out, { recursive: true });
  const people = Array.from({ length: n }, (_, k) => studyParticipant(seed, k, n));
  const labels = people.map((p) => p.label);
  const noisy = people.find((p) => p.noisy)?.label ?? null;
  await writeFileAtomic(
    join(out, 'dataset_description.json'),
    JSON.stringify(
      {
        Name: 'Winnow simulated walking-oddball study',
        BIDSVersion: '1.10.0',
        DatasetType: 'raw',
        License: 'CC0',
        Authors: ['Winnow simulator'],
        GeneratedBy: [{ Name: 'winnow', Version: '0.1.0', Description: 'winnow simulate-study' }],
      },
      null,
      2,
    ) + '\n',
  );
  await writeFileAtomic(
    join(out, 'participants.tsv'),
    formatTsv(['participant_id', ...PARTICIPANT_COLUMNS], people.map(participantRow)),
  );
  await writeFileAtomic(
    join(out, 'participants.json'),
    JSON.stringify(
      {
        seed: { Description: 'Seed of the simulated session (winnow simulate --seed).' },
        sensor_noise_uv: { Description: 'Standard deviation of the white sensor noise added to every channel.', Units: 'uV' },
        alpha_peak_hz: { Description: 'Individual alpha peak frequency of the simulated posterior alpha rhythm.', Units: 'Hz' },
        blink_gain: { Description: 'Amplitude factor of the blink sources (1 = the simulator default); likewise gaze_gain, muscle_gain, cardiac_gain, movement_gain.' },
      },
      null,
      2,
    ) + '\n',
  );
  await writeFileAtomic(
    join(out, 'README'),
    'Simulated with `winnow simulate-study`: a walking auditory oddball session per participant, with known\n' +
      'sources (truth is not included here; run `winnow simulate` for a single session with its truth files).\n' +
      'Simulated data for demonstration and tests only. Winnow is a research tool, not for clinical diagnosis.\n',
  );
  let eventsJsonWritten = false;
  for (const [k, label] of labels.entries()) {
    const session = simulateSession({ ...participantOptions(people[k]), channels, minutes, rate: hz(250), lineHz: 50 });
    const dir = join(out, `sub-${label}`, 'eeg');
    await mkdir(dir, { recursive: true });
    const withTask = `sub-${label}_task-${TASK_NAME}`;
    await writeFileAtomic(join(dir, `${withTask}_eeg.edf`), sessionEdf(session, 'data'));
    for (const f of sessionSidecars(session)) {
      if (f.suffix === 'events.json') {
        // one description for the whole dataset (inheritance principle)
        if (!eventsJsonWritten) await writeFileAtomic(join(out, `task-${TASK_NAME}_events.json`), f.text);
        eventsJsonWritten = true;
        continue;
      }
      await writeFileAtomic(join(dir, `${f.taskEntity ? withTask : `sub-${label}`}_${f.suffix}`), f.text);
    }
  }
  io.stdout(JSON.stringify({ out, participants: labels.map((l) => `sub-${l}`), task: TASK_NAME, seeds: labels.map((_, k) => seed + k), noisy: noisy ? `sub-${noisy}` : null, minutes, channels }) + '\n');
  return 0;
}
