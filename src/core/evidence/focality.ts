/**
 * Single-electrode evidence (docs/methods.md §14, common practice): the share of a scalp map's energy on its
 * largest electrode, max_c a_c² / Σ_j a_j². A loose or bridged electrode gives one channel most of the
 * map (> ~0.5–0.8 [common practice / from memory]); brain and ocular maps spread over many.
 */
export interface Focality {
  /** 0…1; 1/nChannels for a perfectly flat map. NaN for an all-zero map. */
  readonly share: number;
  /** Index of the electrode carrying the most energy. */
  readonly channelIndex: number;
}

export function mapFocality(map: ArrayLike<number>): Focality {
  let total = 0;
  let best = -1;
  let bestE = -1;
  for (let c = 0; c < map.length; c++) {
    const e = map[c] * map[c];
    total += e;
    if (e > bestE) {
      bestE = e;
      best = c;
    }
  }
  return { share: total > 0 ? bestE / total : NaN, channelIndex: best };
}

/**
 * How much of a map's energy, outside its strongest electrode, has spatial structure (issue 10; ours): the
 * energy of the other electrodes' deviations from their own mean, over the whole map's energy,
 *
 *   Σ_{c ≠ max} (a_c − ā_rest)² / Σ_c a_c².
 *
 * A single bad electrode gives ~0 whatever the reference: against the common average every other electrode
 * carries the same −a_max/M, and without a re-reference they carry 0. A focal brain or muscle source under one
 * electrode still spreads, unevenly, onto its neighbours, which this measures. NaN for an all-zero map.
 */
export function restStructure(map: ArrayLike<number>): number {
  const { channelIndex } = mapFocality(map);
  let total = 0;
  let mean = 0;
  const n = map.length;
  for (let c = 0; c < n; c++) {
    total += map[c] * map[c];
    if (c !== channelIndex) mean += map[c];
  }
  if (!(total > 0) || n < 2) return NaN;
  mean /= n - 1;
  let dev = 0;
  for (let c = 0; c < n; c++) if (c !== channelIndex) dev += (map[c] - mean) ** 2;
  return dev / total;
}
