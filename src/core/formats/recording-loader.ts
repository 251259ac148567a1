/**
 * Loads one recording (.edf/.bdf) and its BIDS sidecars from a set of files (a picker selection, a dropped
 * folder, or files named on the command line) into a LoadedRecording.
 *
 * Pairing [BIDS specification, "inheritance principle"]: a sidecar belongs to the recording when every
 * entity it names (sub-, ses-, task-, acq-, run-) has the recording's value; among several, the one naming
 * the most entities wins. Plain `channels.tsv` / `electrodes.tsv` / `events.tsv` / `coordsystem.json`
 * (no entities, as the simulator writes them next to `recording.edf`) match any recording.
 *
 * Decisions:
 * - Several .edf/.bdf files: `opts.recording` names the one to load; otherwise the only BIDS `*_eeg` file or
 *   the only `recording.edf/.bdf` is taken (the others are named in a warning); otherwise the load fails.
 * - channels.tsv must describe the file's signal channels: same count and the same names (order may
 *   differ); otherwise the load fails with the file's name and the mismatch.
 * - Events: the file's annotations and events.tsv rows are merged. When an events.tsv row has the same
 *   label and an onset within 1 ms of an annotation, the events.tsv row is kept (it may carry a
 *   response_time) and the annotation is dropped, so an exporter that wrote both does not double events.
 * - Signals: the "main rate" is the most common rate among EEG-typed channels (ties: the higher rate; no
 *   EEG channels: among all). Every channel at that rate is read into one SignalBlock; channels at other
 *   rates stay listed in `channels` and a warning names them.
 * - Positions: electrodes.tsv when given (projected onto a sphere fitted to them, as unit vectors), else the
 *   idealised 10-20/10-10 set. Only EEG-typed channels get positions; unmatched EEG channels are warned about.
 * - Mains: PowerLineFrequency of the paired `*_eeg.json` (plain `eeg.json` beside `recording.edf`) becomes
 *   `powerLine` when it is 50 or 60 Hz. A sidecar that is not valid JSON, or any other value, is warned about
 *   (the load goes on); the evidence then assumes 50 Hz and says so (`mainsFrequency`, power-line.ts).
 */
import { byteSourceBaseName, type ByteSource } from './byte-source.ts';
import { parseChannelsTsv, parseEegJson, parseElectrodesTsv, parseEventsTsv } from './bids.ts';
import { readEdfInfo, readEdfSignals } from './edf.ts';
import { parseFail, parseOk, type ParseResult } from './parse-result.ts';
import type { ChannelInfo, LoadedRecording, PowerLine, RecordingEvent } from '../recording.ts';
import { matchMontage, electrodeNameFromLabel } from '../headmodel/montage-1020.ts';

export interface LoadRecordingOptions {
  /** Base name of the recording to load when the set holds several .edf/.bdf files. */
  recording?: string;
  /** Called with the fraction done (0–1): the annotation scan is the first 30 %, the samples the rest. */
  onProgress?: (fraction: number) => void;
}

const ENTITY_KEYS = ['sub', 'ses', 'task', 'acq', 'run'] as const;

/** BIDS entities and suffix of a file name: "sub-01_task-rest_eeg.edf" → {sub: '01', task: 'rest'}, 'eeg'. */
export function bidsNameParts(fileName: string): { entities: Record<string, string>; suffix: string; extension: string } {
  const base = byteSourceBaseName(fileName);
  const dot = base.indexOf('.');
  const stem = dot >= 0 ? base.slice(0, dot) : base;
  const extension = dot >= 0 ? base.slice(dot).toLowerCase() : '';
  const parts = stem.split('_');
  const entities: Record<string, string> = {};
  let suffix = '';
  for (const p of parts) {
    const m = /^([a-zA-Z0-9]+)-(.*)$/.exec(p);
    if (m) entities[m[1]] = m[2];
    else suffix = p;
  }
  return { entities, suffix, extension };
}

/** Score of a sidecar for the recording: −1 when an entity conflicts, else the number of entities shared. */
function pairingScore(rec: Record<string, string>, side: Record<string, string>): number {
  let score = 0;
  for (const k of ENTITY_KEYS) {
    if (side[k] === undefined) continue;
    if (rec[k] !== side[k]) return -1;
    score++;
  }
  return score;
}

