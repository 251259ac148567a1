// The error convention across the worker boundary (issue 13; src/core/coded-error.ts): a worker exposes its
// API through guardWorkerApi, the bridge client rethrows what comes back as a CodedError with its code.
// The "worker" here is a fake: a MessageChannel whose far port runs a stand-in API through comlink's own
// expose (comlink 4, the library the real workers use), so the bytes cross the same structured clone.
import { afterEach, describe, expect, it } from 'vitest';
import { expose } from 'comlink';
import { CodedError, fromWireError, guardWorkerApi, isWireError, toWireError } from '../../src/core/coded-error.ts';
import { computeResidualInWorker } from '../../src/bridge/residual-client.ts';
import { writeCleanedInWorker, type CleanedExportRequest } from '../../src/bridge/recording-client.ts';
import type { Decomposition } from '../../src/core/decomposition.ts';
import type { LoadedRecording } from '../../src/core/recording.ts';

/** Installs a fake global Worker whose far end exposes `api` (guarded, as the real workers do). */
function fakeWorker(api: Record<string, (...args: never[]) => unknown>) {
  const started: string[] = [];
  class FakeWorker {
    private readonly port: MessagePort;
    constructor(url: URL, opts?: { name?: string }) {
      started.push(opts?.name ?? String(url));
      const { port1, port2 } = new MessageChannel();
      expose(guardWorkerApi(api), port1);
      this.port = port2;
    }
    postMessage(msg: unknown, transfer?: Transferable[]) {
      this.port.postMessage(msg, transfer ?? []);
    }
    addEventListener(type: string, fn: EventListener) {
      this.port.addEventListener(type, fn);
    }
    removeEventListener(type: string, fn: EventListener) {
      this.port.removeEventListener(type, fn);
    }
    start() {
      this.port.start();
    }
    terminate() {
      this.port.close();
    }
  }
  (globalThis as { Worker?: unknown }).Worker = FakeWorker;
  return started;
}

afterEach(() => {
  delete (globalThis as { Worker?: unknown }).Worker;
});

const never = new AbortController().signal;

describe('errors across the worker boundary keep their code', () => {
  it('a parse error thrown in the worker reaches the caller as a CodedError with its code, message and file', async () => {
    const started = fakeWorker({
      writeCleaned: () => {
        throw CodedError.fromParseError({ code: 'truncated-record', message: 'a.edf: record 3 ends early', file: 'a.edf' });
      },
    });
    const err = await writeCleanedInWorker({} as CleanedExportRequest, never, () => {}).catch((e: unknown) => e);
    expect(started).toEqual(['recording']);
    expect(err).toBeInstanceOf(CodedError);
    expect(err).toMatchObject({ code: 'truncated-record', message: 'a.edf: record 3 ends early', file: 'a.edf', name: 'CodedError' });
  });

  it('a RangeError from a core precondition keeps its name and message and is coded invalid-argument', async () => {
    fakeWorker({
      residual: () => {
        throw new RangeError('removed index 9 outside 1…4');
      },
    });
    const err = await computeResidualInWorker({} as LoadedRecording, {} as Decomposition, [9], never).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(CodedError);
    expect(err).toMatchObject({ code: 'invalid-argument', name: 'RangeError', message: 'removed index 9 outside 1…4' });
  });

  it('a rejected async method is coded too; a plain Error is internal', async () => {
    fakeWorker({ residual: async () => Promise.reject(new Error('out of memory')) });
    const err = await computeResidualInWorker({} as LoadedRecording, {} as Decomposition, [], never).catch((e: unknown) => e);
    expect(err).toMatchObject({ code: 'internal', name: 'Error', message: 'out of memory' });
  });

  it('without the guard comlink keeps only the message and name (why the guard exists)', async () => {
    const { port1, port2 } = new MessageChannel();
    expose({ f: () => { throw new CodedError('io', 'x.edf: read failed'); } }, port1);
    const { wrap } = await import('comlink');
    const remote = wrap<{ f: () => void }>(port2);
    const err = await Promise.resolve(remote.f()).catch((e: unknown) => e);
    expect((err as { code?: string }).code).toBeUndefined();
    expect(fromWireError(err)).toMatchObject({ code: 'internal', message: 'x.edf: read failed' });
    port2.close();
  });

  it('wire form: round trip, abort, non-Error values', () => {
    const w = toWireError(new CodedError('bad-tsv', 'e.tsv: line 4 has 3 cells', { file: 'e.tsv' }));
    expect(isWireError(structuredClone(w))).toBe(true);
    expect(fromWireError(structuredClone(w))).toMatchObject({ code: 'bad-tsv', file: 'e.tsv', message: 'e.tsv: line 4 has 3 cells' });
    const abort = Object.assign(new Error('cancelled'), { name: 'AbortError' });
    expect(toWireError(abort)).toMatchObject({ code: 'aborted', name: 'AbortError' });
    expect(toWireError('plain text')).toMatchObject({ code: 'internal', message: 'plain text' });
    expect(isWireError({ wireError: 1, code: 'no-such-code', name: 'E', message: 'm' })).toBe(false);
  });
});
