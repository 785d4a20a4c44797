// Audio of the sample scene: the runtime on a fresh AudioContext, the master chain, the generated sounds and voices.
import { createRalenti, type Ralenti, type RalentiSource, type RalentiVoice, type Sound } from '../runtime';
import { listeningGain, loadAutosaved, type ComparisonSource, type NamedVoice, type TuningProblem } from '../editor';
import { SCENE_VOICES } from './script-sounds';
import { sceneGroup } from './scene-groups';
import { gainToDb } from '../src/dsp';
import { radioMessageSound } from './radio-message';
import { clickSound, droneSound, generatorSound, kartSound, musicLoopSound, orbSound, type GeneratedSound } from './procedural-sounds';

/** Everything the scene plays, with handles for the loop and the panel. */
export interface SceneAudio {
  context: AudioContext;
  ralenti: Ralenti;
  master: GainNode;
  engineBus: GainNode;
  sources: { drone: RalentiSource; kart: RalentiSource; orb: RalentiSource; generator: RalentiSource };
  voices: NamedVoice[];
  /** Voice names by voice id. */
  names: Map<number, string>;
  comparison: ComparisonSource[];
  click: Sound;
  restored: boolean;
  restoreProblems: TuningProblem[];
  /** Plays one interface click (exempt group). */
  playClick(): void;
}

function toBuffer(context: AudioContext, s: GeneratedSound): AudioBuffer {
  const b = context.createBuffer(s.channels.length, s.channels[0].length, s.sampleRate);
  s.channels.forEach((c, i) => b.copyToChannel(c, i));
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
  const made = {
    drone: droneSound(rate),
    kart: kartSound(rate),
    orb: orbSound(rate),
    generator: generatorSound(rate),
    music: musicLoopSound(rate),
    click: clickSound(rate),
  };
  const sources = {
    drone: ralenti.createSource(),
    kart: ralenti.createSource(),
    orb: ralenti.createSource(),
    generator: ralenti.createSource(),
  };
  const voices: NamedVoice[] = [];
  const names = new Map<number, string>();
  const comparison: ComparisonSource[] = [];
  const start = (name: string, colour: string, sound: GeneratedSound, group: string, gain: number, source: RalentiSource | null): RalentiVoice => {
    const loaded = ralenti.load(sound);
    const voice = ralenti.play(loaded, { group: sceneGroup(ralenti.tuning, group), loop: true, gainDb: gainToDb(gain), ...(source ? { source } : {}) });
    voices.push({ voiceId: voice.id, name, colour });
    names.set(voice.id, name);
    comparison.push({ name, buffer: toBuffer(context, sound), voiceId: voice.id, positional: source !== null, pan: () => panOf(source) });
    return voice;
  };
  const v = SCENE_VOICES;
  start('drone', '#7fd6ff', made.drone, v.drone.group, v.drone.gain, sources.drone);
  start('kart', '#ff9a55', made.kart, v.kart.group, v.kart.gain, sources.kart);
  start('orb', '#6dffc0', made.orb, v.orb.group, v.orb.gain, sources.orb);
  start('generator', '#ffe34a', made.generator, v.generator.group, v.generator.gain, sources.generator);
  start('music', '#c58cff', made.music, 'music', 0.16, null);
  start('radio', '#f7f7f7', radioMessageSound(rate), 'radio', 0.3, null); // 'stretch' group: slows, keeps its pitch
  const click = ralenti.load(made.click);
  return {
    context,
    ralenti,
    master,
    engineBus,
    sources,
    voices,
    names,
    comparison,
    click,
    restored: saved.tuning !== null,
    restoreProblems: saved.problems,
    playClick: () => {
      // Looked up at each click: the editor may have switched to a tuning without an 'interface' group.
      ralenti.play(click, { group: sceneGroup(ralenti.tuning, 'interface'), gainDb: gainToDb(0.25) });
    },
  };
}
