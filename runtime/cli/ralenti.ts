// `ralenti`: the command-line tool (render scene scripts, bake speed variants of WAV files; check is added by its command file).
import { CliError, EXIT, type CliIo } from './cli-io';
import type { CliCommand } from './cli-command';
import { renderCommand } from './render-command';
import { bakeCommand } from './bake-command';
import { checkCommand } from './check-command';
import { version } from '../../package.json';

/** The package's version, as `ralenti --version` prints it. */
export const RALENTI_VERSION: string = version;

/** The sub-commands, in the order `ralenti --help` lists them. A new command is one file plus one entry here. */
export const commands: readonly CliCommand[] = [renderCommand, bakeCommand, checkCommand];

const overview = () => `usage: ralenti <command> [arguments]
       ralenti --version | --help

commands:
${commands.map((c) => `  ${c.name.padEnd(8)} ${c.summary}`).join('\n')}

Run 'ralenti <command> --help' for a command's options.
Exit codes: 0 success, 1 check failed, 2 bad arguments, 3 unreadable or malformed input, 4 cannot write output,
5 internal error (a bug: please report it).
Start listening at a low volume: rendered files can be loud (the master limiter is on by default).
`;

/** Runs the tool with `argv` (the arguments after the program name); resolves to the exit code. */
export async function main(argv: readonly string[], io: CliIo): Promise<number> {
  const [name, ...rest] = argv;
  if (name === '--version' || name === '-V') {
    io.out(`${RALENTI_VERSION}\n`);
    return EXIT.ok;
  }
  if (name !== undefined && name.startsWith('-') && name !== '--help' && name !== '-h') {
    io.err(`ralenti: unknown option ${name}\n\n${overview()}`);
    return EXIT.usage;
  }
  if (name === undefined || name === '--help' || name === '-h' || name === 'help') {
    if (name === 'help' && rest[0]) return main([rest[0], '--help'], io);
    io.out(overview());
    return name === undefined ? EXIT.usage : EXIT.ok;
  }
  const command = commands.find((c) => c.name === name);
  if (!command) {
    io.err(`ralenti: unknown command "${name}"\n\n${overview()}`);
    return EXIT.usage;
  }
  try {
    return await command.run(rest, io);
  } catch (e) {
    if (e instanceof CliError) {
      io.err(`ralenti ${name}: ${e.message}\n`);
      if (e.exitCode === EXIT.usage) io.err(`\n${command.usage}`);
      return e.exitCode;
    }
    io.err(`ralenti ${name}: unexpected error: ${(e as Error).stack ?? String(e)}\n`);
    return EXIT.failed;
  }
}

/** Process entry: real streams and exit code (only when run as the bundled program). */
export function runFromProcess(): void {
  const io: CliIo = {
    out: (t) => process.stdout.write(t),
    err: (t) => process.stderr.write(t),
    errIsTty: process.stderr.isTTY === true,
  };
  main(process.argv.slice(2), io).then(
    (code) => {
      process.exitCode = code;
    },
    (e) => {
      process.stderr.write(`ralenti: ${(e as Error).message}\n`);
      process.exitCode = EXIT.failed;
    },
  );
}
