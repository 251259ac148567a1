/**
 * `winnow decompose <recording> --out FILE.json [--method infomax|picard] [--seed N] [--highpass HZ]
 * [--lowpass HZ] [--max-iter N] [--n-components K] [--channels-tsv FILE] [--threads 1|2]` (issue 5 contract): runs the
 * decomposition engine (src/core/ica/decompose.ts) on the good EEG channels of the recording's main sampling
 * rate and writes our decomposition JSON (src/core/formats/decomposition-file.ts) atomically. Progress
 * (stage, iteration, convergence, time left) goes to stderr about twice a second; a one-line summary to stdout.
 * Default method: picard (fast); infomax is the trade's usual default and is one option away.
 * `--highpass 0` turns the high-pass off (default 1 Hz). Picard's data passes use a second thread
 * (worker_threads over a SharedArrayBuffer) unless `--threads 1` or the machine has one core; results are
 * bit-identical for the same seed and thread count.
 */
import { availableParallelism } from 'node:os';
import { createRequire } from 'node:module';
import { pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';
import { CliError, sha256OfFile, numberOption, parseCommandArgs, type CliIo } from './cli-support.ts';
import { openCliRecording, readCliSignals } from './recording-files.ts';
import { writeFileAtomic } from './atomic-write.ts';
import { decompositionExtrasOf, serializeDecomposition } from '../core/formats/decomposition-file.ts';
import { decomposeInputOf } from '../core/recording-input.ts';
import { decomposeRecording, type DecomposeProgress } from '../core/ica/decompose.ts';
import { createIcaThreads, type IcaThreads, type PassHelperSetup } from '../core/ica/pass-threads.ts';
import { installNodeKernels } from './wasm-kernels.ts';

/**
 * A worker_threads helper for Picard's data passes (src/core/ica/pass-threads.ts), for the CLI and the bench.
 * The helper registers the tsx loader itself (workers do not inherit a loader registered through its API),
 * then runs runPassHelper for each setup it is sent. Resolves once the helper is ready; `close` ends it.
 */
export async function createNodeIcaThreads(): Promise<{ threads: IcaThreads; close(): Promise<void> }> {
  // The ESM entry of tsx's API (its CommonJS twin resolves the loader from the wrong folder inside a worker).
  const tsxApi = pathToFileURL(createRequire(import.meta.url).resolve('tsx/esm/api').replace(/\.cjs$/, '.mjs')).href;
  const helperUrl = new URL('../core/ica/pass-threads.ts', import.meta.url).href;
  const code = `
    const { parentPort } = require('node:worker_threads');
    (async () => {
      const { register } = await import(${JSON.stringify(tsxApi)});
      register();
      const mod = await import(${JSON.stringify(helperUrl)});
      parentPort.on('message', (setup) => mod.runPassHelper(setup));
      parentPort.postMessage('ready');
    })().catch((e) => parentPort.postMessage({ error: String(e && e.stack || e) }));
  `;
  const worker = new Worker(code, { eval: true });
  await new Promise<void>((resolve, reject) => {
    worker.once('message', (m) => (m === 'ready' ? resolve() : reject(new Error(`ICA helper thread failed to start: ${m?.error ?? m}`))));
    worker.once('error', reject);
  });
  worker.unref();
  return {
    threads: createIcaThreads((setup: PassHelperSetup) => worker.postMessage(setup)),
    close: async () => {
      await worker.terminate();
    },
  };
}

const USAGE =
  'usage: winnow decompose <recording> --out FILE.json [--method infomax|picard] [--seed N] [--highpass HZ] [--lowpass HZ] [--max-iter N] [--n-components K] [--channels-tsv FILE] [--threads 1|2]';

/** Help text for `winnow decompose --help` (first line: the usage). */
export const usage = `${USAGE}

Runs ICA on the good EEG channels of the recording's main sampling rate and writes the decomposition JSON
(winnow-decomposition/1) atomically. Progress goes to stderr, a one-line summary to stdout.

options:
  --out FILE.json           output decomposition file; required
  --method infomax|picard   ICA method (default picard)
  --seed N                  random seed, 0…4294967295 (default 1)
  --highpass HZ             high-pass cut-off in Hz (default 1; 0 turns it off)
  --lowpass HZ              low-pass cut-off in Hz (default none)
  --max-iter N              most iterations
  --n-components K          number of components
  --channels-tsv FILE       BIDS channels.tsv (bad channels are left out)
  --threads 1|2             threads for Picard's data passes
  -h, --help                show this help
`;


function progressLine(p: DecomposeProgress): string {
  if (p.stage !== 'ica') return `decompose: ${p.stage}\n`;
  const conv = Number.isFinite(p.convergence) ? p.convergence.toExponential(2) : '—';
  const eta = p.etaSeconds === null ? '' : `, about ${Math.ceil(p.etaSeconds)} s left`;
  return `decompose: ica iteration ${p.iteration}, convergence ${conv}${eta}, ${Math.floor(100 * p.fraction)} % done\n`;
}

export async function run(args: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseCommandArgs('decompose', args, {
    out: { type: 'string' },
    method: { type: 'string' },
    seed: { type: 'string' },
    highpass: { type: 'string' },
    lowpass: { type: 'string' },
    'max-iter': { type: 'string' },
    'n-components': { type: 'string' },
    'channels-tsv': { type: 'string' },
    threads: { type: 'string' },
  });
  if (positionals.length !== 1) throw new CliError(`winnow decompose: give exactly one recording (${USAGE})`);
  if (values.out === undefined) throw new CliError(`winnow decompose: --out FILE.json is required (${USAGE})`);
  const method = values.method ?? 'picard';
  if (method !== 'infomax' && method !== 'picard') throw new CliError(`winnow decompose: --method must be infomax or picard, got "${method}"`);
  const seed = numberOption('decompose', 'seed', values.seed, 1);
  if (!Number.isInteger(seed) || seed < 0 || seed > 0xffffffff) throw new CliError(`winnow decompose: --seed must be an integer in [0, 4294967295], got "${values.seed}"`);
  const highpass = numberOption('decompose', 'highpass', values.highpass, 1);
  const lowpass = values.lowpass === undefined ? null : numberOption('decompose', 'lowpass', values.lowpass, 0);
  const maxIter = values['max-iter'] === undefined ? undefined : numberOption('decompose', 'max-iter', values['max-iter'], 0);
  if (maxIter !== undefined && (!Number.isInteger(maxIter) || maxIter < 1)) throw new CliError(`winnow decompose: --max-iter must be a positive integer, got "${values['max-iter']}"`);
  const nComponents = values['n-components'] === undefined ? undefined : numberOption('decompose', 'n-components', values['n-components'], 0);
  if (nComponents !== undefined && (!Number.isInteger(nComponents) || nComponents < 1))
    throw new CliError(`winnow decompose: --n-components must be a positive integer, got "${values['n-components']}"`);
  const nThreads = numberOption('decompose', 'threads', values.threads, Math.min(2, availableParallelism()));
  if (nThreads !== 1 && nThreads !== 2) throw new CliError(`winnow decompose: --threads must be 1 or 2, got "${values.threads}"`);
  if (highpass < 0) throw new CliError(`winnow decompose: --highpass must be ≥ 0 (0 = off), got "${values.highpass}"`);

  const path = positionals[0];
  const { opened, close } = await openCliRecording(path, { channels: values['channels-tsv'] });
  try {
    // main rate: the most common rate among EEG channels (all channels if none is EEG); the loader's rule
    if (opened.info.channels.length === 0) throw new CliError(`${path}: the recording has no signal channels`);
    const rate = opened.mainRate;
    if (highpass > 0 && highpass >= rate / 2) throw new CliError(`winnow decompose: --highpass ${highpass} Hz is not below the Nyquist frequency ${rate / 2} Hz`);
    if (lowpass !== null && !(lowpass > 0 && lowpass < rate / 2)) throw new CliError(`winnow decompose: --lowpass must lie in (0, ${rate / 2}) Hz, got "${values.lowpass}"`);
    if (lowpass !== null && highpass > 0 && lowpass <= highpass) throw new CliError(`winnow decompose: --lowpass ${lowpass} Hz must be above --highpass ${highpass} Hz`);

    io.stderr(`decompose: reading ${opened.info.channels.filter((c) => c.sampleRate === rate).length} channels at ${rate} Hz\n`);
    // The samples go straight into one shared float32 block that the decomposition filters and whitens in place
    // (consumeInput) and hands to the helper thread: one copy of the data in all (issue 12).
    const recording = await readCliSignals(opened, io, { allocate: (length) => new Float32Array(new SharedArrayBuffer(4 * length)) });
    const shaPromise = sha256OfFile(path);

    let result;
    const kernels = installNodeKernels(); // WebAssembly SIMD kernels (src/core/kernels); helpers get the same
    if (kernels.reason) io.stderr(`decompose: plain-JS kernels (${kernels.reason})\n`);
    const helper = method === 'picard' && nThreads === 2 ? await createNodeIcaThreads() : null;
    try {
      result = decomposeRecording(
        decomposeInputOf(recording),
        {
          method,
          seed,
          highpassHz: highpass > 0 ? highpass : null,
          lowpassHz: lowpass,
          maxIter,
          nComponents,
          progressIntervalMs: 500,
          onProgress: (p) => io.stderr(progressLine(p)),
          threads: helper?.threads,
          consumeInput: true,
        },
      );
    } catch (e) {
      if (e instanceof RangeError) throw new CliError(`${path}: ${e.message}`);
      throw e;
    } finally {
      await helper?.close();
    }
    const decomposition = { ...result.decomposition, recordingSha256: await shaPromise };
    for (const w of result.warnings) io.stderr(`warning: ${w}\n`);
    const text = serializeDecomposition(decomposition, decompositionExtrasOf(result, seed));
    await writeFileAtomic(values.out, text);
    const d = decomposition;
    io.stdout(
      `${values.out}: ${d.nComponents} components from ${d.nChannels} channels (${result.rankReason}); ${d.method}, ` +
        `${d.iterations} iterations, ${d.converged ? 'converged' : 'NOT converged'}\n`,
    );
    return 0;
  } finally {
    await close();
  }
}
