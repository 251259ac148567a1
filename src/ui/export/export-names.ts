/**
 * File names for exported panels: lower-case words joined by hyphens, safe on every file system, e.g.
 * "winnow-component-07-spectrum.svg". Text from files (labels) never reaches a path unfiltered.
 */

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

/** "winnow-<context>-<panel>.<format>", the context being e.g. "component-07" or "preview". */
export function panelFileName(panel: string, format: PanelFormat, context?: string): string {
  const parts = ['winnow', context ? slugify(context) : null, slugify(panel)].filter(Boolean);
  return `${parts.join('-')}.${format}`;
}

/** Component number padded to two digits for file names that sort ("component-07"). */
export function componentContext(index: number): string {
  return `component-${String(index).padStart(2, '0')}`;
}
