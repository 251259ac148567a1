/**
 * A study's decisions as BIDS derivatives (issue 11): one decisions file per recording, JSON and its TSV
 * twin, under derivatives/winnow/ with the recording's entities and `desc-winnow`, plus the derivative's
 * dataset_description.json (BIDS specification v1.10, "Derivatives": GeneratedBy). The paths are relative
 * to the dataset root, so the browser can write them into the dataset folder or into one zip.
 */
import { derivativeDescription, derivativePath, type DatasetRecording } from './bids-dataset.ts';
import { formatDecisionsJson, formatDecisionsTsv, type DecisionsFile } from '../review/decisions-file.ts';

export const STUDY_DERIVATIVE_FOLDER = 'derivatives/winnow';

export interface StudyExportEntry {
  readonly recording: DatasetRecording;
  readonly decisions: DecisionsFile;
}

export interface ExportedFile {
  readonly path: string;
  readonly text: string;
}

export function studyExportFiles(entries: readonly StudyExportEntry[], version: string): ExportedFile[] {
  const files: ExportedFile[] = [
    {
      path: `${STUDY_DERIVATIVE_FOLDER}/dataset_description.json`,
      text: derivativeDescription('Winnow component decisions', version, 'Reviewed keep/remove decisions per independent component, with reasons'),
    },
  ];
  for (const e of entries) {
    const base = `${STUDY_DERIVATIVE_FOLDER}/${derivativePath(e.recording, 'winnow', 'decisions', '')}`;
    files.push({ path: `${base}.json`, text: formatDecisionsJson(e.decisions) });
    files.push({ path: `${base}.tsv`, text: formatDecisionsTsv(e.decisions) });
  }
  return files;
}
