// Live readouts: per-voice table (ratio in cents, radial speed, distance, cutoff), ratio graph, spectrum, engine load,
// voice counts and the last audio-thread error.
import type { FolderApi, Pane } from 'tweakpane';
import { gainToDb, type EngineStats, type VoiceMonitor } from '../../src';
import type { RalentiAudioError, RenderLoad } from '../../runtime';
import { RatioGraph, type RatioTrace } from '../monitors/ratio-graph';
import { SpectrumView } from '../monitors/spectrum-view';

/** A named voice shown in the readouts. */
export interface NamedVoice {
  voiceId: number;
  name: string;
  colour: string;
}

/** What the readouts show in one frame. */
export interface ReadoutFrame {
  /** The runtime's latest stats. */
  stats: EngineStats;
  /** The runtime's latest voice monitors. */
  monitors: readonly VoiceMonitor[];
  /** The engine's voice pool size (1…1024). */
  capacity: number;
  /** The latest error the audio thread reported (null: none yet). */
  lastError: RalentiAudioError | null;
  /** Render load measured in the worklet (null: not measured). */
  load: RenderLoad | null;
}

/** Readouts section state, updated every frame by the panel. */
export class ReadoutsSection {
  readonly folder: FolderApi;
  readonly spectrum: SpectrumView;
  private readonly tableBody: HTMLTableSectionElement;
  private readonly graph: RatioGraph;
  private readonly voices: readonly NamedVoice[];
  private readonly load = {
    active: 0, virtual: 0, capacity: 0, steals: 0, clamps: 0, peakDb: -120, limiterDb: 0, loadPercent: 0, loadClock: '', errors: 0, tier: '', resampler: '',
  };
  private readonly cents: number[];
  private readonly errorLine: HTMLDivElement;
  private shownError: RalentiAudioError | null = null;
  private frame = 0;

  constructor(pane: Pane, doc: Document, context: BaseAudioContext, voices: readonly NamedVoice[]) {
    this.voices = voices;
    this.cents = voices.map(() => NaN);
    this.folder = pane.addFolder({ title: 'Live readouts' });
    const table = doc.createElement('table');
    table.className = 'rl-voices';
    table.innerHTML = '<thead><tr><th>voice</th><th>ratio ¢</th><th>Doppler ¢</th><th>radial m/s</th><th>dist m</th><th>cutoff</th></tr></thead>';
    this.tableBody = doc.createElement('tbody');
    table.appendChild(this.tableBody);
    this.folder.addBlade({ view: 'ralenti-element', element: table });
    this.graph = new RatioGraph(doc, { traces: voices.map<RatioTrace>((v) => ({ name: v.name, colour: v.colour })) });
    this.folder.addBlade({ view: 'ralenti-element', element: this.graph.element });
    this.spectrum = new SpectrumView(doc, context);
    this.folder.addBlade({ view: 'ralenti-element', element: this.spectrum.element });
    const l = this.load;
    const fmt0 = (v: number) => v.toFixed(0);
    this.folder.addBinding(l, 'loadPercent', {
      label: 'engine load',
      readonly: true,
      format: (v: number) => (l.loadClock ? `${v.toFixed(1)} % · ${l.loadClock === 'Date.now' ? '1 s avg (ms clock)' : '1 s avg'}` : 'not measured'),
    });
    this.folder.addBinding(l, 'loadPercent', { label: 'load history %', readonly: true, view: 'graph', min: 0, max: 100 });
    this.folder.addBinding(l, 'active', { label: 'voices playing', readonly: true, format: (v: number) => `${v.toFixed(0)} of ${l.capacity}` });
    this.folder.addBinding(l, 'virtual', { label: 'voices virtual', readonly: true, format: fmt0 });
    this.folder.addBinding(l, 'peakDb', { label: 'peak out (dBFS)', readonly: true, format: (v: number) => v.toFixed(1) });
    this.folder.addBinding(l, 'limiterDb', { label: 'limiter (dB)', readonly: true, format: (v: number) => v.toFixed(1) });
    this.folder.addBinding(l, 'steals', { label: 'steals · clamps', readonly: true, format: () => `${l.steals} · ${l.clamps}` });
    this.folder.addBinding(l, 'errors', { label: 'audio errors', readonly: true, format: fmt0 });
    this.errorLine = doc.createElement('div');
    this.errorLine.className = 'rl-audio-error';
    this.errorLine.textContent = 'last audio error: none';
    this.folder.addBlade({ view: 'ralenti-element', element: this.errorLine });
    this.folder.addBinding(l, 'resampler', { label: 'resampler', readonly: true });
  }

  /** Updates the readouts for this animation frame. */
  update(frame: ReadoutFrame): void {
    const { stats, monitors, capacity, lastError, load } = frame;
    const l = this.load;
    if (lastError !== this.shownError) this.showError(lastError);
    l.active = stats.activeVoices;
    l.virtual = stats.virtualVoices;
    l.steals = stats.steals;
    l.clamps = stats.clamps;
    l.peakDb = stats.peakOut > 0 ? gainToDb(stats.peakOut) : -120;
    l.limiterDb = stats.limiterDb;
    l.errors = stats.errors;
    l.tier = stats.tier;
    // Tier and inner loop ('wasm-simd', or 'typescript' where the audio thread has no WebAssembly SIMD).
    l.resampler = `${stats.tier} · ${stats.kernel ?? '…'}`;
    l.capacity = capacity;
    // Share of the audio thread's time spent in process(): above 100 % it cannot keep up and the output breaks up.
    l.loadPercent = load && Number.isFinite(load.fraction) ? 100 * load.fraction : 0;
    l.loadClock = load ? load.clock : '';
    this.voices.forEach((v, i) => {
      const m = monitors.find((x) => x.voice === v.voiceId);
      this.cents[i] = m ? m.ratioCents : NaN;
    });
    this.graph.push(this.cents);
    this.frame++;
    if (this.frame % 2 === 0) {
      this.graph.draw();
      this.spectrum.draw();
    }
    if (this.frame % 6 === 0) this.fillTable(monitors);
  }

  private showError(e: RalentiAudioError | null): void {
    this.shownError = e;
    this.errorLine.classList.toggle('rl-audio-error-on', e !== null);
    this.errorLine.textContent = e ? `last audio error (${e.where}): ${e.message}` : 'last audio error: none';
  }

  private fillTable(monitors: readonly VoiceMonitor[]): void {
    const rows: string[] = [];
    for (const v of this.voices) {
      const m = monitors.find((x) => x.voice === v.voiceId);
      if (!m) continue;
      const cutoff = m.cutoffHz >= 20000 ? 'open' : m.cutoffHz >= 1000 ? `${(m.cutoffHz / 1000).toFixed(1)}k` : m.cutoffHz.toFixed(0);
      rows.push(
        `<tr data-voice="${v.voiceId}"><td><i style="background:${v.colour}"></i>${v.name}</td><td>${signed(m.ratioCents)}</td><td>${signed(m.dopplerCents)}</td>` +
          `<td>${m.sourceId > 0 ? signed(m.radialSpeed, 1) : '–'}</td><td>${m.sourceId > 0 ? m.distance.toFixed(1) : '–'}</td><td>${cutoff}</td></tr>`,
      );
    }
    this.tableBody.innerHTML = rows.join('');
  }
}

function signed(v: number, digits = 0): string {
  if (!Number.isFinite(v)) return '–';
  const s = v.toFixed(digits);
  return v > 0 && s !== (0).toFixed(digits) ? `+${s}` : s;
}
