/**
 * Ocular evidence (docs/methods.md §14, common practice): where the map sits (frontal-pole weight, left–right
 * antisymmetry), whether the activation follows the eyes (correlation with EOG channels, or with a
 * frontal bipolar proxy when none were recorded), and whether its slow jumps persist as steps
 * (saccades) or return (blinks).
 *
 * Positions are unit vectors in RAS (+x right, +y nasion, +z up), NaN when unknown.
 */

/** Channels with y ≥ this (unit sphere) count as frontal-pole sites (Fp, AF rows ≈ 0.8–0.95 in 10-10; our choice). */
export const FRONTAL_POLE_Y = 0.75;

export interface MapGeometry {
  /** Share (0…1) of Σ a² on frontal-pole sites; NaN when no site qualifies. */
  readonly frontalShare: number;
  /** Mean |a| on frontal-pole sites ÷ mean |a| elsewhere (docs/methods.md §14 "frontal dominance"). */
  readonly frontalGradient: number;
  /** Pearson r of |a| with the anterior coordinate y (positive: falls off posteriorly). */
  readonly anteriorCorrelation: number;
  /** −2 Σ a_L a_R / Σ (a_L² + a_R²) over mirror pairs (+1 antisymmetric, −1 symmetric). */
  readonly lateralAntisymmetry: number;
  /** The same over frontal mirror pairs only (y > 0.3), where horizontal eye movements show. */
  readonly frontalAntisymmetry: number;
}

/**
 * Mirror pairs (left index, right index): for each channel with x < −0.1, the channel nearest to its
 * mirror image (−x, y, z), accepted within 0.15 (unit sphere, ≈ 13 mm on a 90 mm head).
 */
export function mirrorPairs(positions: Float64Array | null, nChannels: number): [number, number][] {
  if (!positions) return [];
  const pairs: [number, number][] = [];
  for (let l = 0; l < nChannels; l++) {
    const x = positions[3 * l];
    if (!(x < -0.1)) continue;
    let best = -1;
    let bestD = 0.15;
    for (let r = 0; r < nChannels; r++) {
      if (!(positions[3 * r] > 0.1)) continue;
      const d = Math.hypot(positions[3 * r] + x, positions[3 * r + 1] - positions[3 * l + 1], positions[3 * r + 2] - positions[3 * l + 2]);
      if (d < bestD) {
        bestD = d;
        best = r;
      }
    }
    if (best >= 0) pairs.push([l, best]);
  }
  return pairs;
}

function antisymmetry(map: ArrayLike<number>, pairs: readonly [number, number][]): number {
  let cross = 0;
  let energy = 0;
  for (const [l, r] of pairs) {
    cross += map[l] * map[r];
    energy += map[l] * map[l] + map[r] * map[r];
  }
  return energy > 0 ? (-2 * cross) / energy : NaN;
}

/** Frontal weight and left–right antisymmetry of a scalp map (sign-free quantities). */
export function mapGeometry(map: ArrayLike<number>, positions: Float64Array | null, pairs: readonly [number, number][]): MapGeometry {
  const n = map.length;
  if (!positions) return { frontalShare: NaN, frontalGradient: NaN, anteriorCorrelation: NaN, lateralAntisymmetry: NaN, frontalAntisymmetry: NaN };
  let eFront = 0;
  let eAll = 0;
  let sumFront = 0;
  let nFront = 0;
  let sumRest = 0;
  let nRest = 0;
  const ys: number[] = [];
  const as: number[] = [];
  for (let c = 0; c < n; c++) {
    const y = positions[3 * c + 1];
    if (!Number.isFinite(y)) continue;
    const a = Math.abs(map[c]);
    eAll += a * a;
    ys.push(y);
    as.push(a);
    if (y >= FRONTAL_POLE_Y) {
      eFront += a * a;
      sumFront += a;
      nFront++;
    } else {
      sumRest += a;
      nRest++;
    }
  }
  const frontalPairs = pairs.filter(([l]) => positions[3 * l + 1] > 0.3);
  return {
    frontalShare: nFront > 0 && eAll > 0 ? eFront / eAll : NaN,
    frontalGradient: nFront > 0 && nRest > 0 && sumRest > 0 ? sumFront / nFront / (sumRest / nRest) : NaN,
    anteriorCorrelation: correlationOf(as, ys),
    lateralAntisymmetry: antisymmetry(map, pairs),
    frontalAntisymmetry: antisymmetry(map, frontalPairs),
  };
}

