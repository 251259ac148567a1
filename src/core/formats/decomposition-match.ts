/**
 * Matching a decomposition (from any file format, decomposition-file.ts) to the channels of a recording: the
 * check every reader of a decomposition runs before using it with a recording (workbench, `winnow evidence`,
 * `winnow clean`).
 */
import type { Decomposition } from '../decomposition.ts';
import { parseFail, parseOk, type ParseErrorCode, type ParseResult } from './parse-result.ts';

/**
 * Checks a decomposition against a recording's channel labels: every decomposition channel must exist in the
 * recording (exact label, else case-insensitive match), shapes must agree and values be finite. Recording
 * channels the decomposition does not use are reported as a warning (EOG or bad channels are usually left out).
 * Returns the decomposition with channel labels spelled as in the recording.
 */
export function matchDecompositionToRecording(d: Decomposition, recordingLabels: readonly string[], fileName: string): ParseResult<Decomposition> {
  const fail = (code: ParseErrorCode, message: string) => parseFail<Decomposition>({ code, message: `${fileName}: ${message}`, file: fileName });
  const { nChannels: n, nComponents: k } = d;
  if (d.channels.length !== n) return fail('bad-shape', `lists ${d.channels.length} channels but declares ${n}`);
  if (d.mixing.length !== n * k) return fail('bad-shape', `mixing holds ${d.mixing.length} values, expected ${n} channels × ${k} components`);
  if (d.unmixing.length !== n * k) return fail('bad-shape', `unmixing holds ${d.unmixing.length} values, expected ${k} components × ${n} channels`);
  if (d.channelMeans && d.channelMeans.length !== n) return fail('bad-shape', `channelMeans holds ${d.channelMeans.length} values for ${n} channels`);
  for (const [name, M] of [['mixing', d.mixing], ['unmixing', d.unmixing], ['channelMeans', d.channelMeans ?? new Float64Array(0)]] as const) {
    const bad = M.findIndex((v) => !Number.isFinite(v));
    if (bad >= 0) return fail('bad-value', `${name} value ${bad + 1} is ${M[bad]}, not a finite number`);
  }
  const exact = new Map<string, string>();
  const loose = new Map<string, string>();
  for (const l of recordingLabels) {
    exact.set(l, l);
    const key = l.trim().toLowerCase();
    if (!loose.has(key)) loose.set(key, l);
  }
  const matched: string[] = [];
  const missing: string[] = [];
  for (const c of d.channels) {
    const m = exact.get(c) ?? loose.get(c.trim().toLowerCase());
    if (m === undefined) missing.push(c);
    else matched.push(m);
  }
  if (missing.length > 0)
    return fail(
      'unknown-channel',
      `${missing.length} channel(s) of the decomposition are not in the recording: ${missing.slice(0, 10).join(', ')}${missing.length > 10 ? ', …' : ''}`,
    );
  const dup = matched.find((c, i) => matched.indexOf(c) !== i);
  if (dup !== undefined) return fail('bad-value', `two decomposition channels match recording channel "${dup}"`);
  const used = new Set(matched);
  const unused = recordingLabels.filter((l) => !used.has(l));
  const warnings = unused.length > 0 ? [`${fileName}: recording channels not in the decomposition (left as recorded): ${unused.join(', ')}`] : [];
  return parseOk({ ...d, channels: matched }, warnings);
}