function pickSidecar(files: ByteSource[], recEntities: Record<string, string>, suffix: string, extension: string): ByteSource | undefined {
  let best: ByteSource | undefined;
  let bestScore = -1;
  for (const f of files) {
    const p = bidsNameParts(f.name);
    if (p.suffix !== suffix || p.extension !== extension) continue;
    const s = pairingScore(recEntities, p.entities);
    if (s > bestScore) {
      best = f;
      bestScore = s;
    }
  }
  return best;
}

/**
 * The mains frequency stated by the *_eeg.json paired with `recordingName` among `files` (same pairing as the
 * other sidecars). Parse faults become warnings: the mains frequency only tunes the spectrum measures.
 */
export async function readPowerLine(files: ByteSource[], recordingName: string): Promise<{ powerLine: PowerLine; warnings: string[] }> {
  const side = pickSidecar(files, bidsNameParts(recordingName).entities, 'eeg', '.json');
  if (!side) return { powerLine: { hz: null, sidecar: null }, warnings: [] };
  const name = byteSourceBaseName(side.name);
  const parsed = parseEegJson(await readText(side), name);
  if (!parsed.ok) return { powerLine: { hz: null, sidecar: name }, warnings: [`${parsed.error.message}; mains frequency not read`] };
  const warnings = [...parsed.warnings];
  const v = parsed.value.powerLineFrequency;
  if (v !== null && v !== 50 && v !== 60) warnings.push(`${name}: PowerLineFrequency ${v} Hz is neither 50 nor 60; not used`);
  return { powerLine: { hz: v === 50 || v === 60 ? v : null, sidecar: name }, warnings };
}

async function readText(source: ByteSource): Promise<string> {
  return new TextDecoder('utf-8').decode(await source.read(0, source.size));
}

/**
 * Least-squares sphere through points (rows of xyz, mm): solves [2x 2y 2z 1]·[c; d] = x²+y²+z²
 * (algebraic fit, common practice). Returns the centre, or null when the system is singular.
 */
function fitSphereCentre(pts: Float64Array, n: number): [number, number, number] | null {
  const A = new Float64Array(16);
  const b = new Float64Array(4);
  for (let i = 0; i < n; i++) {
    const x = pts[3 * i];
    const y = pts[3 * i + 1];
    const z = pts[3 * i + 2];
    const row = [2 * x, 2 * y, 2 * z, 1];
    const rhs = x * x + y * y + z * z;
    for (let r = 0; r < 4; r++) {
      b[r] += row[r] * rhs;
      for (let c = 0; c < 4; c++) A[4 * r + c] += row[r] * row[c];
    }
  }
  // Gaussian elimination with partial pivoting on the 4×4 normal equations.
  for (let col = 0; col < 4; col++) {
    let piv = col;
    for (let r = col + 1; r < 4; r++) if (Math.abs(A[4 * r + col]) > Math.abs(A[4 * piv + col])) piv = r;
    if (Math.abs(A[4 * piv + col]) < 1e-12) return null;
    for (let c = 0; c < 4; c++) [A[4 * col + c], A[4 * piv + c]] = [A[4 * piv + c], A[4 * col + c]];
    [b[col], b[piv]] = [b[piv], b[col]];
    for (let r = col + 1; r < 4; r++) {
      const f = A[4 * r + col] / A[4 * col + col];
      for (let c = col; c < 4; c++) A[4 * r + c] -= f * A[4 * col + c];
      b[r] -= f * b[col];
    }
  }
  const x = new Float64Array(4);
  for (let r = 3; r >= 0; r--) {
    let s = b[r];
    for (let c = r + 1; c < 4; c++) s -= A[4 * r + c] * x[c];
    x[r] = s / A[4 * r + r];
  }
  return [x[0], x[1], x[2]];
}

/**
 * When several recordings are given, the one a set of files is about: the BIDS data file (suffix `eeg`), or
 * `recording.edf`/`.bdf` as the simulator names its sensor data (next to e.g. `neural.edf`).
 */
function isPrimaryRecording(f: ByteSource): boolean {
  const p = bidsNameParts(f.name);
  return p.suffix === 'eeg' || /^recording\.(edf|bdf)$/i.test(byteSourceBaseName(f.name));
}