function correlationOf(a: number[], b: number[]): number {
  const n = a.length;
  if (n < 3) return NaN;
  const ma = a.reduce((s, v) => s + v, 0) / n;
  const mb = b.reduce((s, v) => s + v, 0) / n;
  let sab = 0;
  let saa = 0;
  let sbb = 0;
  for (let i = 0; i < n; i++) {
    sab += (a[i] - ma) * (b[i] - mb);
    saa += (a[i] - ma) ** 2;
    sbb += (b[i] - mb) ** 2;
  }
  return saa > 0 && sbb > 0 ? sab / Math.sqrt(saa * sbb) : NaN;
}

export interface EogReferences {
  readonly vertical: Float64Array | null;
  readonly horizontal: Float64Array | null;
  readonly source: 'EOG channels' | 'frontal bipolar' | 'none';
  readonly channels: { vertical: string | null; horizontal: string | null };
}

const EOG_TYPES = new Set(['EOG', 'VEOG', 'HEOG']);

/**
 * Builds the vertical and horizontal eye references. With EOG channels (BIDS types EOG/VEOG/HEOG, or
 * labels containing "EOG"): VEOG/HEOG by type or by a V/H in the label; two unlabelled EOG channels give
 * vertical = their mean and horizontal = their difference. Without them, from the positions: vertical =
 * mean of the frontal-pole sites minus the mean of all channels, horizontal = the rightmost minus the
 * leftmost frontal site (y > 0.3, e.g. F8 − F7). Common practice; the proxy is our choice.
 */
export function eogReferences(
  data: Float32Array,
  nChannels: number,
  nSamples: number,
  labels: readonly string[],
  types: readonly string[] | undefined,
  positions: Float64Array | null,
): EogReferences {
  const isEog = (c: number) => EOG_TYPES.has((types?.[c] ?? '').toUpperCase()) || /EOG/i.test(labels[c] ?? '');
  const eog = Array.from({ length: nChannels }, (_, c) => c).filter(isEog);
  const row = (c: number) => data.subarray(c * nSamples, (c + 1) * nSamples);
  if (eog.length > 0) {
    const vIdx = eog.find((c) => (types?.[c] ?? '').toUpperCase() === 'VEOG' || /VEOG|EOGV|V$/i.test(labels[c])) ?? null;
    const hIdx = eog.find((c) => (types?.[c] ?? '').toUpperCase() === 'HEOG' || /HEOG|EOGH|H$/i.test(labels[c])) ?? null;
    let vertical: Float64Array | null = vIdx !== null ? Float64Array.from(row(vIdx)) : null;
    let horizontal: Float64Array | null = hIdx !== null ? Float64Array.from(row(hIdx)) : null;
    let vName = vIdx !== null ? labels[vIdx] : null;
    let hName = hIdx !== null ? labels[hIdx] : null;
    const rest = eog.filter((c) => c !== vIdx && c !== hIdx);
    if (!vertical && !horizontal && rest.length >= 2) {
      const a = row(rest[0]);
      const b = row(rest[1]);
      vertical = new Float64Array(nSamples);
      horizontal = new Float64Array(nSamples);
      for (let t = 0; t < nSamples; t++) {
        vertical[t] = 0.5 * (a[t] + b[t]);
        horizontal[t] = b[t] - a[t];
      }
      vName = `${labels[rest[0]]}+${labels[rest[1]]}`;
      hName = `${labels[rest[1]]} − ${labels[rest[0]]}`;
    } else if (!vertical && rest.length >= 1) {
      vertical = Float64Array.from(row(rest[0]));
      vName = labels[rest[0]];
    }
    return { vertical, horizontal, source: 'EOG channels', channels: { vertical: vName, horizontal: hName } };
  }
  if (!positions) return { vertical: null, horizontal: null, source: 'none', channels: { vertical: null, horizontal: null } };
  const front: number[] = [];
  let left = -1;
  let right = -1;
  for (let c = 0; c < nChannels; c++) {
    const x = positions[3 * c];
    const y = positions[3 * c + 1];
    if (!Number.isFinite(y)) continue;
    if (y >= FRONTAL_POLE_Y) front.push(c);
    if (y > 0.3) {
      if (left < 0 || x < positions[3 * left]) left = c;
      if (right < 0 || x > positions[3 * right]) right = c;
    }
  }
  let vertical: Float64Array | null = null;
  if (front.length > 0) {
    vertical = new Float64Array(nSamples);
    for (const c of front) {
      const r = row(c);
      for (let t = 0; t < nSamples; t++) vertical[t] += r[t] / front.length;
    }
    for (let c = 0; c < nChannels; c++) {
      const r = row(c);
      for (let t = 0; t < nSamples; t++) vertical[t] -= r[t] / nChannels;
    }
  }
  let horizontal: Float64Array | null = null;
  if (left >= 0 && right >= 0 && positions[3 * right] - positions[3 * left] > 0.5) {
    horizontal = new Float64Array(nSamples);
    const l = row(left);
    const r = row(right);
    for (let t = 0; t < nSamples; t++) horizontal[t] = r[t] - l[t];
  }
  return {
    vertical,
    horizontal,
    source: vertical || horizontal ? 'frontal bipolar' : 'none',
    channels: {
      vertical: vertical ? `${front.map((c) => labels[c]).join('+')} vs average` : null,
      horizontal: horizontal ? `${labels[right]} − ${labels[left]}` : null,
    },
  };
}

