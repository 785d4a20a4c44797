import { describe, expect, it } from 'vitest';
import { Group, Object3D, PerspectiveCamera } from 'three';
import { Ralenti, defaultTuning } from '../../runtime/index';
import { ThreeBinding } from '../../runtime/three/index';
import { decodeSnapshot } from '../../runtime/protocol';
import { FakeWorkletNode, fakeContext } from './fake-worklet-node';

function setup(estimateVelocity = true) {
  const node = new FakeWorkletNode();
  const ralenti = new Ralenti({ context: fakeContext(), node: node as unknown as AudioWorkletNode, tuning: defaultTuning, capacity: 8 });
  const binding = new ThreeBinding({ target: ralenti, estimateVelocity, updateMatrices: true });
  const last = () => decodeSnapshot(node.commands('snapshot').at(-1)!.data)!;
  return { node, ralenti, binding, last };
}

describe('ThreeBinding defaults for the propagation model', () => {
  it('sends positions only by default (the engine derives velocities from its trajectory history)', () => {
    const node = new FakeWorkletNode();
    const ralenti = new Ralenti({ context: fakeContext(), node: node as unknown as AudioWorkletNode, tuning: defaultTuning, capacity: 8 });
    const binding = new ThreeBinding({ target: ralenti, updateMatrices: true });
    const car = new Object3D();
    binding.bindSource(car);
    binding.bindListener(new PerspectiveCamera());
    for (let f = 0; f <= 3; f++) {
      car.position.set(25 * (f / 60), 0, -5);
      binding.update(f / 60);
    }
    const s = decodeSnapshot(node.commands('snapshot').at(-1)!.data)!;
    expect('velocity' in s.sources[0]).toBe(false);
    expect('velocity' in s.listener).toBe(false);
  });

  it('sends an explicit teleport for a bound object', () => {
    const { node, binding } = setup(false);
    const car = new Object3D();
    const src = binding.bindSource(car);
    binding.teleport(car);
    expect(node.commands('teleport')).toEqual([{ type: 'teleport', source: src.id }]);
  });
});

describe('ThreeBinding', () => {
  it('reads the listener position and −z forward / +y up from a rotated camera\'s world matrix', () => {
    const { binding, last } = setup(false);
    const cam = new PerspectiveCamera();
    cam.position.set(1, 2, 3);
    cam.rotation.set(0, Math.PI / 2, 0); // yaw 90° left: −z turns to −x
    binding.bindListener(cam);
    binding.update(0);
    const l = last().listener;
    expect(l.position).toEqual({ x: 1, y: 2, z: 3 });
    expect(l.forward.x).toBeCloseTo(-1, 12);
    expect(l.forward.z).toBeCloseTo(0, 12);
    expect(l.up.y).toBeCloseTo(1, 12);
    expect('velocity' in l).toBe(false);
  });

  it('uses world positions of nested objects and normalises scaled axes', () => {
    const { binding, last } = setup(false);
    const parent = new Group();
    parent.position.set(10, 0, 0);
    parent.scale.set(2, 2, 2);
    const child = new Object3D();
    child.position.set(1, 0, 0);
    parent.add(child);
    binding.bindListener(parent);
    const src = binding.bindSource(child);
    binding.update(0);
    const s = last();
    expect(s.sources).toEqual([{ id: src.id, position: { x: 12, y: 0, z: 0 } }]);
    expect(s.listener.forward).toEqual({ x: -0, y: -0, z: -1 });
  });

  it('estimates a steady velocity from per-frame positions at 60 frames per second', () => {
    const { binding, last } = setup();
    const car = new Object3D();
    const src = binding.bindSource(car);
    for (let f = 0; f <= 120; f++) {
      car.position.set(25 * (f / 60), 0, -5);
      binding.update(f / 60);
    }
    const v = last().sources[0].velocity!;
    expect(last().sources[0].id).toBe(src.id);
    expect(v.x).toBeCloseTo(25, 6);
    expect(v.z).toBeCloseTo(0, 9);
  });

  it('treats a jump faster than the tuning\'s teleport speed as a teleport, not a supersonic source', () => {
    const { binding, last } = setup();
    const obj = new Object3D();
    binding.bindSource(obj);
    binding.update(0);
    binding.update(1 / 60);
    obj.position.set(1000, 0, 0); // 60 km/s implied
    binding.update(2 / 60);
    const v = last().sources[0].velocity!;
    expect(1000 * 60).toBeGreaterThan(defaultTuning.doppler.teleportSpeed); // the jump really is above the limit
    // The object stood still before the jump, so the estimate after the teleport reset is exactly at rest.
    expect(Math.hypot(v.x, v.y, v.z)).toBe(0);
  });

  it('binds each object once and drops an unbound object\'s source from the snapshots', () => {
    const { binding, last } = setup(false);
    const a = new Object3D();
    const b = new Object3D();
    expect(binding.bindSource(a)).toBe(binding.bindSource(a));
    const sb = binding.bindSource(b);
    expect(binding.size).toBe(2);
    binding.unbindSource(a);
    binding.update(0);
    expect(last().sources.map((s) => s.id)).toEqual([sb.id]);
    expect(binding.sourceOf(a)).toBeUndefined();
  });
});

describe('ThreeBinding.retarget', () => {
  it('moves bound objects to a new runtime with fresh sources', () => {
    const first = setup(false);
    const obj = new Object3D();
    obj.position.set(3, 0, 0);
    const old = first.binding.bindSource(obj);
    const node = new FakeWorkletNode();
    const next = new Ralenti({ context: fakeContext(), node: node as unknown as AudioWorkletNode, tuning: defaultTuning, capacity: 8 });
    first.binding.retarget(next);
    const fresh = first.binding.sourceOf(obj)!;
    expect(old.alive).toBe(false);
    expect(fresh).not.toBe(old);
    first.binding.update(0);
    expect(decodeSnapshot(node.commands('snapshot').at(-1)!.data)!.sources).toEqual([{ id: fresh.id, position: { x: 3, y: 0, z: 0 } }]);
  });
});
