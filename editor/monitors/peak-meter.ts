// A peak meter with hold: a bar for the latest interval's true peak (measured on the audio thread over the whole
// report interval) and a mark that holds the highest peak for a few seconds, in dBFS.
import { gainToDb } from '../../src';

/** Frozen defaults of PeakMeter. */
export const peakMeterDefaults = Object.freeze({ floorDb: -60, holdSeconds: 2, topDb: 6 });

/** One horizontal meter; push() each report, with the time in seconds from any steady clock (the audio context's). */
export class PeakMeter {
  /** The meter's element. */
  readonly element: HTMLDivElement;
  /** Latest peak in dBFS (−Infinity: silence or no data). */
  peakDb = -Infinity;
  /** Held peak in dBFS. */
  holdDb = -Infinity;
  private holdUntil = -Infinity;
  private readonly bar: HTMLDivElement;
  private readonly mark: HTMLDivElement;
  private readonly text: HTMLSpanElement;
  private readonly floor = peakMeterDefaults.floorDb;

  constructor(doc: Document, label: string, title: string) {
    this.element = doc.createElement('div');
    this.element.className = 'rl-meter';
    this.element.title = title;
    this.element.dataset.meter = label;
    const name = doc.createElement('span');
    name.className = 'rl-meter-name';
    name.textContent = label;
    const track = doc.createElement('div');
    track.className = 'rl-meter-track';
    this.bar = doc.createElement('div');
    this.bar.className = 'rl-meter-bar';
    this.mark = doc.createElement('div');
    this.mark.className = 'rl-meter-hold';
    track.append(this.bar, this.mark);
    this.text = doc.createElement('span');
    this.text.className = 'rl-meter-text';
    this.element.append(name, track, this.text);
    this.draw();
  }

  /** Records one interval's peak (linear, ≥ 0; null = not measured) at time `now` (s). */
  push(peak: number | null, now: number): void {
    if (peak === null) {
      this.peakDb = -Infinity;
      this.text.textContent = 'not measured';
      this.element.classList.add('rl-meter-off');
      return;
    }
    this.element.classList.remove('rl-meter-off');
    this.peakDb = peak > 0 ? gainToDb(peak) : -Infinity;
    if (this.peakDb >= this.holdDb || now >= this.holdUntil) {
      this.holdDb = this.peakDb;
      this.holdUntil = now + peakMeterDefaults.holdSeconds;
    }
    this.draw();
  }

  private fraction(db: number): number {
    if (!(db > this.floor)) return 0;
    return Math.min(1, (db - this.floor) / (peakMeterDefaults.topDb - this.floor));
  }

  private draw(): void {
    this.bar.style.width = `${(100 * this.fraction(this.peakDb)).toFixed(1)}%`;
    this.bar.classList.toggle('rl-meter-over', this.peakDb > -0.05);
    this.mark.style.left = `${(100 * this.fraction(this.holdDb)).toFixed(1)}%`;
    const f = (db: number) => (db > -120 ? db.toFixed(1) : '−∞');
    this.text.textContent = `${f(this.peakDb)} · hold ${f(this.holdDb)} dBFS`;
  }
}
