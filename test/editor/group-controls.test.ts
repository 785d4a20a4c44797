// The panel's adapter to the runtime's group buses: used when the runtime has them, inert when it has not.
import { describe, expect, it } from 'vitest';
import { GroupControls } from '../../editor/group-controls';
import type { Ralenti } from '../../runtime/index';

describe('GroupControls', () => {
  it('is unavailable and inert on a runtime without group buses', () => {
    const g = new GroupControls({} as Ralenti);
    expect(g.available).toBe(false);
    expect(() => g.setMute('effects', true)).not.toThrow();
    expect(g.state('effects')).toBeNull();
  });

  it('calls setGroupMute, setGroupSolo and setGroupVolume and reads getGroupState', () => {
    const calls: unknown[][] = [];
    const runtime = {
      setGroupMute: (...a: unknown[]) => calls.push(['mute', ...a]),
      setGroupSolo: (...a: unknown[]) => calls.push(['solo', ...a]),
      setGroupVolume: (...a: unknown[]) => calls.push(['volume', ...a]),
      getGroupState: (g: string) => (g === 'music' ? { muted: true, solo: false, volumeDb: -6, peakDb: -20 } : undefined),
    };
    const g = new GroupControls(runtime as unknown as Ralenti);
    expect(g.available).toBe(true);
    g.setMute('music', true);
    g.setSolo('music', false);
    g.setVolume('music', -6);
    expect(calls).toEqual([['mute', 'music', true], ['solo', 'music', false], ['volume', 'music', -6]]);
    const s = g.state('music')!;
    expect(s.muted).toBe(true);
    expect(s.volumeDb).toBe(-6);
    expect(s.peak).toBeCloseTo(0.1, 12); // −20 dB = 10^(−20/20)
    expect(g.state('nope')).toBeNull();
  });
});
