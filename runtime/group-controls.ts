// Group buses on the main thread: validates group names against the running tuning, keeps the state the game set
// (for getGroupState and the editor), sends it to the worklet, and holds the nodes of groups with their own output.
import type { Decibels, Tuning } from '../src/index';
import type { Command } from './protocol';
import { RalentiOptionError, checkRange } from './runtime-error';

/** A group bus's state as set on the runtime. */
export interface GroupState {
  /** Volume in dB (−120…24; 0 by default). */
  volumeDb: Decibels;
  muted: boolean;
  solo: boolean;
}

/** What GroupControls needs from its runtime. */
export interface GroupControlsOptions {
  send: (c: Command) => void;
  tuning: () => Tuning;
  context: BaseAudioContext;
  node: AudioWorkletNode;
  /** Groups with their own node output (output k + 1 for routed[k]). */
  routed: readonly string[];
}

/** Group bus state, validation and routed outputs of one runtime. */
export class GroupControls {
  private readonly states = new Map<string, GroupState>();
  private readonly outputs = new Map<string, AudioNode>();

  constructor(private readonly o: GroupControlsOptions) {
    o.routed.forEach((g, k) => {
      const gain = o.context.createGain();
      o.node.connect(gain, k + 1);
      this.outputs.set(g, gain);
    });
  }

  /** Throws RalentiOptionError (field `field`) unless `group` is a group of the running tuning. */
  check(field: string, group: string): void {
    const groups = this.o.tuning().groups;
    if (typeof group !== 'string' || !Object.prototype.hasOwnProperty.call(groups, group))
      throw new RalentiOptionError(field, `unknown group "${String(group)}" (tuning has: ${Object.keys(groups).join(', ')})`);
  }

  /** Sets a group's volume in dB (−120…24). */
  setVolume(group: string, db: Decibels): void {
    this.check('setGroupVolume.group', group);
    checkRange('setGroupVolume.db', db, -120, 24);
    this.state(group).volumeDb = db;
    this.o.send({ type: 'group', group, volumeDb: db });
  }

  /** Mutes or unmutes a group. */
  setMute(group: string, muted: boolean): void {
    this.check('setGroupMute.group', group);
    if (typeof muted !== 'boolean') throw new RalentiOptionError('setGroupMute.muted', 'expected a boolean');
    this.state(group).muted = muted;
    this.o.send({ type: 'group', group, muted });
  }

  /** Solos or unsolos a group. */
  setSolo(group: string, solo: boolean): void {
    this.check('setGroupSolo.group', group);
    if (typeof solo !== 'boolean') throw new RalentiOptionError('setGroupSolo.solo', 'expected a boolean');
    this.state(group).solo = solo;
    this.o.send({ type: 'group', group, solo });
  }

  /** Sets whether a world pause holds a group. */
  setPausable(group: string, pausable: boolean): void {
    this.check('setGroupPausable.group', group);
    if (typeof pausable !== 'boolean') throw new RalentiOptionError('setGroupPausable.pausable', 'expected a boolean');
    this.o.send({ type: 'group', group, pausable });
  }

  /** The live state object of a known group (mutable: Ralenti.getGroupState hands the game a shallow copy of it). */
  state(group: string): GroupState {
    this.check('getGroupState.group', group);
    let s = this.states.get(group);
    if (!s) this.states.set(group, (s = { volumeDb: 0, muted: false, solo: false }));
    return s;
  }

  /** The node of a group with its own output; throws RalentiOptionError for any other group. */
  output(group: string): AudioNode {
    const n = this.outputs.get(group);
    if (n === undefined)
      throw new RalentiOptionError('groupOutput.group', `"${String(group)}" has no output of its own (createRalenti's groupOutputs: ${[...this.outputs.keys()].join(', ') || 'none'})`);
    return n;
  }
}
