// Live readouts: master peak meter with hold, per-voice table named after the game's voices and sources (ratio in
// cents, radial speed, distance, cutoff), ratio graph, spectrum, engine load, voice counts and the last audio error.
import type { FolderApi, Pane } from 'tweakpane';
import { type EngineStats, type VoiceMonitor } from '../../src';
import type { RalentiAudioError, RenderLoad } from '../../runtime';
import { RatioGraph, type RatioTrace } from '../monitors/ratio-graph';
import { SpectrumView } from '../monitors/spectrum-view';
import { PeakMeter } from '../monitors/peak-meter';
import type { NamedVoice, VoiceNames } from '../voice-names';

export type { NamedVoice };

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
  /** Audio context time, s (the meter's hold clock). */
  now: number;
  /** Master peak of the path being heard when it is not the engine's (linear), else undefined. */
  altPeak?: number;
}

/** Readouts section state, updated every frame by the panel. */
export class ReadoutsSection {
  readonly folder: FolderApi;
  readonly spectrum: SpectrumView;
  private readonly tableBody: HTMLTableSectionElement;
  private readonly graph: RatioGraph;
  private readonly names: VoiceNames;
  /** The master meter (true peak over each report interval, with hold). */
  readonly master: PeakMeter;
  private readonly pathLine: HTMLDivElement;
  private lastStats: EngineStats | null = null;
  private readonly load = {
    active: 0, virtual: 0, capacity: 0, steals: 0, clamps: 0, limiterDb: 0, loadPercent: 0, loadClock: '', errors: 0, tier: '', resampler: '',
  };
  private readonly cents: number[];
  private readonly errorLine: HTMLDivElement;
  private shownError: RalentiAudioError | null = null;
  private frame = 0;

  constructor(pane: Pane, doc: Document, context: BaseAudioContext, names: VoiceNames) {
    this.names = names;
    this.cents = names.voices.map(() => NaN);
    this.folder = pane.addFolder({ title: 'Live readouts' });
    this.pathLine = doc.createElement('div');
    this.pathLine.className = 'rl-path-line';
    this.pathLine.title = 'Which playback path the readouts describe: always the one you hear.';
    this.folder.addBlade({ view: 'ralenti-element', element: this.pathLine });
    this.master = new PeakMeter(doc, 'master', 'True peak of the output over each report interval (measured on the audio thread), with a 2 s hold; dBFS.');
    this.folder.addBlade({ view: 'ralenti-element', element: this.master.element });
    this.setPath('engine');
    const table = doc.createElement('table');
    table.className = 'rl-voices';
    table.title = 'Playing voices, named after the game’s voices or sources. Drop an audio file on a row to replace that voice’s sound (where the page allows it).';
    table.innerHTML = '<thead><tr><th>voice</th><th>ratio ¢</th><th>Doppler ¢</th><th>radial m/s</th><th>dist m</th><th>cutoff</th></tr></thead>';
    this.tableBody = doc.createElement('tbody');
    table.appendChild(this.tableBody);
    this.folder.addBlade({ view: 'ralenti-element', element: table });
    this.graph = new RatioGraph(doc, { traces: names.voices.slice(0, 8).map<RatioTrace>((v) => ({ name: v.name, colour: v.colour })) });
    this.folder.addBlade({ view: 'ralenti-element', element: this.graph.element });
    this.spectrum = new SpectrumView(doc, context);
    this.folder.addBlade({ view: 'ralenti-element', element: this.spectrum.element });
    const l = this.load;
    const fmt0 = (v: number) => v.toFixed(0);
    const tip = (b: { element: HTMLElement }, t: string) => (b.element.title = t);
    const loadBinding = this.folder.addBinding(l, 'loadPercent', {
      label: 'engine load',
      readonly: true,
      format: (v: number) => (l.loadClock ? `${v.toFixed(1)} % · ${l.loadClock === 'Date.now' ? '1 s avg (ms clock)' : '1 s avg'}` : 'not measured'),
    });
    tip(loadBinding, 'Share of the audio thread’s time spent rendering, averaged over 1 s (%; above 100 % the sound breaks up).');
    tip(this.folder.addBinding(l, 'loadPercent', { label: 'load history %', readonly: true, view: 'graph', min: 0, max: 100 }), 'Engine load over the last seconds (0…100 %).');
    tip(this.folder.addBinding(l, 'active', { label: 'voices playing', readonly: true, format: (v: number) => `${v.toFixed(0)} of ${l.capacity}` }), 'Voices playing, of the pool size.');
    tip(this.folder.addBinding(l, 'virtual', { label: 'voices virtual', readonly: true, format: fmt0 }), 'Voices too quiet to render (below −90 dB); they keep their place and come back above −84 dB.');
    this.folder.addBinding(l, 'limiterDb', { label: 'limiter (dB)', readonly: true, format: (v: number) => v.toFixed(1) }).element.title = 'Gain reduction of the safety limiter at the last report (dB, ≤ 0).';
    tip(this.folder.addBinding(l, 'steals', { label: 'steals · clamps', readonly: true, format: () => `${l.steals} · ${l.clamps}` }), 'Voices stolen for newer ones · values the audio thread clamped or replaced (counts since start).');
    tip(this.folder.addBinding(l, 'errors', { label: 'audio errors', readonly: true, format: fmt0 }), 'Errors caught on the audio thread since start.');
    this.errorLine = doc.createElement('div');
    this.errorLine.className = 'rl-audio-error';
    this.errorLine.textContent = 'last audio error: none';
    this.folder.addBlade({ view: 'ralenti-element', element: this.errorLine });
    tip(this.folder.addBinding(l, 'resampler', { label: 'resampler', readonly: true }), 'Resampler tier and inner loop the audio thread runs.');
  }

