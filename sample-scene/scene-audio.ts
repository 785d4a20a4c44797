// Audio of the sample scene: the runtime on a fresh AudioContext, the master chain, the generated sounds and voices,
// and replacing a voice's sound with a dropped file (kept for the rest of the session).
import { createRalenti, type Ralenti, type RalentiSource, type RalentiVoice, type Sound, type SoundData } from '../runtime';
import { listeningGain, loadAutosaved, VoiceNames, type ComparisonSource, type DecodedAudioFile, type NamedVoice, type TuningProblem } from '../editor';
import { SCENE_VOICES } from './script-sounds';
import { radioMessageSound } from './radio-message';
import { clickSound, droneSound, generatorSound, kartSound, musicLoopSound, orbSound, type GeneratedSound } from './procedural-sounds';

/** One looping voice of the scene and what it needs to be restarted with another sound. */
interface SceneVoice {
  name: string;
  voice: RalentiVoice;
  sound: Sound;
  group: string;
  gain: number;
  source: RalentiSource | null;
  named: NamedVoice;
  comparison: ComparisonSource;
  /** File name of a dropped sound, or null for the scene's own. */
  dropped: string | null;
}

/** Everything the scene plays, with handles for the loop and the panel. */
export interface SceneAudio {
  context: AudioContext;
  ralenti: Ralenti;
  master: GainNode;
  engineBus: GainNode;
  sources: { drone: RalentiSource; kart: RalentiSource; orb: RalentiSource; generator: RalentiSource };
  /** Names and colours of the voices for the readouts (voice ids follow replaced sounds). */
  names: VoiceNames;
  /** Voice names by voice id. */
  voiceNames: Map<number, string>;
  comparison: ComparisonSource[];
  click: Sound;
  restored: boolean;
  restoreProblems: TuningProblem[];
  /** Plays one interface click (exempt group). */
  playClick(): void;
  /** Replaces the sound of the voice `voiceId` with a decoded file; resolves with the name the readouts show. */
  replaceSound(voiceId: number, sound: DecodedAudioFile): string;
  /** Dropped file per scene voice name (null: the scene's own sound). */
  dropped(name: string): string | null;
}

function toBuffer(context: BaseAudioContext, s: SoundData & { channels: Float32Array[] }): AudioBuffer {
  const b = context.createBuffer(s.channels.length, s.channels[0].length, s.sampleRate);
  s.channels.forEach((c, i) => b.copyToChannel(c as Float32Array<ArrayBuffer>, i));
  return b;
}

/** Starts audio (call from a click handler); `volumeDb` is the master listening level. */
export async function startSceneAudio(volumeDb: number, storage: Storage | undefined, panOf: (source: RalentiSource | null) => number): Promise<SceneAudio> {
  const context = new AudioContext({ latencyHint: 'interactive' });
  await context.resume();
  const saved = loadAutosaved(storage);
  const ralenti = await createRalenti(context, { tuning: saved.tuning ?? undefined, workletUrl: new URL('./ralenti-processor.js', location.href).href });
  const engineBus = context.createGain();
  const master = context.createGain();
  master.gain.value = listeningGain(volumeDb);
  ralenti.connect(engineBus);
  engineBus.connect(master);
  master.connect(context.destination);

  const rate = context.sampleRate;
  const sources = { drone: ralenti.createSource(), kart: ralenti.createSource(), orb: ralenti.createSource(), generator: ralenti.createSource() };
  const names = new VoiceNames();
  const voiceNames = new Map<number, string>();
  const comparison: ComparisonSource[] = [];
  const slots = new Map<string, SceneVoice>();
  const groupOf = (g: string) => (Object.prototype.hasOwnProperty.call(ralenti.tuning.groups, g) ? g : 'effects');
  const start = (name: string, colour: string, made: GeneratedSound, group: string, gain: number, source: RalentiSource | null): void => {
    const sound = ralenti.load(made);
    const voice = ralenti.play(sound, { group: groupOf(group), loop: true, gain, ...(source ? { source } : {}) });
    const named = names.nameVoice(voice.id, name, colour);
    voiceNames.set(voice.id, name);
    const c: ComparisonSource = { name, buffer: toBuffer(context, made), voiceId: voice.id, positional: source !== null, pan: () => panOf(source) };
    comparison.push(c);
    slots.set(name, { name, voice, sound, group, gain, source, named, comparison: c, dropped: null });
  };
  const v = SCENE_VOICES;
  start('drone', '#7fd6ff', droneSound(rate), v.drone.group, v.drone.gain, sources.drone);
  start('kart', '#ff9a55', kartSound(rate), v.kart.group, v.kart.gain, sources.kart);
  start('orb', '#6dffc0', orbSound(rate), v.orb.group, v.orb.gain, sources.orb);
  start('generator', '#ffe34a', generatorSound(rate), v.generator.group, v.generator.gain, sources.generator);
  start('music', '#c58cff', musicLoopSound(rate), 'music', 0.16, null);
  start('radio', '#f7f7f7', radioMessageSound(rate), 'radio', 0.3, null); // 'stretch' group: slows, keeps its pitch
  const click = ralenti.load(clickSound(rate));

  const replaceSound = (voiceId: number, d: DecodedAudioFile): string => {
    const slot = [...slots.values()].find((s) => s.voice.id === voiceId || s.named.voiceId === voiceId);
    if (!slot) throw new Error('only the scene’s looping voices can take a dropped sound');
    const sound = ralenti.load({ channels: d.channels, sampleRate: d.sampleRate });
    const voice = ralenti.play(sound, { group: groupOf(slot.group), loop: true, gain: slot.gain, fadeInSeconds: 0.05, ...(slot.source ? { source: slot.source } : {}) });
    slot.voice.stop(0.05);
    const old = slot.sound;
    setTimeout(() => ralenti.unload(old), 500);
    voiceNames.delete(slot.voice.id);
    slot.voice = voice;
    slot.sound = sound;
    slot.dropped = d.name;
    const shown = `${slot.name} · ${d.name}`;
    slot.named.voiceId = voice.id;
    slot.named.name = shown;
    voiceNames.set(voice.id, slot.name);
    slot.comparison.voiceId = voice.id;
    slot.comparison.buffer = toBuffer(context, d);
    return shown;
  };

  return {
    context, ralenti, master, engineBus, sources, names, voiceNames, comparison, click,
    restored: saved.tuning !== null,
    restoreProblems: saved.problems,
    playClick: () => {
      ralenti.play(click, { group: groupOf('interface'), gain: 0.25 });
    },
    replaceSound,
    dropped: (name) => slots.get(name)?.dropped ?? null,
  };
}