/** Upper median of a typed array (element ⌊n/2⌋ in sorted order), by quickselect on a copy: O(n). */
function medianOf(values: Float64Array): number {
  const n = values.length;
  if (n === 0) return 0;
  const a = values.slice();
  const k = n >> 1;
  let lo = 0;
  let hi = n - 1;
  while (lo < hi) {
    const pivot = a[(lo + hi) >> 1];
    let i = lo;
    let j = hi;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) {
        const t = a[i];
        a[i] = a[j];
        a[j] = t;
        i++;
        j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else return a[k];
  }
  return a[k];
}

/**
 * Step-likeness of an activation (0…1): the signal is averaged in 50 ms blocks; a "jump" is a local
 * maximum of |mean(next 200 ms) − mean(previous 200 ms)| above 4 robust SDs (MAD × 1.4826) of that
 * difference, at least 0.5 s from the previous jump. For each jump, persistence = (mean over 200–600 ms
 * after − mean over the 200 ms before) / jump, clipped to 0…1; the result is the median persistence, or
 * 0 with fewer than 3 jumps. Saccade steps persist (≈ 1); blinks return within ~0.4 s (≈ 0); our measure.
 */
export function stepLikeness(x: ArrayLike<number>, fs: number): number {
  const block = Math.max(1, Math.round(fs * 0.05));
  const nb = Math.floor(x.length / block);
  if (nb < 40) return 0;
  const m = new Float64Array(nb);
  for (let b = 0; b < nb; b++) {
    let s = 0;
    for (let j = 0; j < block; j++) s += x[b * block + j];
    m[b] = s / block;
  }
  // prefix sums for window means
  const pre = new Float64Array(nb + 1);
  for (let b = 0; b < nb; b++) pre[b + 1] = pre[b] + m[b];
  const mean = (a: number, b: number) => (pre[b] - pre[a]) / (b - a);
  const J = new Float64Array(nb);
  for (let b = 4; b + 12 <= nb; b++) J[b] = mean(b, b + 4) - mean(b - 4, b);
  const absJ = new Float64Array(Math.max(0, nb - 16));
  for (let i = 0; i < absJ.length; i++) absJ[i] = Math.abs(J[i + 4]);
  const med = medianOf(absJ);
  const dev = new Float64Array(absJ.length);
  for (let i = 0; i < absJ.length; i++) dev[i] = Math.abs(absJ[i] - med);
  const mad = medianOf(dev) * 1.4826;
  const threshold = med + 4 * Math.max(mad, 1e-12);
  const persist: number[] = [];
  let last = -Infinity;
  for (let b = 5; b + 13 <= nb; b++) {
    const a = Math.abs(J[b]);
    if (a < threshold || a < Math.abs(J[b - 1]) || a < Math.abs(J[b + 1])) continue;
    if (b - last < 10) continue;
    last = b;
    const p = (mean(b + 4, b + 12) - mean(b - 4, b)) / J[b];
    persist.push(Math.max(0, Math.min(1, p)));
  }
  if (persist.length < 3) return 0;
  persist.sort((a, b) => a - b);
  return persist[Math.floor(persist.length / 2)];
}
