/**
 * Cardiac evidence (docs/methods.md §14, common practice): a heartbeat component repeats sharp QRS complexes every
 * 0.4–1.5 s (40–150 beats per minute). We smooth the activation over ≈ 20 ms (a boxcar, so broadband noise
 * above ~25 Hz does not swamp it), take the change over ≈ 20 ms and square it (slope energy, which the
 * sharp QRS dominates), sum that in blocks of ≈ 40 ms, smooth the block energies over 120 ms, remove the
 * mean, and look for the largest local maximum of the normalised autocorrelation at lags 0.4–1.5 s that
 * also exceeds the value at half that lag (a periodic train, not a slowly decaying envelope). Our
 * construction.
 */
export interface CardiacResult {
  /** Beats per minute at the peak (parabolic refinement), or null when there is no qualifying peak. */
  readonly bpm: number | null;
  /** Autocorrelation at the peak (0…1); 0 when none. */
  readonly peak: number;
}

export function cardiacPeriodicity(x: ArrayLike<number>, fs: number, minBpm = 40, maxBpm = 150): CardiacResult {
  const none = { bpm: null, peak: 0 };
  const B = Math.max(1, Math.round(fs * 0.02)); // ≈ 20 ms: boxcar width and slope span
  const block = 2 * B; // ≈ 40 ms energy blocks (the QRS is then spread over 100 ms anyway)
  const dt = block / fs;
  const nb = Math.floor(x.length / block);
  const minLag = Math.max(2, Math.floor(60 / maxBpm / dt));
  const maxLag = Math.ceil(60 / minBpm / dt);
  if (nb < 2 * maxLag + 2) return none;
  // y = B-sample boxcar of x (running sum); slope d = y[i] − y[i − B], squared and summed per block.
  const e = slopeEnergyBlocks(x, block, B, nb);
  let mean = 0;
  // 120 ms (3-block) moving average of the block energies: keeps the beat (a ~40 ms QRS repeating every 0.4–1.5 s)
  // and removes the ripple of ongoing rhythms (a 6 Hz theta's slope energy ripples at 12 Hz).
  {
    const half = 1; // 3 blocks of 40 ms
    const sm = new Float64Array(nb);
    let acc = 0;
    let lo = 0;
    let hi = -1;
    for (let b = 0; b < nb; b++) {
      while (hi < Math.min(nb - 1, b + half)) acc += e[++hi];
      while (lo < b - half) acc -= e[lo++];
      sm[b] = acc / (hi - lo + 1);
    }
    e.set(sm);
  }
  for (let b = 0; b < nb; b++) mean += e[b];
  mean /= nb;
  let r0 = 0;
  for (let b = 0; b < nb; b++) {
    e[b] -= mean;
    r0 += e[b] * e[b];
  }
  if (!(r0 > 0)) return none;
  const r = new Float64Array(maxLag + 2);
  const lagLo = Math.max(1, Math.floor(minLag / 2));
  for (let lag = lagLo; lag <= maxLag + 1; lag++) {
    let s = 0;
    for (let b = 0; b + lag < nb; b++) s += e[b] * e[b + lag];
    r[lag] = (s / (nb - lag)) * (nb / r0);
  }
  let best = -1;
  for (let lag = minLag; lag <= maxLag; lag++) {
    if (r[lag] <= r[lag - 1] || r[lag] < r[lag + 1]) continue;
    if (r[lag] <= r[Math.max(lagLo, Math.round(lag / 2))]) continue;
    if (best < 0 || r[lag] > r[best]) best = lag;
  }
  if (best < 0 || !(r[best] > 0)) return none;
  const denom = r[best - 1] - 2 * r[best] + r[best + 1];
  const delta = denom !== 0 ? Math.max(-0.5, Math.min(0.5, (0.5 * (r[best - 1] - r[best + 1])) / denom)) : 0;
  return { bpm: 60 / ((best + delta) * dt), peak: r[best] };
}

/**
 * Beat shape and regularity (docs/methods.md §14): what separates a heartbeat from a rhythm whose bursts
 * happen to recur at 40–150 per minute (an alpha rhythm waxing and waning). Given the beat rate found by
 * `cardiacPeriodicity`, we take the same slope energy (≈ 20 ms boxcar, change over ≈ 20 ms, squared) at
 * ≈ 10 ms resolution summed over ≈ 50 ms, mark as beats the samples that are the largest within ±0.7 of a beat period (so at
 * most one beat per period, and no noise maximum between two beats), and report
 * - `sharpness`: the median slope energy at the marked beats over the median slope energy of the whole
 *   activation, as log10. A QRS complex packs most of the slope energy into ≈ 40 ms of every beat, so the
 *   beat stands far above the rest; a burst of 8–12 Hz rhythm spreads its slope energy over every cycle of
 *   the burst (ours);
 * - `intervalCv`: the coefficient of variation of the inter-beat intervals that lie within 0.5–1.5 beat
 *   periods (a missed or extra beat does not count). Heart rate at rest varies by a few percent from beat to
 *   beat (common practice), while the recurrence of rhythm bursts is irregular.
 * Our construction; NaN when fewer than 10 beats are found.
 */
