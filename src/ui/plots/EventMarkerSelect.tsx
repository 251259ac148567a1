/**
 * Which events are drawn as markers on trace plots: all, none, or one choice by BIDS events.tsv columns (a
 * trial_type, or a trial_type with one column value, e.g. "tone, condition rare").
 */
import { useMemo } from 'react';
import { selectionChoices, type SelectableEvent } from '../../core/evidence/event-selection.ts';

export interface EventMarkerSelectProps {
  readonly events: readonly SelectableEvent[];
  /** Selection keys shown (event-selection.ts selectionKey); null = all. */
  readonly shown: ReadonlySet<string> | null;
  readonly onChange: (shown: ReadonlySet<string> | null) => void;
}

export function EventMarkerSelect({ events, shown, onChange }: EventMarkerSelectProps) {
  const choices = useMemo(() => selectionChoices(events), [events]);
  const value = shown === null ? '*all*' : shown.size === 0 ? '*none*' : [...shown][0];
  return (
    <label>
      Events marked{' '}
      <select
        value={value}
        onChange={(e) => {
          const v = e.target.value;
          onChange(v === '*all*' ? null : v === '*none*' ? new Set() : new Set([v]));
        }}
      >
        <option value="*all*">all</option>
        <option value="*none*">none</option>
        {choices.map((c) => (
          <option key={c.key} value={c.key}>{c.label}</option>
        ))}
      </select>
    </label>
  );
}
