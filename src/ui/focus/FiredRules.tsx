/**
 * The threshold comparisons that fired for the suggestion (review/suggest.ts suggestWithRules), each as
 * "measure: value direction threshold (source)". Shown beside the answer they belong to.
 */
import type { FiredRule } from '../../core/review/suggest.ts';
import { firedRuleText, SHARE_MEASURES } from './focus-logic.ts';

/** Plain names of the measures the rules compare (dotted paths into the evidence). */
const MEASURE_NAMES: Record<string, string> = {
  varianceShare: 'variance share',
  'focality.share': 'share on one electrode',
  frontalGradient: 'front-to-back gradient',
  lateralAntisymmetry: 'left–right opposition',
  'dipole.residualVariance': 'dipole residual variance',
  'dipole.distanceFromCentreMm': 'dipole distance from the centre (mm)',
  kurtosis: 'kurtosis',
  stepLikeness: 'step-like jumps',
  'eogCorrelation.vertical': 'correlation with vertical eye channel',
  'eogCorrelation.horizontal': 'correlation with horizontal eye channel',
  'cardiac.peak': 'heartbeat periodicity',
  'erp.timeLockingStrength': 'time-locked share above shuffled times',
  'stepLocking.share': 'share locked to steps',
  'oneOverF.exponent': '1/f exponent',
  alphaProminence: 'alpha prominence',
  highFrequencyShare: 'high-frequency share',
  highFrequencySlope: 'slope above 20 Hz',
  lowFrequencyShare: 'low-frequency share',
  mainsShare: 'mains share',
  linePeakRatio: 'mains peak ratio',
};

export const measureName = (m: string) => MEASURE_NAMES[m] ?? m;

export function FiredRules({ rules, empty }: { rules: readonly FiredRule[]; empty: string }) {
  if (rules.length === 0) return <p className="fired-none">{empty}</p>;
  return (
    <ul className="fired-rules">
      {rules.map((r, i) => (
        <li key={`${r.measure}-${i}`} data-measure={r.measure}>
          <span className="fired-measure">{measureName(r.measure)}</span>{' '}
          <span className="fired-value">{firedRuleText(r, SHARE_MEASURES.test(r.measure))}</span>
        </li>
      ))}
    </ul>
  );
}
