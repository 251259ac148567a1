/** `winnow inspect` — not built yet (placeholder until its issue lands). */
import { CliError, type CliIo } from './cli-support.ts';

export async function run(_args: string[], _io: CliIo): Promise<number> {
  throw new CliError('winnow inspect is not available yet', 1);
}
