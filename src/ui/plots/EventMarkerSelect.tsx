/** Which event types are drawn as markers on trace plots: all, none, or one label prefix. */
import { eventPrefixes } from './trace-layout.ts';

export interface EventMarkerSelectProps {
  readonly events: readonly { label: string; source?: string }[];
  /** null = all. */
  readonly shown: ReadonlySet<string> | null;
  readonly onChange: (shown: ReadonlySet<string> | null) => void;
}

export function EventMarkerSelect({ events, shown, onChange }: EventMarkerSelectProps) {
  const prefixes = eventPrefixes(events);
  const value = shown === null ? '*all*' : shown.size === 0 ? '*none*' : [...shown][0];
  return (
    <label>
      Events{' '}
      <select
        value={value}
        onChange={(e) => {
          const v = e.target.value;
          onChange(v === '*all*' ? null : v === '*none*' ? new Set() : new Set([v]));
        }}
      >
        <option value="*all*">all</option>
        <option value="*none*">none</option>
        {prefixes.map((p) => (
          <option key={p} value={p}>{p}</option>
        ))}
      </select>
    </label>
  );
}
