// The shape of one `ralenti` sub-command; ralenti.ts lists them.
import type { CliIo } from './cli-io';

/** One sub-command: its name, a one-line summary for `ralenti --help`, its own usage text, and what it does. */
export interface CliCommand {
  name: string;
  summary: string;
  usage: string;
  /** Runs with the arguments after the command name; resolves to the exit code or throws CliError. */
  run(args: readonly string[], io: CliIo): Promise<number>;
}
