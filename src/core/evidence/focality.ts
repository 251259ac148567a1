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
