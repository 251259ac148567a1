/**
 * `winnow <command> --help` (or -h): the help text of one command. Each command module exports `usage`, a
 * text whose first line is `usage: winnow <name> …`, followed by what the command does and its options.
 * The dispatcher (winnow.ts) answers --help before the command parses its arguments, because the
 * commands' strict option parsing (parseCommandArgs) refuses unknown flags such as --help.
 */

/** True when the arguments ask for help: `--help` or `-h` anywhere before a `--` terminator. */
export function wantsHelp(args: readonly string[]): boolean {
  for (const a of args) {
    if (a === '--') return false;
    if (a === '--help' || a === '-h') return true;
  }
  return false;
}

/** Help text of `inspect`, kept here because inspect.ts exports none. */
export const INSPECT_USAGE = `usage: winnow inspect <recording>

Prints the header, channels and events (annotations) of an EDF, EDF+, BDF or BDF+ file as JSON.

options:
  -h, --help    show this help
`;

/** The help text to print: the module's `usage` when it exports one, else a fallback naming the command. */
export function commandHelp(name: string, summary: string, mod: { usage?: unknown }): string {
  const text = typeof mod.usage === 'string' ? mod.usage : name === 'inspect' ? INSPECT_USAGE : `usage: winnow ${name} [options]\n\n${summary}\n`;
  return text.endsWith('\n') ? text : `${text}\n`;
}
