// Messages of the game-facing controls (pause, group buses, seek, per-source spatial settings) and the voice
// events and positions the worklet reports back; protocol.ts folds them into its Command and Report unions.
import type { Seconds, SourceSpatial } from '../src/index';

/** Pause the whole world (no group) or one group. */
export interface PauseCommand {
  type: 'pause';
  group?: string;
}
/** Resume the whole world (no group) or one group. */
export interface ResumeCommand {
  type: 'resume';
  group?: string;
}
/** Change a group bus: any of volume (dB), mute, solo, and whether a world pause holds it. */
export interface GroupCommand {
  type: 'group';
  group: string;
  volumeDb?: number;
  muted?: boolean;
  solo?: boolean;
  pausable?: boolean;
}
/** Move a voice's read head to `seconds` of source time. */
export interface SeekCommand {
  type: 'seek';
  voice: number;
  seconds: Seconds;
}
/** Set (null: clear) a source's own distance model, cone and orientation. */
export interface SourceSpatialCommand {
  type: 'source-spatial';
  source: number;
  spatial: SourceSpatial | null;
}

/** The control commands. */
export type ControlCommand = PauseCommand | ResumeCommand | GroupCommand | SeekCommand | SourceSpatialCommand;

/**
 * Voice events, oldest first, as flat triples (main-thread voice handle, event code, context time in s); codes are
 * src/engine's EVENT_ENDED, EVENT_STOLEN, EVENT_VIRTUAL, EVENT_AUDIBLE. Posted only when there are events.
 */
export interface VoiceEventsReport {
  type: 'voice-events';
  events: Float64Array;
  /** Voice read positions at `contextTime`, as triples (voice handle, position in s of source time, source s per s). */
  positions: Float64Array;
  contextTime: Seconds;
}

/** A received message's fields, before its shape is known. */
export type MessageFields = Record<string, unknown>;
/** Checks the shape of a message of one type: null when it has that command's shape, else what is wrong. */
export type ShapeCheck = (d: MessageFields) => string | null;

const isObject = (v: unknown): v is MessageFields => typeof v === 'object' && v !== null;
const isHandle = (v: unknown): v is number => typeof v === 'number' && Number.isInteger(v) && v >= 0;
const optional = (v: unknown, type: string): boolean => v === undefined || typeof v === type;

/**
 * Shape checks of the control commands, one per type (a new control command without a check does not compile).
 * Values inside (volumes, times) are range-checked by the engine, which clamps and counts.
 */
export const controlCommandChecks: { readonly [K in ControlCommand['type']]: ShapeCheck } = {
  pause: (d) => (optional(d.group, 'string') ? null : 'pause.group: expected a string'),
  resume: (d) => (optional(d.group, 'string') ? null : 'resume.group: expected a string'),
  group: (d) => {
    if (typeof d.group !== 'string') return 'group.group: expected a string';
    if (!optional(d.volumeDb, 'number')) return 'group.volumeDb: expected a number';
    if (!optional(d.muted, 'boolean') || !optional(d.solo, 'boolean') || !optional(d.pausable, 'boolean'))
      return 'group: muted, solo and pausable must be booleans';
    return null;
  },
  seek: (d) => {
    if (!isHandle(d.voice)) return 'seek.voice: expected a handle';
    return typeof d.seconds === 'number' ? null : 'seek.seconds: expected a number';
  },
  'source-spatial': (d) => {
    if (typeof d.source !== 'number') return 'source-spatial.source: expected a number';
    return d.spatial === null || isObject(d.spatial) ? null : 'source-spatial.spatial: expected an object or null';
  },
};
