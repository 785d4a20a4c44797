// Errors on the audio thread: counted, and posted to the main thread at most a few per stats interval (the count in
// the stats carries the rest), so that a failure repeating every block cannot flood the port.
import type { Report } from '../protocol';

/** Error messages posted per stats interval at most. */
const MAX_ERROR_REPORTS = 4;

/** The host's error count and the rate limit on its error reports. */
export class ErrorReports {
  /** Errors caught by the host so far (the engine counts its own in its stats). */
  count = 0;
  private reported = 0;

  /** `post` sends a report; `engineErrors` reads the engine's own error count (added to the reported total). */
  constructor(
    private readonly post: (report: Report) => void,
    private readonly engineErrors: () => number,
  ) {}

  /** Counts one error at `where` and reports it. */
  fail(where: string, message: string): void {
    this.count += 1;
    this.report(where, message);
  }

  /** Posts an error already counted (here or in the engine's stats), unless this interval's reports are used up. */
  report(where: string, message: string): void {
    if (this.reported >= MAX_ERROR_REPORTS) return;
    this.reported += 1;
    this.post({ type: 'error', where, message, count: this.count + this.engineErrors() });
  }

  /** A new stats interval: reports are allowed again. */
  newInterval(): void {
    this.reported = 0;
  }
}

/** The message of a thrown value (an Error's message, else its string form). */
export function errorMessage(err: unknown): string {
  return err instanceof Error ? err.message : String(err);
}
