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

const isObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null;
const isHandle = (v: unknown): v is number => typeof v === 'number' && Number.isInteger(v) && v >= 0;
const optional = (v: unknown, type: string): boolean => v === undefined || typeof v === type;

/** Checks the shape of a control command; returns it typed, a message saying what is wrong, or null when `type` is not a control. */
export function decodeControlCommand(data: Record<string, unknown>): ControlCommand | string | null {
  switch (data.type) {
    case 'pause':
    case 'resume':
      return optional(data.group, 'string') ? (data as unknown as ControlCommand) : `${data.type}.group: expected a string`;
    case 'group':
      if (typeof data.group !== 'string') return 'group.group: expected a string';
      if (!optional(data.volumeDb, 'number')) return 'group.volumeDb: expected a number';
      if (!optional(data.muted, 'boolean') || !optional(data.solo, 'boolean') || !optional(data.pausable, 'boolean'))
        return 'group: muted, solo and pausable must be booleans';
      return data as unknown as GroupCommand;
    case 'seek':
      if (!isHandle(data.voice)) return 'seek.voice: expected a handle';
      return typeof data.seconds === 'number' ? (data as unknown as SeekCommand) : 'seek.seconds: expected a number';
    case 'source-spatial':
      if (typeof data.source !== 'number') return 'source-spatial.source: expected a number';
      return data.spatial === null || isObject(data.spatial) ? (data as unknown as SourceSpatialCommand) : 'source-spatial.spatial: expected an object or null';
    default:
      return null;
  }
}
