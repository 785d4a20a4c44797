// The voice envelope's state machine: linear fades at rates from their durations (level step per sample =
// 1 / (seconds × rate), a closed form), and the phase each event leads to.
import { describe, expect, it } from 'vitest';
import {
  VoiceEnvelope, FREEZE_FADE_SECONDS, ENVELOPE_FADING_IN, ENVELOPE_SUSTAINED, ENVELOPE_HOLDING, ENVELOPE_THAWING, ENVELOPE_RELEASING, ENVELOPE_FINISHED,
} from '../../src/engine/voice-envelope';

const SR = 48000;
const N = 128;

describe('VoiceEnvelope', () => {
  it.each([
    { fadeIn: 0.003, first: N / (0.003 * SR), phase: ENVELOPE_FADING_IN },
    { fadeIn: 0.01, first: N / (0.01 * SR), phase: ENVELOPE_FADING_IN },
    { fadeIn: 0, first: 1, phase: ENVELOPE_SUSTAINED },
  ])('fades in over $fadeIn s: level $first after one block', ({ fadeIn, first, phase }) => {
    const e = new VoiceEnvelope(SR);
    e.begin(fadeIn, 0.01);
    e.step(false, N);
    expect(e.start).toBe(fadeIn > 0 ? 0 : 1);
    expect(e.level).toBeCloseTo(first, 12);
    expect(e.phase).toBe(phase);
  });

  it('reaches full level exactly and is then sustained', () => {
    const e = new VoiceEnvelope(SR);
    e.begin(0.003, 0.01);
    e.step(false, N);
    e.step(false, N); // 256 frames > 144 frames of fade
    expect(e.level).toBe(1);
    expect(e.phase).toBe(ENVELOPE_SUSTAINED);
  });

  it('holds at the freeze rate, stays silent while frozen, then thaws at the same rate and reports the resume once', () => {
    const e = new VoiceEnvelope(SR);
    e.begin(0, 0.01);
    const perBlock = N / (FREEZE_FADE_SECONDS * SR);
    e.step(true, N);
    expect(e.phase).toBe(ENVELOPE_HOLDING);
    expect(e.level).toBeCloseTo(1 - perBlock, 12);
    for (let i = 0; i < 10; i++) e.step(true, N);
    expect(e.level).toBe(0);
    expect(e.step(false, N)).toBe(true);
    expect(e.phase).toBe(ENVELOPE_THAWING);
    expect(e.level).toBeCloseTo(perBlock, 12);
    expect(e.step(false, N)).toBe(false);
    for (let i = 0; i < 10; i++) e.step(false, N);
    expect(e.level).toBe(1);
    expect(e.phase).toBe(ENVELOPE_SUSTAINED);
  });

  it('a thaw that starts above silence does not report a resume', () => {
    const e = new VoiceEnvelope(SR);
    e.begin(0, 0.01);
    e.step(true, N);
    expect(e.step(false, N / 4)).toBe(false);
    expect(e.phase).toBe(ENVELOPE_THAWING);
  });

  it.each([0.01, 0.05])('releases over %s s to silence and finishes, ignoring freezes', (seconds) => {
    const e = new VoiceEnvelope(SR);
    e.begin(0, 0.01);
    e.release(seconds);
    e.step(true, N);
    expect(e.phase).toBe(ENVELOPE_RELEASING);
    expect(e.level).toBeCloseTo(1 - N / (seconds * SR), 12);
    const blocks = Math.ceil((seconds * SR) / N);
    for (let i = 1; i < blocks; i++) e.step(false, N);
    expect(e.level).toBe(0);
    expect(e.phase).toBe(ENVELOPE_FINISHED);
  });

  it.each([0, -1, NaN, Infinity])('a fade of %s s is immediate', (seconds) => {
    expect(new VoiceEnvelope(SR).fadeStep(seconds)).toBe(1);
  });
});
