/**
 * Shared plumbing for `winnow` commands: a typed error with the exit code the contract fixes
 * (2 = bad input, 1 = internal fault) and a minimal output sink that tests can capture.
 */
import { createHash } from 'node:crypto';
import { createReadStream } from 'node:fs';
import { parseArgs, type ParseArgsConfig } from 'node:util';

export class CliError extends Error {
  constructor(
    message: string,
    readonly exitCode: 1 | 2 = 2,
  ) {
    super(message);
    this.name = 'CliError';
  }
}

export interface CliIo {
  stdout(text: string): void;
  stderr(text: string): void;
}

export const processIo: CliIo = {
  stdout: (t) => void process.stdout.write(t),
  stderr: (t) => void process.stderr.write(t),
};

/**
 * Holds the "warning: …" lines a command writes to stderr until `release()`, so that when the command then
 * fails, its `error:` line can be written first and scripts reading the first line of stderr see the fault
 * (issue 14 item 9). Other stderr text (progress) passes through at once.
 */
export function holdWarnings(io: CliIo): { release(): void } {
  // `io` keeps its identity (read.ts streams to the real stdout when io is processIo): only stderr is swapped.
  const held: string[] = [];
  const original = io.stderr;
  io.stderr = (t) => void (t.startsWith('warning:') ? held.push(t) : original.call(io, t));
  return {
    release: () => {
      io.stderr = original;
      for (const t of held.splice(0)) io.stderr(t);
    },
  };
}

/** Collects output in memory (for tests and for commands that call one another). */
export function memoryIo(): CliIo & { out: string; err: string } {
  const io = {
    out: '',
    err: '',
    stdout(t: string) {
      io.out += t;
    },
    stderr(t: string) {
      io.err += t;
    },
  };
  return io;
}

export type CommandRun = (args: string[], io: CliIo) => Promise<number>;

/** node:util parseArgs, with unknown options and missing values turned into exit-2 errors. */
export function parseCommandArgs<T extends ParseArgsConfig['options']>(command: string, args: string[], options: T) {
  try {
    return parseArgs({ args, options, allowPositionals: true, strict: true });
  } catch (e) {
    throw new CliError(`winnow ${command}: ${(e as Error).message}`);
  }
}

/** Parses a finite number option, or throws a CliError naming the option and the bad value. */
export function numberOption(command: string, name: string, value: string | undefined, fallback: number): number {
  if (value === undefined) return fallback;
  const v = Number(value);
  if (!Number.isFinite(v) || value.trim() === '') throw new CliError(`winnow ${command}: --${name} must be a number, got "${value}"`);
  return v;
}

/** SHA-256 (hex) of a file's bytes, streamed so a large recording is never held whole. */
export function sha256OfFile(path: string): Promise<string> {
  return new Promise((resolve, reject) => {
    const hash = createHash('sha256');
    createReadStream(path)
      .on('data', (chunk) => hash.update(chunk))
      .on('error', reject)
      .on('end', () => resolve(hash.digest('hex')));
  });
}