/** Loads the recording in `files` with its sidecars. See the module comment for the rules. */
export async function loadRecording(files: ByteSource[], opts: LoadRecordingOptions = {}): Promise<ParseResult<LoadedRecording>> {
  const recordings = files.filter((f) => /\.(edf|bdf)$/i.test(f.name));
  let rec: ByteSource | undefined;
  if (opts.recording !== undefined) {
    rec = recordings.find((f) => byteSourceBaseName(f.name) === opts.recording || f.name === opts.recording);
    if (!rec)
      return parseFail({ code: 'unsupported', message: `${opts.recording}: not among the given files (${files.map((f) => byteSourceBaseName(f.name)).join(', ')})`, file: opts.recording });
  } else if (recordings.length === 1) rec = recordings[0];
  else if (recordings.filter(isPrimaryRecording).length === 1) rec = recordings.find(isPrimaryRecording);
  else if (recordings.length === 0)
    return parseFail({
      code: 'unsupported',
      message: `${files.map((f) => byteSourceBaseName(f.name)).join(', ') || '(no files)'}: no .edf or .bdf recording among the files`,
    });
  else
    return parseFail({
      code: 'unsupported',
      message: `${byteSourceBaseName(recordings[0].name)}: ${recordings.length} recordings given (${recordings.map((f) => byteSourceBaseName(f.name)).join(', ')}); choose one`,
      file: recordings[0].name,
    });

  if (!rec) return parseFail({ code: 'unsupported', message: '(no files): no .edf or .bdf recording among the files' });
  const progress = opts.onProgress;
  const infoRes = await readEdfInfo(rec, { onProgress: progress && ((f) => progress(0.3 * f)) });
  if (!infoRes.ok) return infoRes;
  const info = infoRes.value;
  const warnings = [...infoRes.warnings];
  const recName = byteSourceBaseName(rec.name);
  const chosen = rec;
  const ignored = recordings.filter((f) => f !== chosen).map((f) => byteSourceBaseName(f.name));
  if (ignored.length > 0) warnings.push(`${recName}: loaded; ${ignored.join(', ')} ignored (one recording at a time)`);
  const ent = bidsNameParts(rec.name).entities;
  let channels: ChannelInfo[] = info.channels.map((c) => ({ ...c }));

  // channels.tsv: types and status
  const chSide = pickSidecar(files, ent, 'channels', '.tsv');
  if (chSide) {
    const name = byteSourceBaseName(chSide.name);
    const parsed = parseChannelsTsv(await readText(chSide), name);
    if (!parsed.ok) return parsed;
    warnings.push(...parsed.warnings);
    const rows = parsed.value;
    if (rows.length !== channels.length)
      return parseFail({
        code: 'row-count-mismatch',
        message: `${name}: ${rows.length} channel rows but ${recName} has ${channels.length} signal channels`,
        file: name,
      });
    const used = new Set<number>();
    const updated: ChannelInfo[] = [];
    for (const ch of channels) {
      let j = rows.findIndex((r, k) => !used.has(k) && r.name === ch.label);
      if (j < 0) j = rows.findIndex((r, k) => !used.has(k) && r.name.toLowerCase() === ch.label.toLowerCase());
      if (j < 0)
        return parseFail({
          code: 'unknown-channel',
          message: `${name}: no row for channel "${ch.label}" of ${recName} (rows name ${rows.map((r) => r.name).join(', ')})`,
          file: name,
        });
      used.add(j);
      updated.push({ ...ch, type: rows[j].type, status: rows[j].status });
    }
    channels = updated;
  }

  // events: annotations + events.tsv (events.tsv wins on duplicates)
  let events: RecordingEvent[] = [...info.events];
  const evSide = pickSidecar(files, ent, 'events', '.tsv');
  if (evSide) {
    const name = byteSourceBaseName(evSide.name);
    const parsed = parseEventsTsv(await readText(evSide), name);
    if (!parsed.ok) return parsed;
    warnings.push(...parsed.warnings);
    const fromTsv = parsed.value;
    events = events.filter(
      (a) => a.source !== 'annotation' || !fromTsv.some((t) => t.label === a.label && Math.abs(t.onset - a.onset) <= 1e-3),
    );
    events.push(...fromTsv);
    events.sort((a, b) => a.onset - b.onset);
  }

  // main-rate channels
  const eegRates = channels.filter((c) => c.type === 'EEG').map((c) => c.sampleRate);
  const pool = eegRates.length > 0 ? eegRates : channels.map((c) => c.sampleRate);
  const counts = new Map<number, number>();
  for (const r of pool) counts.set(r, (counts.get(r) ?? 0) + 1);
  let mainRate = 0;
  let best = -1;
  for (const [r, n] of counts) if (n > best || (n === best && r > mainRate)) [mainRate, best] = [r, n];
  const loadedIdx = channels.map((c, i) => (c.sampleRate === mainRate ? i : -1)).filter((i) => i >= 0);
  const others = channels.filter((c) => c.sampleRate !== mainRate);
  if (others.length > 0)
    warnings.push(`${recName}: ${others.map((c) => `${c.label} (${c.sampleRate} Hz)`).join(', ')} not loaded; the main rate is ${mainRate} Hz`);
  const sig = await readEdfSignals(rec, info, {
    channels: loadedIdx.map((i) => channels[i].label),
    onProgress: progress && ((f) => progress(0.3 + 0.7 * f)),
  });
  if (!sig.ok) return sig;
  // Labels may repeat in a file; readEdfSignals matches the first, so keep the block's own labels.
  const signals = sig.value;

  // positions for the loaded channels
  const positions = new Float64Array(loadedIdx.length * 3).fill(NaN);
  const eegLabels = loadedIdx.map((i) => channels[i]).filter((c) => c.type === 'EEG').map((c) => c.label);
  const elSide = pickSidecar(files, ent, 'electrodes', '.tsv');
  let unmatched: string[] = [];
  if (elSide) {
    const name = byteSourceBaseName(elSide.name);
    const elEnt = bidsNameParts(elSide.name).entities;
    const cs = pickSidecar(files, { ...ent, ...elEnt }, 'coordsystem', '.json');
    const parsed = parseElectrodesTsv(await readText(elSide), name, cs ? await readText(cs) : undefined);
    if (!parsed.ok) return parsed;
    warnings.push(...parsed.warnings);
    const { names, positionsMm } = parsed.value;
    const finite: number[] = [];
    for (let i = 0; i < names.length; i++)
      if ([0, 1, 2].every((k) => Number.isFinite(positionsMm[3 * i + k]))) finite.push(i);
    const pts = new Float64Array(finite.length * 3);
    finite.forEach((i, j) => pts.set(positionsMm.subarray(3 * i, 3 * i + 3), 3 * j));
    const centre = (finite.length >= 16 ? fitSphereCentre(pts, finite.length) : null) ?? [0, 0, 0];
    const lower = new Map(names.map((n, i) => [n.toLowerCase(), i]));
    loadedIdx.forEach((ci, j) => {
      const ch = channels[ci];
      if (ch.type !== 'EEG') return;
      const e = lower.get(ch.label.toLowerCase()) ?? lower.get(electrodeNameFromLabel(ch.label).toLowerCase());
      if (e === undefined || !finite.includes(e)) {
        unmatched.push(ch.label);
        return;
      }
      const v = [0, 1, 2].map((k) => positionsMm[3 * e + k] - centre[k]);
      const r = Math.hypot(v[0], v[1], v[2]);
      if (r > 0) for (let k = 0; k < 3; k++) positions[3 * j + k] = v[k] / r;
      else unmatched.push(ch.label);
    });
  } else {
    const m = matchMontage(eegLabels);
    const pos = new Map(eegLabels.map((l, i) => [l, i]));
    loadedIdx.forEach((ci, j) => {
      const i = pos.get(channels[ci].label);
      if (i !== undefined) positions.set(m.positions.subarray(3 * i, 3 * i + 3), 3 * j);
    });
    unmatched = m.unmatched;
  }
  if (unmatched.length > 0)
    warnings.push(
      `${recName}: no electrode position for ${unmatched.join(', ')} (${elSide ? `not in ${byteSourceBaseName(elSide.name)}` : 'not a 10-20/10-10 name'})`,
    );

  // mains frequency from *_eeg.json
  const mains = await readPowerLine(files, rec.name);
  warnings.push(...mains.warnings);

  const loaded: LoadedRecording = { ...info, channels, events, signals, positions, powerLine: mains.powerLine, warnings };
  return parseOk(loaded, warnings);
}
