// A scrolling graph of playback ratio (in cents) per source, drawn on a canvas.

/** One trace of the graph. */
export interface RatioTrace {
  name: string;
  colour: string;
}

/** Canvas graph of the last `samples` ratio readings per trace, ±`rangeCents` around unity. */
export class RatioGraph {
  readonly element: HTMLDivElement;
  private readonly canvas: HTMLCanvasElement;
  private readonly traces: RatioTrace[];
  private readonly history: Float32Array[];
  private readonly samples: number;
  private readonly rangeCents: number;
  private head = 0;

  /** Builds the graph for `traces`; `samples` columns of history, y range ±`rangeCents`. */
  constructor(doc: Document, options: { traces: RatioTrace[]; samples?: number; rangeCents?: number }) {
    this.traces = options.traces;
    this.samples = options.samples ?? 240;
    this.rangeCents = options.rangeCents ?? 2400;
    this.history = this.traces.map(() => new Float32Array(this.samples).fill(NaN));
    this.element = doc.createElement('div');
    this.element.className = 'rl-graph';
    this.canvas = doc.createElement('canvas');
    this.canvas.width = 300;
    this.canvas.height = 96;
    this.canvas.setAttribute('aria-label', 'playback ratio per source, cents, scrolling');
    const legend = doc.createElement('div');
    legend.className = 'rl-legend';
    for (const t of this.traces) {
      const s = doc.createElement('span');
      s.style.setProperty('--c', t.colour);
      s.textContent = t.name;
      legend.appendChild(s);
    }
    this.element.append(this.canvas, legend);
  }

  /** Appends one column: cents per trace (NaN = no voice). */
  push(cents: readonly number[]): void {
    for (let i = 0; i < this.history.length; i++) this.history[i][this.head] = cents[i] ?? NaN;
    this.head = (this.head + 1) % this.samples;
  }

  /** Redraws the canvas. */
  draw(): void {
    const ctx = this.canvas.getContext('2d');
    if (!ctx) return;
    const { width: w, height: h } = this.canvas;
    ctx.clearRect(0, 0, w, h);
    ctx.fillStyle = 'rgba(10,14,24,0.85)';
    ctx.fillRect(0, 0, w, h);
    const yOf = (c: number) => h / 2 - (Math.max(-this.rangeCents, Math.min(this.rangeCents, c)) / this.rangeCents) * (h / 2 - 4);
    ctx.strokeStyle = 'rgba(255,255,255,0.12)';
    ctx.lineWidth = 1;
    ctx.font = '9px sans-serif';
    ctx.fillStyle = 'rgba(255,255,255,0.5)';
    for (const c of [-1200, 0, 1200]) {
      const y = Math.round(yOf(c)) + 0.5;
      ctx.beginPath();
      ctx.moveTo(0, y);
      ctx.lineTo(w, y);
      ctx.stroke();
      ctx.fillText(c === 0 ? '0 ¢' : `${c > 0 ? '+' : ''}${c / 100} st`, 3, y - 2);
    }
    this.traces.forEach((t, i) => {
      const hist = this.history[i];
      ctx.strokeStyle = t.colour;
      ctx.lineWidth = 1.5;
      ctx.beginPath();
      let pen = false;
      for (let k = 0; k < this.samples; k++) {
        const v = hist[(this.head + k) % this.samples];
        const x = (k / (this.samples - 1)) * w;
        if (!Number.isFinite(v)) {
          pen = false;
          continue;
        }
        if (pen) ctx.lineTo(x, yOf(v));
        else ctx.moveTo(x, yOf(v));
        pen = true;
      }
      ctx.stroke();
    });
  }
}
