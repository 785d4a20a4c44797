// Spectrum of the master output: an AnalyserNode's dB magnitudes on a log-frequency canvas.

/** Draws the master spectrum from an AnalyserNode tapped off the master bus. */
export class SpectrumView {
  readonly element: HTMLDivElement;
  /** The analyser (connect the master bus into it; it needs no output). */
  readonly analyser: AnalyserNode;
  private readonly canvas: HTMLCanvasElement;
  private readonly bins: Float32Array<ArrayBuffer>;

  /** Creates the analyser on `context` (FFT size 2048, smoothing 0.7). */
  constructor(doc: Document, context: BaseAudioContext) {
    this.analyser = context.createAnalyser();
    this.analyser.fftSize = 2048;
    this.analyser.smoothingTimeConstant = 0.7;
    this.analyser.minDecibels = -110;
    this.analyser.maxDecibels = -10;
    this.bins = new Float32Array(this.analyser.frequencyBinCount);
    this.element = doc.createElement('div');
    this.element.className = 'rl-spectrum';
    this.canvas = doc.createElement('canvas');
    this.canvas.width = 300;
    this.canvas.height = 84;
    this.canvas.setAttribute('aria-label', 'master output spectrum, 20 Hz to 20 kHz');
    this.element.appendChild(this.canvas);
  }

  /** Reads the analyser and redraws. */
  draw(): void {
    const ctx = this.canvas.getContext('2d');
    if (!ctx) return;
    this.analyser.getFloatFrequencyData(this.bins);
    const { width: w, height: h } = this.canvas;
    const nyquist = this.analyser.context.sampleRate / 2;
    const lo = Math.log(20);
    const hi = Math.log(Math.min(20000, nyquist));
    const xOf = (hz: number) => ((Math.log(hz) - lo) / (hi - lo)) * w;
    const minDb = this.analyser.minDecibels;
    const maxDb = this.analyser.maxDecibels;
    ctx.fillStyle = 'rgba(10,14,24,0.85)';
    ctx.fillRect(0, 0, w, h);
    ctx.strokeStyle = 'rgba(255,255,255,0.12)';
    ctx.fillStyle = 'rgba(255,255,255,0.5)';
    ctx.font = '9px sans-serif';
    for (const hz of [100, 1000, 10000]) {
      const x = Math.round(xOf(hz)) + 0.5;
      ctx.beginPath();
      ctx.moveTo(x, 0);
      ctx.lineTo(x, h);
      ctx.stroke();
      ctx.fillText(hz >= 1000 ? `${hz / 1000}k` : `${hz}`, x + 2, h - 3);
    }
    ctx.beginPath();
    ctx.moveTo(0, h);
    const n = this.bins.length;
    for (let i = 1; i < n; i++) {
      const hz = (i * nyquist) / n;
      if (hz < 20) continue;
      if (hz > 20000) break;
      const db = Number.isFinite(this.bins[i]) ? this.bins[i] : minDb;
      const y = h - ((Math.max(minDb, Math.min(maxDb, db)) - minDb) / (maxDb - minDb)) * h;
      ctx.lineTo(xOf(hz), y);
    }
    ctx.lineTo(w, h);
    ctx.closePath();
    ctx.fillStyle = 'rgba(95,211,199,0.35)';
    ctx.fill();
    ctx.strokeStyle = '#5fd3c7';
    ctx.stroke();
  }
}