  /** Says which path the readouts describe. */
  setPath(mode: 'engine' | 'builtin'): void {
    this.pathLine.dataset.path = mode;
    this.pathLine.textContent =
      mode === 'engine' ? 'You hear: the Ralenti engine.' : 'You hear: the browser’s playbackRate path (meter: that path; table: the targets it follows).';
  }

  /** Updates the readouts for this animation frame. */
  update(frame: ReadoutFrame): void {
    const { stats, monitors, capacity, lastError, load } = frame;
    const l = this.load;
    if (frame.altPeak !== undefined) this.master.push(frame.altPeak, frame.now);
    else if (stats !== this.lastStats) this.master.push(stats.peakOut, frame.now);
    this.lastStats = stats;
    if (lastError !== this.shownError) this.showError(lastError);
    l.active = stats.activeVoices;
    l.virtual = stats.virtualVoices;
    l.steals = stats.steals;
    l.clamps = stats.clamps;
    l.limiterDb = stats.limiterDb;
    l.errors = stats.errors;
    l.tier = stats.tier;
    // Tier and inner loop ('wasm-simd', or 'typescript' where the audio thread has no WebAssembly SIMD).
    l.resampler = `${stats.tier} · ${stats.kernel}`;
    l.capacity = capacity;
    // Share of the audio thread's time spent in process(): above 100 % it cannot keep up and the output breaks up.
    l.loadPercent = load && Number.isFinite(load.fraction) ? 100 * load.fraction : 0;
    l.loadClock = load ? load.clock : '';
    this.names.voices.slice(0, 8).forEach((v, i) => {
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
    for (const m of monitors.slice(0, 24)) {
      const v = { voiceId: m.voice, name: escapeHtml(this.names.nameOf(m)), colour: this.names.entry(m.voice)?.colour ?? '#8893a8' };
      const cutoff = m.cutoffHz >= 20000 ? 'open' : m.cutoffHz >= 1000 ? `${(m.cutoffHz / 1000).toFixed(1)}k` : m.cutoffHz.toFixed(0);
      rows.push(
        `<tr data-voice="${v.voiceId}"><td><i style="background:${v.colour}"></i>${v.name}</td><td>${signed(m.ratioCents)}</td><td>${signed(m.dopplerCents)}</td>` +
          `<td>${m.sourceId > 0 ? signed(m.radialSpeed, 1) : '–'}</td><td>${m.sourceId > 0 ? m.distance.toFixed(1) : '–'}</td><td>${cutoff}</td></tr>`,
      );
    }
    this.tableBody.innerHTML = rows.join('');
  }
}

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

function signed(v: number, digits = 0): string {
  if (!Number.isFinite(v)) return '–';
  const s = v.toFixed(digits);
  return v > 0 && s !== (0).toFixed(digits) ? `+${s}` : s;
}