export interface CardiacBeats {
  readonly sharpness: number;
  readonly intervalCv: number;
  readonly beats: number;
}

export function cardiacBeats(x: ArrayLike<number>, fs: number, bpm: number | null): CardiacBeats {
  const none = { sharpness: NaN, intervalCv: NaN, beats: 0 };
  if (bpm === null || !(bpm > 0)) return none;
  const B = Math.max(1, Math.round(fs * 0.02));
  const block = Math.max(1, Math.round(fs * 0.01));
  const dt = block / fs;
  const nb = Math.floor(x.length / block);
  const period = 60 / bpm / dt; // in blocks
  const half = Math.max(1, Math.round(0.7 * period));
  if (nb < 12 * period) return none;
  const e = slopeEnergyBlocks(x, block, B, nb);
  // Sum over ≈ 50 ms (5 blocks, centred) so the up- and downstroke of one QRS complex (two slope lobes ≈ 20 ms
  // apart) make one maximum, not two that the marking would choose between at random.
  {
    const sm = new Float64Array(nb);
    let acc = 0;
    for (let b = 0; b < Math.min(nb, 2); b++) acc += e[b];
    for (let b = 0; b < nb; b++) {
      if (b + 2 < nb) acc += e[b + 2];
      if (b - 3 >= 0) acc -= e[b - 3];
      sm[b] = acc;
    }
    e.set(sm);
  }
  // Beats: samples that are the maximum of e within ±half blocks (sliding maximum by a monotone deque).
  const beats: number[] = [];
  const dq = new Int32Array(nb);
  let h = 0;
  let tl = 0;
  let next = 0; // next index to push
  for (let b = 0; b < nb; b++) {
    const hi = Math.min(nb - 1, b + half);
    while (next <= hi) {
      while (tl > h && e[dq[tl - 1]] <= e[next]) tl--;
      dq[tl++] = next++;
    }
    while (dq[h] < b - half) h++;
    if (dq[h] === b && e[b] > 0 && b >= 2 * B / block + 1) beats.push(b);
  }
  if (beats.length < 10) return none;
  const median = (v: number[]) => {
    const s = [...v].sort((a, c) => a - c);
    const m = s.length >> 1;
    return s.length % 2 ? s[m] : 0.5 * (s[m - 1] + s[m]);
  };
  const all = Array.from(e.subarray(Math.ceil((2 * B) / block)));
  const med = median(all);
  const beatMed = median(beats.map((b) => e[b]));
  const sharpness = med > 0 ? Math.log10(beatMed / med) : Infinity;
  const ibi: number[] = [];
  for (let k = 1; k < beats.length; k++) {
    const d = beats[k] - beats[k - 1];
    if (d >= 0.5 * period && d <= 1.5 * period) ibi.push(d);
  }
  let intervalCv = NaN;
  if (ibi.length >= 5) {
    const m = ibi.reduce((a, c) => a + c, 0) / ibi.length;
    const v = ibi.reduce((a, c) => a + (c - m) * (c - m), 0) / (ibi.length - 1);
    intervalCv = Math.sqrt(v) / m;
  }
  return { sharpness, intervalCv, beats: beats.length };
}

/**
 * Slope energy per block: y = B-sample boxcar of x (running sum), slope d = y[i] − y[i − B], d² summed over
 * each block of `block` samples (nb blocks). Shared by the periodicity and the beat-interval measures.
 */
function slopeEnergyBlocks(x: ArrayLike<number>, block: number, B: number, nb: number): Float64Array {
  const ring = new Float64Array(B); // the last B boxcar outputs
  const e = new Float64Array(nb);
  let run = 0;
  let slot = 0; // i mod B
  for (let b = 0; b < nb; b++) {
    let s = 0;
    for (let j = 0; j < block; j++) {
      const i = b * block + j;
      run += x[i] - (i >= B ? x[i - B] : 0);
      const y = run / B;
      if (i >= 2 * B) {
        const d = y - ring[slot];
        s += d * d;
      }
      ring[slot] = y;
      if (++slot === B) slot = 0;
    }
    e[b] = s;
  }
  return e;
}
