/**
 * `winnow <command>`: the headless entry point over src/core. Each command lives in its own file and is
 * loaded on demand so that one command's dependencies never slow another's start.
 */
import { CliError, holdWarnings, processIo, type CliIo, type CommandRun } from './cli-support.ts';
import { commandHelp, wantsHelp } from './help.ts';

export const commands: Record<string, { summary: string; load: () => Promise<{ run: CommandRun; usage?: string }> }> = {
  inspect: { summary: 'print a recording header, channels and events as JSON', load: () => import('./inspect.ts') },
  read: { summary: 'print samples as TSV', load: () => import('./read.ts') },
  forward: { summary: 'potentials of a current dipole at electrodes (TSV)', load: () => import('./forward.ts') },
  dipole: { summary: 'fit one equivalent dipole to a scalp map (JSON)', load: () => import('./dipole.ts') },
  simulate: { summary: 'simulate a mobile EEG session with known sources', load: () => import('./simulate.ts') },
  decompose: { summary: 'run ICA (extended Infomax or Picard) on a recording', load: () => import('./decompose.ts') },
  evidence: { summary: 'compute per-component evidence and suggested verdicts', load: () => import('./evidence.ts') },
  clean: { summary: 'write the cleaned recording from a decisions file', load: () => import('./clean.ts') },
  batch: { summary: 'decompose and compute evidence over a BIDS dataset, or gather a study table', load: () => import('./batch.ts') },
  'simulate-study': { summary: 'simulate a BIDS dataset of several participants', load: () => import('./simulate-study.ts') },
  agree: { summary: "agreement (Cohen's kappa) between two reviewers' decisions files", load: () => import('./agree.ts') },
  validate: { summary: 'score the suggestions on simulated recordings with known sources', load: () => import('./validate.ts') },
};

function usage(): string {
  const lines = Object.entries(commands).map(([name, c]) => `  ${name.padEnd(14)} ${c.summary}`);
  return `usage: winnow <command> [options]\n\ncommands:\n${lines.join('\n')}\n\nwinnow <command> --help shows a command's options.\nWinnow is a research tool, not for clinical diagnosis.\n`;
}

export async function main(argv: string[], io: CliIo = processIo): Promise<number> {
  const [name, ...rest] = argv;
  if (name === undefined || name === '--help' || name === '-h' || name === 'help') {
    io.stdout(usage());
    return name === undefined ? 2 : 0;
  }
  const command = commands[name];
  if (!command) {
    io.stderr(`error: unknown command "${name}"\n${usage()}`);
    return 2;
  }
  const warnings = holdWarnings(io); // an error line goes before the warnings held so far
  try {
    const mod = await command.load();
    if (wantsHelp(rest)) {
      io.stdout(commandHelp(name, command.summary, mod));
      return 0;
    }
    return await mod.run(rest, io);
  } catch (e) {
    if (e instanceof CliError) {
      io.stderr(`error: ${e.message}\n`);
      return e.exitCode;
    }
    const err = e as Error;
    io.stderr(`error: internal fault in winnow ${name}: ${err?.message ?? String(e)}\n`);
    if (process.env.WINNOW_DEBUG) io.stderr(`${err?.stack ?? ''}\n`);
    return 1;
  } finally {
    warnings.release(); // after the error line, if any
  }
}
