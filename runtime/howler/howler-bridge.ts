// Shares howler's AudioContext with the runtime: adopts Howler.ctx after howler's own setup, routes our output
// into Howler.masterGain (so howler's unlock, mute and volume govern it), keeps autoSuspend off while we play,
// and rebuilds on a replaced context (after Howler.unload()). Public howler API only.
import { createRalenti, type CreateRalentiOptions } from '../create-ralenti';
import { decodeAudioFile } from '../decode-audio-file';
import type { Ralenti, Sound } from '../ralenti';
import { RalentiOptionError } from '../runtime-error';
import type { HowlerGlobalLike } from './howler-types';

/** A fetch subset: enough to read a file's bytes. */
export type FetchLike = (url: string) => Promise<{ ok: boolean; status: number; arrayBuffer(): Promise<ArrayBuffer> }>;

/** Options of HowlerBridge. */
export interface HowlerBridgeOptions {
  /** The global Howler object. */
  howler: HowlerGlobalLike;
  /** Options for the runtime built on howler's context. */
  runtime?: CreateRalentiOptions;
  /** Builds the runtime (default createRalenti). */
  create?: (context: BaseAudioContext, options: CreateRalentiOptions) => Promise<Ralenti>;
  /** Reads files (default globalThis.fetch). */
  fetch?: FetchLike;
}

/** Options of loadSrc: the same values the Howl was created with. */
export interface HowlSourceOptions {
  /** The Howl's html5 flag: html5 Howls play through media elements and are refused here. */
  html5?: boolean;
  /** The Howl's format list (extensions), when the URLs carry none. */
  format?: string[];
}

/** One runtime on howler's context; call check() once per frame to follow a replaced context. */
export class HowlerBridge {
  /** The runtime on the current context (null before start() or after stop()). */
  ralenti: Ralenti | null = null;
  /** Times the runtime was rebuilt on a new howler context. */
  rebuilds = 0;
  private readonly howler: HowlerGlobalLike;
  private readonly runtimeOptions: CreateRalentiOptions;
  private readonly create: (context: BaseAudioContext, options: CreateRalentiOptions) => Promise<Ralenti>;
  private readonly fetcher: FetchLike | undefined;
  private context: AudioContext | null = null;
  private savedAutoSuspend: boolean | null = null;
  private building: Promise<Ralenti> | null = null;
  private readonly decoded: AudioBuffer[] = [];
  private readonly rebuildListeners = new Set<(r: Ralenti) => void>();

  /** Creates the bridge; nothing happens until start(). */
  constructor(options: HowlerBridgeOptions) {
    this.howler = options.howler;
    this.runtimeOptions = options.runtime ?? {};
    this.create = options.create ?? createRalenti;
    this.fetcher = options.fetch ?? (typeof fetch === 'function' ? (url: string) => fetch(url) : undefined);
  }

  /** Adopts howler's context (running howler's setup first), builds the runtime and routes it into Howler.masterGain. */
  start(): Promise<Ralenti> {
    if (this.building) return this.building;
    const h = this.howler;
    if (h.noAudio || !h.usingWebAudio) {
      return Promise.reject(new RalentiOptionError('howler.usingWebAudio', 'howler is not using Web Audio (noAudio or HTML5 only); the engine path needs Web Audio'));
    }
    // Any volume() call, the getter included, runs howler's private context setup if needed.
    h.volume();
    const ctx = h.ctx;
    if (!ctx || !h.masterGain) return Promise.reject(new RalentiOptionError('howler.ctx', 'howler did not set up its AudioContext and master gain'));
    if (this.savedAutoSuspend === null) this.savedAutoSuspend = h.autoSuspend;
    // howler's auto-suspend only knows howler's voices; it would silence ours.
    h.autoSuspend = false;
    this.context = ctx;
    const build = this.create(ctx, this.runtimeOptions).then(async (r) => {
      if (h.ctx !== ctx) {
        r.dispose();
        throw new RalentiOptionError('howler.ctx', 'howler replaced its context while the runtime was starting');
      }
      r.connect(h.masterGain as GainNode);
      for (const b of this.decoded) r.load(b);
      this.ralenti = r;
      return r;
    });
    this.building = build;
    build.catch(() => {
      if (this.building === build) this.building = null;
    });
    return build;
  }

  /**
   * Call once per frame: when Howler.ctx is no longer the adopted context (Howler.unload() replaced it), disposes the
   * runtime and builds a new one on the new context, reloading every sound in the same order (same Sound handles);
   * voices and sources are gone and onRebuild listeners should restart them. Returns true when a rebuild began.
   */
  check(): boolean {
    if (!this.building || this.howler.ctx === this.context) return false;
    this.ralenti?.dispose();
    this.ralenti = null;
    this.building = null;
    this.rebuilds += 1;
    const next = this.start();
    next.then((r) => this.rebuildListeners.forEach((cb) => cb(r)), () => undefined);
    return true;
  }

  /** Calls `cb` with the new runtime after each rebuild; returns an unsubscribe function. */
  onRebuild(cb: (r: Ralenti) => void): () => void {
    this.rebuildListeners.add(cb);
    return () => this.rebuildListeners.delete(cb);
  }

  /**
   * Loads a Howl's src through the engine: picks the first playable URL, fetches it and decodes it at the file's own
   * sample rate (decodeAudioFile; formats whose rate the header does not give decode on Howler.ctx). Refuses html5 Howls.
   */
  async loadSrc(src: string | string[], options: HowlSourceOptions = {}): Promise<Sound> {
    if (options.html5) {
      throw new RalentiOptionError('howl.html5', 'html5 Howls play through a media element and cannot go through the engine; use the rate driver (light mode) or html5: false');
    }
    const r = await this.start();
    const url = this.pickSource(Array.isArray(src) ? src : [src], options.format);
    if (!this.fetcher) throw new RalentiOptionError('fetch', 'no fetch available; pass options.fetch');
    const res = await this.fetcher(url);
    if (!res.ok) throw new Error(`could not fetch ${url}: HTTP ${res.status}`);
    const bytes = await res.arrayBuffer();
    const buffer = await decodeAudioFile(bytes, { context: r.context });
    this.decoded.push(buffer);
    return r.load(buffer);
  }

  /** Disposes the runtime and gives autoSuspend back its earlier value. */
  stop(): void {
    this.ralenti?.dispose();
    this.ralenti = null;
    this.building = null;
    this.context = null;
    if (this.savedAutoSuspend !== null) this.howler.autoSuspend = this.savedAutoSuspend;
    this.savedAutoSuspend = null;
  }

  private pickSource(urls: string[], format: string[] | undefined): string {
    if (urls.length === 0) throw new RalentiOptionError('howl.src', 'expected at least one URL');
    for (let i = 0; i < urls.length; i++) {
      const ext = format?.[i] ?? extensionOf(urls[i]);
      if (ext && this.howler.codecs(ext)) return urls[i];
    }
    throw new RalentiOptionError('howl.src', `no playable format among ${urls.join(', ')}`);
  }
}

/** Extension of a URL (query and hash ignored), or the subtype of a data: URI; lower case. */
export function extensionOf(url: string): string | null {
  const data = /^data:audio\/([^;,]+)/i.exec(url);
  if (data) return data[1].toLowerCase();
  const m = /\.([A-Za-z0-9]+)$/.exec(url.split(/[?#]/)[0]);
  return m ? m[1].toLowerCase() : null;
}
