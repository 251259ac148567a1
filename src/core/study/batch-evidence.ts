/**
 * Reusing the evidence a batch run left beside a recording (issue 11): `winnow batch` writes
 * `derivatives/winnow/sub-<l>/[ses-<l>/]eeg/<stem>_desc-winnow_evidence.json` ("winnow-evidence/1",
 * formats/evidence-file.ts). The workbench loads it instead of computing the evidence again only when it is
 * evidence of the very files opened: the same format version, the same recording (SHA-256 of its bytes),
 * the same decomposition (SHA-256 of the decomposition file's bytes) and the same components and channels.
 * Anything else is refused with the reason, and the evidence is computed as usual.
 *
 * Pure: the parsed file and the loaded facts in, evidence or a reason out.
 */
import type { ComponentEvidence, ErpEvidence, TimeLockingTest } from '../evidence/types.ts';
import { EVIDENCE_FORMAT, type EvidenceFile, type EvidenceFileComponent } from '../formats/evidence-file.ts';

export interface LoadedFacts {
  readonly recordingSha256: string;
  readonly decompositionSha256: string;
  readonly nComponents: number;
  /** Channels of the decomposition (its order). */
  readonly channels: readonly string[];
  /** Sampling rate of the signals the decomposition was applied to, Hz (for the Welch segment length). */
  readonly sampleRate: number;
}

export type BatchEvidenceResult =
  | { readonly ok: true; readonly evidence: ComponentEvidence[] }
  | { readonly ok: false; readonly why: string };

const short = (h: string) => `${h.slice(0, 12)}…`;

/**
 * Whether the file is evidence of the loaded recording and decomposition; the first reason it is not.
 * Order: format version, recording hash, decomposition hash, component count, then each component's fields.
 */
export function matchBatchEvidence(file: EvidenceFile, loaded: LoadedFacts): BatchEvidenceResult {
  if (file.format !== EVIDENCE_FORMAT) return { ok: false, why: `format ${JSON.stringify(file.format)}, this version reads ${EVIDENCE_FORMAT}` };
  if (file.recordingSha256 === null || file.decompositionSha256 === null)
    return { ok: false, why: 'it does not record the hashes of its recording and decomposition (written by an older version)' };
  if (file.recordingSha256 !== loaded.recordingSha256)
    return { ok: false, why: `made for another recording (SHA-256 ${short(file.recordingSha256)}, this one is ${short(loaded.recordingSha256)})` };
  if (file.decompositionSha256 !== loaded.decompositionSha256)
    return { ok: false, why: `made for another decomposition (SHA-256 ${short(file.decompositionSha256)}, this one is ${short(loaded.decompositionSha256)})` };
  if (file.components.length !== loaded.nComponents)
    return { ok: false, why: `${file.components.length} components, the decomposition has ${loaded.nComponents}` };
  const evidence: ComponentEvidence[] = [];
  for (let k = 0; k < file.components.length; k++) {
    const c = file.components[k];
    if (c.index !== k + 1) return { ok: false, why: `component ${k + 1} is numbered ${c.index}` };
    const e = componentEvidence(c, loaded);
    if (typeof e === 'string') return { ok: false, why: `component ${c.index}: ${e}` };
    evidence.push(e);
  }
  return { ok: true, evidence };
}

const isObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);
/** A number as written (NaN and infinities were written as null). */
const num = (v: unknown): number => (typeof v === 'number' ? v : NaN);
const numOrNull = (v: unknown): number | null => (typeof v === 'number' ? v : null);
const isList = (v: unknown): v is unknown[] => Array.isArray(v) && v.every((x) => x === null || typeof x === 'number');
const f64 = (v: unknown[]): Float64Array => Float64Array.from(v, num);

