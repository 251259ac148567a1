/**
 * Writes the simulated demo participant as a small BIDS dataset:
 *
 *   npx tsx src/cli/demo-data.ts [--out demo-data] [--seed 1] [--no-decomposition]
 *
 * demo-data/
 *   dataset_description.json, participants.tsv, README.md
 *   sub-01/eeg/sub-01_task-walkoddball_eeg.edf (+ _eeg.json, _channels.tsv, _events.tsv, _events.json)
 *   sub-01/eeg/sub-01_electrodes.tsv, sub-01_coordsystem.json   (BIDS gives these no task entity)
 *   sub-01/eeg/sub-01_task-walkoddball_desc-ica_decomposition.json   (by `winnow decompose`, unless skipped)
 *   derivatives/simulation/…/sub-01_task-walkoddball_desc-truth_sources.json   (true maps and dipoles)
 *
 * The recording is exactly `winnow simulate --seed 1 --channels 32 --minutes 3 --rate 250 --line 50`'s
 * recording.edf. Everything is simulated by our own code; no real participant.
 */
import { mkdir } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { writeFileAtomic } from './atomic-write.ts';
import { CliError, numberOption, parseCommandArgs, processIo, type CliIo } from './cli-support.ts';
import { formatTsv } from '../core/formats/bids.ts';
import { simulateSession, type SimulateOptions } from '../core/simulate/simulate.ts';
import { TASK_NAME, sessionEdf, sessionSidecars, sessionTruthFiles } from '../core/simulate/session-files.ts';
import { hz } from '../core/units.ts';

/** The demo's fixed settings (changing them changes the bundled data; update README.md with them). */
export const DEMO_OPTIONS: Required<Omit<SimulateOptions, 'sensorNoiseUv' | 'alphaPeakHz' | 'classGain'>> = { seed: 1, channels: 32, minutes: 3, rate: hz(250), lineHz: 50 };

function readme(seed: number, withDecomposition: boolean, sizeMb: string): string {
  const o = { ...DEMO_OPTIONS, seed };
  return `# Winnow demo participant (simulated)

This folder holds **one simulated participant**, made by Winnow's own simulator (\`src/core/simulate/\`).
No real person was recorded: there is no participant data, identifying or otherwise.

## The scenario

A participant walks laps along a corridor wearing a ${o.channels}-channel wireless cap while hearing frequent
low tones and rare high tones (about 1 in 5), silently counting the high ones: an auditory oddball while
walking. ${o.minutes} minutes at ${o.rate} Hz, mains at ${o.lineHz} Hz, average reference.

The recording is a known linear mixture of 21 sources plus 0.7 µV sensor noise:

- neural: posterior alpha (9.5 Hz with a 19 Hz harmonic), left and right central mu, frontal midline theta,
  a parietal P3-like response 300–400 ms after rare tones, an auditory response ~100 ms after every tone,
  and six dipoles carrying 1/f background activity;
- blinks (~16 per minute, more after tones) and horizontal eye movements;
- jaw (left and right temporal) and neck muscle bursts, the neck bursts locked to heel strikes;
- cable sway after each step on the posterior electrodes; a heartbeat far field;
- ${o.lineHz} Hz mains on T8, FC6 and C4; a loose electrode at P7 with drifts and pops.

Events (\`_events.tsv\`, BIDS columns): \`trial_type\` \`tone\` or \`step\`; \`condition\` \`standard\` or \`rare\`
for tones; \`foot\` \`left\` or \`right\` for steps (\`n/a\` where a column does not apply). The EDF+ annotations
carry the trial_type.

## Files

| file | what |
|---|---|
| \`sub-01/eeg/sub-01_task-${TASK_NAME}_eeg.edf\` | EDF+C recording, µV, with tone and step annotations |
| \`sub-01/eeg/sub-01_task-${TASK_NAME}_eeg.json\` | recording sidecar (PowerLineFrequency ${o.lineHz}) |
| \`sub-01/eeg/sub-01_task-${TASK_NAME}_channels.tsv\`, \`_events.tsv\`, \`_events.json\` | channels and events |
| \`sub-01/eeg/sub-01_electrodes.tsv\`, \`sub-01_coordsystem.json\` | electrode positions, mm, RAS, 90 mm sphere |
${withDecomposition ? `| \`sub-01/eeg/sub-01_task-${TASK_NAME}_desc-ica_decomposition.json\` | the recording's ICA decomposition, by \`winnow decompose\` (defaults) |\n` : ''}| \`derivatives/simulation/sub-01/eeg/sub-01_task-${TASK_NAME}_desc-truth_sources.json\` | the true sources: class, scalp map, dipole, event times (activations not bundled) |

Total size about ${sizeMb} MB.

## Regenerate

\`\`\`
npx tsx src/cli/demo-data.ts --out demo-data --seed ${seed}
\`\`\`

writes this folder again: the recording and every sidecar byte for byte${withDecomposition ? '; it also runs `winnow decompose` on the recording (default settings, `--seed ' + seed + '`), which is deterministic for a given seed and thread count' : ''}. The same recording, plus
the neural-only back-projection and every source's activation, comes from

\`\`\`
node bin/winnow.mjs simulate --out DIR --seed ${seed} --channels ${o.channels} --minutes ${o.minutes} --rate ${o.rate} --line ${o.lineHz}
\`\`\`

Winnow is a research tool, not for clinical diagnosis.
`;
}

