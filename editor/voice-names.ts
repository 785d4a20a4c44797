// Names the readouts use for the game's voices: a name per voice, else the name of its source, else group and id.
import type { VoiceMonitor } from '../src';

/** A named voice shown in the readouts and drawn in the ratio graph (voiceId may change when its sound is replaced). */
export interface NamedVoice {
  voiceId: number;
  name: string;
  colour: string;
}

/** Trace colours for voices named without one. */
const PALETTE = ['#7fd6ff', '#ff9a55', '#6dffc0', '#ffe34a', '#c58cff', '#ff7fa8', '#9bb4ff', '#d0ff7f'];

/** The names of a page's voices and sources. */
export class VoiceNames {
  /** Named voices, in the order the ratio graph draws them (at most 8 traces). */
  readonly voices: NamedVoice[] = [];
  private readonly sources = new Map<number, string>();

  /** Names a voice (by RalentiVoice.id); returns its entry (a new colour from the palette unless given). */
  nameVoice(voiceId: number, name: string, colour?: string): NamedVoice {
    const had = this.voices.find((v) => v.voiceId === voiceId);
    if (had) {
      had.name = name;
      if (colour) had.colour = colour;
      return had;
    }
    const v = { voiceId, name, colour: colour ?? PALETTE[this.voices.length % PALETTE.length] };
    this.voices.push(v);
    return v;
  }

  /** Names a source (by RalentiSource.id): its voices show this name unless named themselves. */
  nameSource(sourceId: number, name: string): void {
    this.sources.set(sourceId, name);
  }

  /** The named entry of a voice, or undefined. */
  entry(voiceId: number): NamedVoice | undefined {
    return this.voices.find((v) => v.voiceId === voiceId);
  }

  /** Display name of a monitored voice: its own name, its source's name, or "group #id". */
  nameOf(m: Pick<VoiceMonitor, 'voice' | 'sourceId' | 'group'>): string {
    return this.entry(m.voice)?.name ?? (m.sourceId > 0 ? this.sources.get(m.sourceId) : undefined) ?? `${m.group} #${m.voice}`;
  }
}
