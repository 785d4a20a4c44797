// The worklet host's handle bookkeeping: main-thread sound and voice handles mapped to the engine's, both ways for
// voices. Entries leave where the handles end (a sound removed or replaced, a voice's 'ended' event), not on a timer.

/** Main-thread ↔ engine handles of one host; allocates only when an entry is added. */
export class HandleBook {
  private readonly sounds = new Map<number, number>();
  private readonly voices = new Map<number, number>();
  private readonly owners = new Map<number, number>();

  /** Engine sound id of main-thread sound `main`, or undefined. */
  soundOf(main: number): number | undefined {
    return this.sounds.get(main);
  }

  /** Maps main-thread sound `main` to engine sound `id`. */
  bindSound(main: number, id: number): void {
    this.sounds.set(main, id);
  }

  /** Forgets main-thread sound `main`; returns the engine sound id it had, or undefined. */
  unbindSound(main: number): number | undefined {
    const id = this.sounds.get(main);
    this.sounds.delete(main);
    return id;
  }

  /** Engine voice handle of main-thread voice `main`, or undefined (never mapped, or ended). */
  voiceOf(main: number): number | undefined {
    return this.voices.get(main);
  }

  /** Main-thread voice of engine voice handle `engineVoice`, or undefined. */
  ownerOf(engineVoice: number): number | undefined {
    return this.owners.get(engineVoice);
  }

  /** Maps main-thread voice `main` to engine voice handle `engineVoice` (replacing an older mapping of either). */
  bindVoice(main: number, engineVoice: number): void {
    const old = this.voices.get(main);
    if (old !== undefined) this.owners.delete(old);
    const oldOwner = this.owners.get(engineVoice);
    if (oldOwner !== undefined) this.voices.delete(oldOwner);
    this.voices.set(main, engineVoice);
    this.owners.set(engineVoice, main);
  }

  /** Engine voice `engineVoice` ended: both directions are forgotten; returns its main-thread voice, or undefined. */
  endVoice(engineVoice: number): number | undefined {
    const main = this.owners.get(engineVoice);
    if (main === undefined) return undefined;
    this.owners.delete(engineVoice);
    this.voices.delete(main);
    return main;
  }

  /**
   * Ends every mapped voice for which `ended(engineVoice)` is true, calling `each` with its main-thread voice (for when
   * 'ended' events were lost, e.g. the engine's event ring overflowed); returns how many.
   */
  sweep(ended: (engineVoice: number) => boolean, each: (main: number) => void): number {
    let n = 0;
    for (const engineVoice of [...this.owners.keys()]) {
      if (!ended(engineVoice)) continue;
      each(this.endVoice(engineVoice)!);
      n++;
    }
    return n;
  }

  /** Mapped voices now. */
  get voiceCount(): number {
    return this.voices.size;
  }

  /** Mapped sounds now. */
  get soundCount(): number {
    return this.sounds.size;
  }

  /** The voice map, main-thread → engine handle (read-only: change it through bindVoice / endVoice). */
  get mappedVoices(): ReadonlyMap<number, number> {
    return this.voices;
  }

  /** Forgets everything (the host is disposed). */
  clear(): void {
    this.sounds.clear();
    this.voices.clear();
    this.owners.clear();
  }
}
