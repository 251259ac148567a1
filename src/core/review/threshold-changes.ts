/**
 * Which suggestion thresholds differ from the defaults of thresholds.ts: written into the decisions file and
 * the methods text, so a reader knows the suggestions were made with the reviewer's own table.
 */
import { defaultThresholds, type Thresholds } from './thresholds.ts';

export interface ThresholdChange {
  readonly key: keyof Thresholds;
  readonly value: number;
  readonly defaultValue: number;
}

/** Known keys with a finite value that differs from the default, in the order of `defaultThresholds`. */
export function thresholdChanges(thresholds: Partial<Thresholds> | null | undefined): ThresholdChange[] {
  if (!thresholds) return [];
  const out: ThresholdChange[] = [];
  for (const key of Object.keys(defaultThresholds) as (keyof Thresholds)[]) {
    const v = thresholds[key];
    if (typeof v === 'number' && Number.isFinite(v) && v !== defaultThresholds[key]) out.push({ key, value: v, defaultValue: defaultThresholds[key] });
  }
  return out;
}

/** The changed thresholds as an object (key → value), or null when every threshold is at its default. */
export function thresholdOverridesOf(thresholds: Partial<Thresholds> | null | undefined): Partial<Record<keyof Thresholds, number>> | null {
  const changes = thresholdChanges(thresholds);
  return changes.length === 0 ? null : Object.fromEntries(changes.map((c) => [c.key, c.value]));
}

/** "muscleHighFrequencyShare 0.5 (default 0.35); …", or null when none differs. */
export function thresholdChangesText(thresholds: Partial<Thresholds> | null | undefined): string | null {
  const changes = thresholdChanges(thresholds);
  return changes.length === 0 ? null : changes.map((c) => `${c.key} ${c.value} (default ${c.defaultValue})`).join('; ');
}

/**
 * Reads threshold overrides back from a file or saved record: known keys with finite numbers are kept; the
 * names of anything else are returned as `rejected`.
 */
export function readThresholdOverrides(raw: unknown): { overrides: Partial<Thresholds>; rejected: string[] } {
  const overrides: Record<string, number> = {};
  const rejected: string[] = [];
  if (typeof raw !== 'object' || raw === null || Array.isArray(raw)) return { overrides, rejected: raw === undefined || raw === null ? [] : ['(not an object)'] };
  for (const [k, v] of Object.entries(raw)) {
    if (k in defaultThresholds && typeof v === 'number' && Number.isFinite(v)) overrides[k] = v;
    else rejected.push(k);
  }
  return { overrides: overrides as Partial<Thresholds>, rejected };
}