/** Help text for `winnow demo-data --help` (first line: the usage). */
export const usage = `usage: winnow demo-data [--out DIR] [--seed N] [--no-decomposition]

Writes the simulated demo participant as a small BIDS dataset (run as \`npx tsx src/cli/demo-data.ts\`).

options:
  --out DIR                 output folder (default demo-data)
  --seed N                  random seed (default 1)
  --no-decomposition        skip the ICA decomposition
  -h, --help                show this help
`;

export async function run(args: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseCommandArgs('demo-data', args, {
    out: { type: 'string' },
    seed: { type: 'string' },
    'no-decomposition': { type: 'boolean' },
  });
  if (positionals.length > 0) throw new CliError(`demo-data: unexpected argument "${positionals[0]}"`);
  const root = resolve(values.out ?? 'demo-data');
  const seed = numberOption('demo-data', 'seed', values.seed, DEMO_OPTIONS.seed);
  const withDecomposition = !values['no-decomposition'];
  const session = simulateSession({ ...DEMO_OPTIONS, seed });
  const eeg = join(root, 'sub-01', 'eeg');
  const truthDir = join(root, 'derivatives', 'simulation', 'sub-01', 'eeg');
  await mkdir(eeg, { recursive: true });
  await mkdir(truthDir, { recursive: true });
  const base = `sub-01_task-${TASK_NAME}`;
  const truth = sessionTruthFiles(session, { activations: null, sensorNoise: null });

  const files: [string, Uint8Array | string][] = [
    [join(root, 'dataset_description.json'), JSON.stringify({
      Name: 'Winnow demo: simulated walking auditory oddball (one participant)',
      BIDSVersion: '1.10.0',
      DatasetType: 'raw',
      License: 'CC0',
      Authors: ['Winnow simulator'],
      GeneratedBy: [{ Name: 'winnow simulate', Description: `simulated by Winnow's own code, seed ${seed}` }],
    }, null, 2) + '\n'],
    [join(root, 'participants.tsv'), formatTsv(['participant_id', 'description'], [['sub-01', 'simulated participant (no real person)']])],
    [join(eeg, `${base}_eeg.edf`), sessionEdf(session, 'data')],
    ...sessionSidecars(session).map((f): [string, string] => [join(eeg, `${f.taskEntity ? base : 'sub-01'}_${f.suffix}`), f.text]),
    [join(root, 'derivatives', 'simulation', 'dataset_description.json'), JSON.stringify({
      Name: 'Ground truth of the simulated demo participant',
      BIDSVersion: '1.10.0',
      DatasetType: 'derivative',
      GeneratedBy: [{ Name: 'winnow simulate', Description: `true sources of seed ${seed}` }],
    }, null, 2) + '\n'],
    [join(truthDir, `${base}_desc-truth_sources.json`), JSON.stringify(truth.truth, null, 1) + '\n'],
  ];
  for (const [path, data] of files) await writeFileAtomic(path, data);

  const decompositionPath = join(eeg, `${base}_desc-ica_decomposition.json`);
  if (withDecomposition) {
    const { run: decompose } = await import('./decompose.ts');
    const code = await decompose([join(eeg, `${base}_eeg.edf`), '--out', decompositionPath, '--seed', String(seed)], io);
    if (code !== 0) throw new CliError(`demo-data: winnow decompose exited with ${code}`, 1);
  }
  const { stat, readdir } = await import('node:fs/promises');
  let bytes = 0;
  const walk = async (d: string): Promise<void> => {
    for (const e of await readdir(d, { withFileTypes: true })) {
      if (e.isDirectory()) await walk(join(d, e.name));
      else if (e.name !== 'README.md') bytes += (await stat(join(d, e.name))).size;
    }
  };
  await walk(root);
  await writeFileAtomic(join(root, 'README.md'), readme(seed, withDecomposition, (bytes / 1e6).toFixed(1)));
  io.stdout(`demo-data: wrote ${root} (${(bytes / 1e6).toFixed(1)} MB)\n`);
  return 0;
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  run(process.argv.slice(2), processIo).then(
    (code) => process.exit(code),
    (e) => {
      processIo.stderr(`error: ${(e as Error).message}\n`);
      process.exit(e instanceof CliError ? e.exitCode : 1);
    },
  );
}
