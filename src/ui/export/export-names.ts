/**
 * File names for exported panels: the participant's BIDS entities, then lower-case words joined by hyphens,
 * safe on every file system, e.g. "sub-01_task-oddball_winnow-component-07-spectrum.svg". Text from files
 * (labels, file names) never reaches a path unfiltered.
 */
import { bidsNameParts } from '../../core/formats/recording-loader.ts';

/** BIDS entities in the order the specification lists them (BIDS, "Entity table"). */
const ENTITY_ORDER = ['sub', 'ses', 'task', 'acq', 'run'] as const;

/**
 * The participant part of a file name from the recording's name: its BIDS entities ("sub-01_ses-2_task-oddball",
 * labels kept to letters and digits as BIDS requires), else the slug of its base name; "" without a name.
 */
export function participantPrefix(recordingFileName: string | null | undefined): string {
  if (!recordingFileName) return '';
  const { entities } = bidsNameParts(recordingFileName);
  const parts = ENTITY_ORDER.filter((k) => entities[k] !== undefined)
    .map((k) => [k, entities[k].replace(/[^A-Za-z0-9]/g, '')] as const)
    .filter(([, v]) => v !== '')
    .map(([k, v]) => `${k}-${v}`);
  if (parts.length) return parts.join('_');
  const base = recordingFileName.slice(Math.max(recordingFileName.lastIndexOf('/'), recordingFileName.lastIndexOf('\\')) + 1).replace(/\.[^.]+$/, '');
  return slugify(base);
}

export type PanelFormat = 'svg' | 'png';

/** Keeps a–z, 0–9 and hyphens; collapses runs; at most 60 characters; "panel" when nothing is left. */
export function slugify(text: string): string {
  const s = text
    .normalize('NFKD')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 60)
    .replace(/-+$/g, '');
  return s || 'panel';
}

/**
 * "<participant>_winnow-<context>-<panel>.<format>", the context being e.g. "component-07" or "preview" and the
 * participant `participantPrefix` of the recording (left out when empty).
 */
export function panelFileName(panel: string, format: PanelFormat, context?: string, participant?: string): string {
  const parts = ['winnow', context ? slugify(context) : null, slugify(panel)].filter(Boolean);
  return `${participant ? `${participant}_` : ''}${parts.join('-')}.${format}`;
}

/** The title line of an exported figure: participant, context and panel ("sub-01 task-oddball · component-07 · Spectrum"). */
export function panelFigureTitle(panel: string, context?: string, participant?: string): string {
  return [participant ? participant.replace(/_/g, ' ') : null, context ?? null, panel].filter(Boolean).join(' · ');
}

/** Component number padded to two digits for file names that sort ("component-07"). */
export function componentContext(index: number): string {
  return `component-${String(index).padStart(2, '0')}`;
}
