// The command-line tool's plumbing: output streams, typed errors with exit codes, a tiny argument parser.

/** Where a command writes; the real tool passes process streams, tests pass collectors. */
export interface CliIo {
  out(text: string): void;
  err(text: string): void;
  /** Whether stderr is a terminal (the progress bar redraws in place) or a pipe/file (it prints a few lines). */
  errIsTty: boolean;
}

/** Exit codes of `ralenti`. */
export const EXIT = Object.freeze({ ok: 0, failed: 1, usage: 2, input: 3, output: 4, internal: 5 });

/** A problem to report to the user with an exit code (usage errors also print the command's usage). */
export class CliError extends Error {
  readonly exitCode: number;
  constructor(message: string, exitCode: number) {
    super(message);
    this.name = 'CliError';
    this.exitCode = exitCode;
  }
}

/** Parsed arguments: positionals in order and options by long name. */
export interface ParsedArgs {
  positionals: string[];
  options: Map<string, string | true>;
}

/**
 * Parses `args` against the options a command accepts: name → true for a value option, false for a flag.
 * Short aliases map to long names (e.g. o → output). Unknown options and missing values are usage errors.
 */
export function parseArgs(args: readonly string[], accepted: Readonly<Record<string, boolean>>, aliases: Readonly<Record<string, string>> = {}): ParsedArgs {
  const positionals: string[] = [];
  const options = new Map<string, string | true>();
  for (let i = 0; i < args.length; i++) {
    const a = args[i];
    if (a === '--') {
      positionals.push(...args.slice(i + 1));
      break;
    }
    if (!a.startsWith('-') || a === '-') {
      positionals.push(a);
      continue;
    }
    let name = a.startsWith('--') ? a.slice(2) : a.slice(1);
    let value: string | undefined;
    const eq = name.indexOf('=');
    if (eq >= 0) {
      value = name.slice(eq + 1);
      name = name.slice(0, eq);
    }
    name = aliases[name] ?? name;
    if (!(name in accepted)) throw new CliError(`unknown option ${a}`, EXIT.usage);
    if (accepted[name]) {
      if (value === undefined) {
        value = args[++i];
        if (value === undefined || (value.startsWith('-') && value.length > 1 && !/^-\d/.test(value))) throw new CliError(`option --${name} needs a value`, EXIT.usage);
      }
      options.set(name, value);
    } else {
      if (value !== undefined) throw new CliError(`option --${name} takes no value`, EXIT.usage);
      options.set(name, true);
    }
  }
  return { positionals, options };
}

/** A numeric option value within [min, max], or the default when absent; a usage error otherwise. */
export function numberOption(p: ParsedArgs, name: string, min: number, max: number, def?: number): number | undefined {
  const v = p.options.get(name);
  if (v === undefined) return def;
  const n = typeof v === 'string' && v.trim() !== '' ? Number(v) : NaN;
  if (!Number.isFinite(n) || n < min || n > max) throw new CliError(`--${name} must be a number in ${min}…${max}, got ${JSON.stringify(v)}`, EXIT.usage);
  return n;
}

/** A choice option value, or the default when absent; a usage error otherwise. */
export function choiceOption<T extends string>(p: ParsedArgs, name: string, choices: readonly T[], def?: T): T | undefined {
  const v = p.options.get(name);
  if (v === undefined) return def;
  if (typeof v !== 'string' || !choices.includes(v as T)) throw new CliError(`--${name} must be one of ${choices.join(', ')}, got ${JSON.stringify(v)}`, EXIT.usage);
  return v as T;
}

/** Progress bar on stderr: redrawn in place on a terminal, a line per 25 % otherwise. */
export function progressBar(io: CliIo, label: string): { update(fraction: number): void; done(): void } {
  let lastStep = -1;
  const width = 30;
  return {
    update(fraction: number) {
      const f = Math.min(1, Math.max(0, fraction));
      if (io.errIsTty) {
        const step = Math.floor(f * 200);
        if (step === lastStep) return;
        lastStep = step;
        const fill = Math.round(f * width);
        io.err(`\r${label} [${'#'.repeat(fill)}${'.'.repeat(width - fill)}] ${(f * 100).toFixed(0).padStart(3)}%`);
      } else {
        const step = Math.floor(f * 4);
        if (step === lastStep) return;
        lastStep = step;
        io.err(`${label} ${(step * 25).toString().padStart(3)}%\n`);
      }
    },
    done() {
      if (io.errIsTty) io.err('\n');
    },
  };
}
