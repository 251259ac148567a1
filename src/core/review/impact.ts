/**
 * Impact on the aim (issue 6): how much each component contributes to the quantity the researcher will
 * analyse at a region of interest, and how much the current set of removals changes that quantity.
 *
 * - ERP target (a time window): the ROI average of the back-projected event-locked averages,
 *   c_i(t) = w_i · ē_i(t), with w_i = mean over ROI channels of A[c, i] and ē_i the component's
 *   baseline-corrected average in activation units (ComponentEvidence.erp.mean ÷ strongestChannel.weight).
 *   The ERP is linear in the components, so Σ_i c_i(t) is the ERP of the decomposed part of the data
 *   exactly. Share_i = Σ_t c_i(t) · total(t) / Σ_t total(t)² over the window (a projection: the shares sum
 *   to 1, and a share is negative when the component cancels part of the ERP).
 * - Oscillations target (a band): band power at the ROI average, Σ_i w_i² P_i(band), with P_i the
 *   activation's band power. This assumes the components are uncorrelated (ICA's premise), so cross terms
 *   vanish; Share_i = w_i² P_i / Σ_j w_j² P_j.
 *
 * Only the part of the data the decomposition spans is counted (PCA-reduced decompositions leave a
 * residual that removals never touch; docs/methods.md §7.6).
 */
import type { ComponentEvidence } from '../evidence/types.ts';

export type ImpactTarget =
  | { readonly kind: 'erp'; readonly windowS: readonly [number, number] }
  | { readonly kind: 'oscillations'; readonly bandHz: readonly [number, number] };

export interface ImpactInput {
  /** Evidence of every component (index 1-based, as computed). */
  readonly components: readonly ComponentEvidence[];
  /** Mixing matrix nChannels × nComponents, row-major (decomposition channel order). */
  readonly mixing: Float64Array;
  readonly nChannels: number;
  readonly nComponents: number;
  /** ROI channel indices (decomposition order, 0-based); indices outside 0…nChannels−1 are ignored. */
  readonly roi: readonly number[];
  readonly target: ImpactTarget;
  /** Components currently marked for removal, by 1-based index. */
  readonly removed: ReadonlySet<number> | readonly number[];
}

export interface ComponentImpact {
  /** 1-based component index. */
  readonly index: number;
  /** Share of the ROI ERP (projection, may be negative) or of the ROI band power (0…1). NaN when unavailable. */
  readonly share: number;
  /** ERP: mean amplitude contributed in the window, µV. Oscillations: band power contributed, µV². */
  readonly contribution: number;
  readonly removed: boolean;
}

export interface ImpactResult {
  readonly target: ImpactTarget;
  readonly perComponent: ComponentImpact[];
  /** ERP: mean amplitude in the window, µV; oscillations: band power, µV² — before and after the removals. */
  readonly before: number;
  readonly after: number;
  /** after − before, and (after − before) / |before|. */
  readonly change: number;
  readonly relativeChange: number;
  /** ERP only: RMS over the window of the waveform removed, µV (0 for oscillations). */
  readonly removedRms: number;
  /** Component indices (1-based) by decreasing |share|; components without a share last. */
  readonly order: number[];
}

/** Share of each component in the aim's quantity at the ROI, and the effect of the current removals. */
export function computeImpact(input: ImpactInput): ImpactResult {
  const { components, mixing, nChannels, nComponents, roi, target } = input;
  const removedSet = input.removed instanceof Set ? input.removed : new Set(input.removed as readonly number[]);
  const roiChannels = roi.filter((c) => Number.isInteger(c) && c >= 0 && c < nChannels);
  const roiWeight = (i: number) => {
    let w = 0;
    for (const c of roiChannels) w += mixing[c * nComponents + i];
    return roiChannels.length > 0 ? w / roiChannels.length : NaN;
  };
  const perComponent: ComponentImpact[] = [];
  let before = 0;
  let after = 0;
  let removedRms = 0;

  if (target.kind === 'erp') {
    const [t0, t1] = target.windowS;
    // waveforms over the window
    const waves: (Float64Array | null)[] = components.map((e) => {
      if (!e.erp || !(e.strongestChannel.weight !== 0)) return null;
      const w = roiWeight(e.index - 1);
      const out: number[] = [];
      for (let j = 0; j < e.erp.times.length; j++) {
        const t = e.erp.times[j];
        if (t >= t0 - 1e-9 && t <= t1 + 1e-9) out.push((w * e.erp.mean[j]) / e.strongestChannel.weight);
      }
      return Float64Array.from(out);
    });
    const len = Math.min(...waves.filter((w): w is Float64Array => w !== null).map((w) => w.length));
    const L = Number.isFinite(len) ? len : 0;
    const total = new Float64Array(L);
    const kept = new Float64Array(L);
    waves.forEach((w, k) => {
      if (!w) return;
      const isRemoved = removedSet.has(components[k].index);
      for (let j = 0; j < L; j++) {
        total[j] += w[j];
        if (!isRemoved) kept[j] += w[j];
      }
    });
    let tt = 0;
    for (let j = 0; j < L; j++) {
      tt += total[j] * total[j];
      before += total[j];
      after += kept[j];
      removedRms += (total[j] - kept[j]) ** 2;
    }
    before = L > 0 ? before / L : NaN;
    after = L > 0 ? after / L : NaN;
    removedRms = L > 0 ? Math.sqrt(removedRms / L) : NaN;
    waves.forEach((w, k) => {
      let dotp = 0;
      let mean = 0;
      if (w) for (let j = 0; j < L; j++) {
        dotp += w[j] * total[j];
        mean += w[j];
      }
      perComponent.push({
        index: components[k].index,
        share: w && tt > 0 ? dotp / tt : NaN,
        contribution: w && L > 0 ? mean / L : NaN,
        removed: removedSet.has(components[k].index),
      });
    });
  } else {
    const [lo, hi] = target.bandHz;
    const contributions = components.map((e) => {
      const { frequencies, power, df } = e.spectrum;
      const weight = e.strongestChannel.weight;
      if (!(weight !== 0)) return NaN;
      let p = 0;
      for (let k = 0; k < frequencies.length; k++) if (frequencies[k] >= lo - 1e-9 && frequencies[k] <= hi + 1e-9) p += power[k];
      const w = roiWeight(e.index - 1);
      return (w * w * p * df) / (weight * weight);
    });
    contributions.forEach((c, k) => {
      if (!Number.isFinite(c)) return;
      before += c;
      if (!removedSet.has(components[k].index)) after += c;
    });
    contributions.forEach((c, k) =>
      perComponent.push({ index: components[k].index, share: before > 0 ? c / before : NaN, contribution: c, removed: removedSet.has(components[k].index) }),
    );
  }

  const order = orderByImpact(perComponent);
  const change = after - before;
  return {
    target,
    perComponent,
    before,
    after,
    change,
    relativeChange: before !== 0 ? change / Math.abs(before) : NaN,
    removedRms: target.kind === 'erp' ? removedRms : 0,
    order,
  };
}

/** Component indices (1-based) by decreasing |share|; NaN shares last, ties by index. */
export function orderByImpact(perComponent: readonly ComponentImpact[]): number[] {
  return [...perComponent]
    .sort((a, b) => {
      const fa = Number.isFinite(a.share);
      const fb = Number.isFinite(b.share);
      if (fa !== fb) return fa ? -1 : 1;
      return (fb ? Math.abs(b.share) : 0) - (fa ? Math.abs(a.share) : 0) || a.index - b.index;
    })
    .map((c) => c.index);
}