/** One component's evidence from its file object, or what is missing. Trial stacks are not in the file (null). */
function componentEvidence(c: EvidenceFileComponent, loaded: LoadedFacts): ComponentEvidence | string {
  const n = loaded.channels.length;
  const { spectrum, focality, eogCorrelation: eog, cardiac, strongestChannel: strongest } = c;
  if (!isList(c.map) || c.map.length !== n) return `its map has ${Array.isArray(c.map) ? c.map.length : 'no'} values for ${n} channels`;
  if (!isList(c.variancePerChannel) || c.variancePerChannel.length !== n)
    return 'no variance per channel for these channels (written by an older version)';
  if (!isObject(spectrum) || !isList(spectrum.frequencies) || !isList(spectrum.power) || !isList(spectrum.powerDb) || spectrum.frequencies.length < 2)
    return 'no spectrum';
  if (!isObject(strongest) || !Number.isInteger(strongest.index) || (strongest.index as number) < 0 || (strongest.index as number) >= n || typeof strongest.label !== 'string')
    return 'no strongest channel';
  if (strongest.label !== loaded.channels[strongest.index as number])
    return `its strongest channel ${strongest.label} is not channel ${(strongest.index as number) + 1} of the decomposition`;
  if (!isObject(focality) || !isObject(eog) || !isObject(eog.channels) || !isObject(cardiac)) return 'focality, gaze reference or cardiac measures missing';
  const freqs = f64(spectrum.frequencies);
  const df = freqs[1] - freqs[0];
  const erp = erpEvidence(c.erp);
  if (typeof erp === 'string') return erp;
  const sl = c.stepLocking;
  const dip = c.dipole;
  return {
    index: c.index,
    varianceShare: num(c.varianceShare),
    variancePerChannel: f64(c.variancePerChannel),
    strongestChannel: { index: strongest.index as number, label: strongest.label, weight: num(strongest.weight) },
    map: f64(c.map),
    spectrum: { frequencies: freqs, power: f64(spectrum.power), powerDb: f64(spectrum.powerDb), nfft: Math.round(loaded.sampleRate / df), df },
    // fit range 2–40 Hz as computeEvidence fits it (docs/methods.md §3)
    oneOverF: { exponent: num(c.oneOverFExponent), offset: num(c.oneOverFOffset), rangeHz: [2, 40], fitR2: num(c.oneOverFFitR2) },
    alphaPeakHz: numOrNull(c.alphaPeakHz),
    alphaProminence: num(c.alphaProminence),
    highFrequencyShare: num(c.highFrequencyShare),
    highFrequencySlope: num(c.highFrequencySlope),
    mainsShare: num(c.mainsShare),
    linePeakRatio: num(c.linePeakRatio),
    lowFrequencyShare: num(c.lowFrequencyShare),
    kurtosis: num(c.kurtosis),
    focality: { share: num(focality.share), channel: String(focality.channel ?? '') },
    frontalGradient: num(c.frontalGradient),
    frontalShare: num(c.frontalShare),
    lateralAntisymmetry: num(c.lateralAntisymmetry),
    stepLikeness: num(c.stepLikeness),
    eogCorrelation: {
      vertical: numOrNull(eog.vertical),
      horizontal: numOrNull(eog.horizontal),
      source: (['EOG channels', 'frontal bipolar', 'none'].includes(eog.source as string) ? eog.source : 'none') as ComponentEvidence['eogCorrelation']['source'],
      channels: {
        vertical: typeof eog.channels.vertical === 'string' ? eog.channels.vertical : null,
        horizontal: typeof eog.channels.horizontal === 'string' ? eog.channels.horizontal : null,
      },
    },
    cardiac: { bpm: numOrNull(cardiac.bpm), peak: num(cardiac.peak), beatSharpness: num(cardiac.beatSharpness), intervalCv: num(cardiac.intervalCv) },
    stepLocking: isObject(sl) ? { share: num(sl.share), event: String(sl.event ?? ''), nEpochs: num(sl.nEpochs) } : null,
    erp,
    timeLocking: Array.isArray(c.timeLocking) ? c.timeLocking.filter(isObject).map(lockingTest) : [],
    trialStack: null,
    dipole: isObject(dip) && isList(dip.position) && isList(dip.moment) && dip.position.length === 3 && dip.moment.length === 3
      ? {
          position: [num(dip.position[0]), num(dip.position[1]), num(dip.position[2])],
          moment: [num(dip.moment[0]), num(dip.moment[1]), num(dip.moment[2])],
          residualVariance: num(dip.residualVariance),
          atBoundary: dip.atBoundary === true,
          region: String(dip.region ?? ''),
        }
      : null,
  };
}

function erpEvidence(v: unknown): ErpEvidence | null | string {
  if (v === null || v === undefined) return null;
  if (!isObject(v) || !isList(v.times) || !isList(v.mean) || !isList(v.lower) || !isList(v.upper) || typeof v.event !== 'string') return 'its event-locked average is incomplete';
  return {
    event: v.event,
    nEpochs: num(v.nEpochs),
    times: f64(v.times),
    mean: f64(v.mean),
    band: { lower: f64(v.lower), upper: f64(v.upper) },
    itc: num(v.itc),
    itcFrequencyHz: num(v.itcFrequencyHz),
    lockedShare: num(v.lockedShare),
    timeLockingStrength: num(v.timeLockingStrength),
    ...(v.permutationP !== undefined ? { permutationP: num(v.permutationP) } : {}),
    ...(typeof v.shuffles === 'number' ? { shuffles: v.shuffles } : {}),
  };
}

function lockingTest(t: Record<string, unknown>): TimeLockingTest {
  return {
    event: String(t.event ?? ''),
    ...(typeof t.column === 'string' ? { column: t.column, value: String(t.value ?? '') } : {}),
    nEpochs: num(t.nEpochs),
    lockedShare: num(t.lockedShare),
    strength: num(t.strength),
    p: num(t.p),
    shuffles: num(t.shuffles),
  };
}
