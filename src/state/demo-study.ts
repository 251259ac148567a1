/**
 * The demo study: four simulated participants written as a BIDS dataset in memory, the way
 * `winnow simulate-study` writes it on disk (src/cli/simulate-study.ts) — one seed per participant, the
 * last with four times the sensor noise. Simulated data, for trying the study screens only.
 */
import { simulateSession } from '../core/simulate/simulate.ts';
import { participantOptions, participantRow, PARTICIPANT_COLUMNS, studyParticipant } from '../core/simulate/study-participants.ts';
import { formatTsv } from '../core/formats/bids.ts';
import { sessionEdf, sessionSidecars, TASK_NAME } from '../core/simulate/session-files.ts';
import type { DatasetFile } from './study-store.ts';
import { hz } from '../core/units.ts';

export const DEMO_STUDY_PARTICIPANTS = 4;
const DEMO_STUDY_SEED = 101;
const MINUTES = 1.5;

export async function demoStudyFiles(): Promise<DatasetFile[]> {
  const text = (path: string, body: string): DatasetFile => ({ path, file: new File([body], path.split('/').pop() ?? path, { type: 'text/plain' }) });
  const out: DatasetFile[] = [
    text('dataset_description.json', JSON.stringify({ Name: 'Winnow demo study (simulated)', BIDSVersion: '1.10.0', DatasetType: 'raw' }, null, 2) + '\n'),
    text('participants.tsv', formatTsv(['participant_id', ...PARTICIPANT_COLUMNS], Array.from({ length: DEMO_STUDY_PARTICIPANTS }, (_, k) => participantRow(studyParticipant(DEMO_STUDY_SEED, k, DEMO_STUDY_PARTICIPANTS))))),
  ];
  for (let k = 0; k < DEMO_STUDY_PARTICIPANTS; k++) {
    // let the page paint between participants
    await new Promise((r) => setTimeout(r, 0));
    const label = `0${k + 1}`;
    const session = simulateSession({ ...participantOptions(studyParticipant(DEMO_STUDY_SEED, k, DEMO_STUDY_PARTICIPANTS)), channels: 32, minutes: MINUTES, rate: hz(250), lineHz: 50 });
    const dir = `sub-${label}/eeg`;
    const stem = `sub-${label}_task-${TASK_NAME}`;
    const edf = sessionEdf(session, 'data');
    out.push({ path: `${dir}/${stem}_eeg.edf`, file: new File([edf.slice().buffer as ArrayBuffer], `${stem}_eeg.edf`) });
    for (const f of sessionSidecars(session)) out.push(text(`${dir}/${f.taskEntity ? stem : `sub-${label}`}_${f.suffix}`, f.text));
  }
  return out;
}
