// Runs the `ralenti` command in-process with captured output, as the CLI suites need it.
import { main } from '../../../runtime/cli/ralenti';

/** Result of one in-process run: the exit code and everything written to stdout and stderr. */
export interface CliRun {
  code: number;
  out: string;
  err: string;
}

/** Runs `ralenti <argv…>` through its `main`, capturing both streams (stderr is not a terminal, so no progress bar). */
export async function runCli(argv: readonly string[]): Promise<CliRun> {
  let out = '';
  let err = '';
  const code = await main([...argv], { out: (t) => (out += t), err: (t) => (err += t), errIsTty: false });
  return { code, out, err };
}
