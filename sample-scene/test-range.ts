// The night-time test range: ground, lights, track and the visible bodies of the six sound sources.
import * as THREE from 'three';
import { CSS2DObject, CSS2DRenderer } from 'three/examples/jsm/renderers/CSS2DRenderer.js';
import { CONSOLE_POSITION, GENERATOR_POSITION, MUSIC_MAST_POSITION, TRACK_CENTER, TRACK_RADIUS } from './actor-paths';

/** One labelled body in the range. */
export interface RangeBody {
  object: THREE.Object3D;
  label: HTMLDivElement;
  /** Second line of the label, for a live readout. */
  readout: HTMLSpanElement;
}

/** The built range: renderers, camera and bodies. */
export interface TestRange {
  renderer: THREE.WebGLRenderer;
  labels: CSS2DRenderer;
  scene: THREE.Scene;
  camera: THREE.PerspectiveCamera;
  drone: RangeBody;
  kart: RangeBody;
  orb: RangeBody;
  generator: RangeBody;
  music: RangeBody;
  console: RangeBody;
  /** Animates lights and small motions at game time `t`. */
  animate(t: number): void;
  resize(width: number, height: number): void;
  render(): void;
}

function label(object: THREE.Object3D, title: string, group: string, colour: string, height: number): RangeBody {
  const div = document.createElement('div');
  div.className = 'range-label';
  div.style.setProperty('--accent', colour);
  const name = document.createElement('b');
  name.textContent = title;
  const tag = document.createElement('i');
  tag.textContent = group;
  const readout = document.createElement('span');
  readout.className = 'range-readout';
  div.append(name, tag, readout);
  const obj = new CSS2DObject(div);
  obj.position.set(0, height, 0);
  object.add(obj);
  return { object, label: div, readout };
}

function glow(colour: number, intensity = 1.6): THREE.MeshStandardMaterial {
  return new THREE.MeshStandardMaterial({ color: colour, emissive: colour, emissiveIntensity: intensity, roughness: 0.4 });
}

/** Builds the range into `host` (a full-window element). */
export function createTestRange(host: HTMLElement): TestRange {
  const renderer = new THREE.WebGLRenderer({ antialias: true });
  renderer.setPixelRatio(Math.min(2, window.devicePixelRatio));
  renderer.domElement.className = 'range-canvas';
  host.appendChild(renderer.domElement);
  const labels = new CSS2DRenderer();
  labels.domElement.className = 'range-labels';
  host.appendChild(labels.domElement);

  const scene = new THREE.Scene();
  scene.background = new THREE.Color(0x0b1020);
  scene.fog = new THREE.Fog(0x0b1020, 40, 260);
  const camera = new THREE.PerspectiveCamera(70, 16 / 9, 0.1, 1000);
  camera.position.set(10, 9, 30);

  scene.add(new THREE.HemisphereLight(0x5068a0, 0x101018, 1.1));
  const moon = new THREE.DirectionalLight(0xb8c8ff, 0.9);
  moon.position.set(-40, 60, 20);
  scene.add(moon);

  // A seeded star field on a dome (the same sky every start).
  let seed = 12345;
  const rand = () => ((seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0) / 4294967296);
  const starPositions = new Float32Array(900 * 3);
  for (let i = 0; i < 900; i++) {
    const az = rand() * Math.PI * 2;
    const el = Math.asin(0.08 + 0.92 * rand());
    starPositions.set([Math.cos(az) * Math.cos(el) * 450, Math.sin(el) * 450, Math.sin(az) * Math.cos(el) * 450], i * 3);
  }
  const starGeo = new THREE.BufferGeometry();
  starGeo.setAttribute('position', new THREE.BufferAttribute(starPositions, 3));
  scene.add(new THREE.Points(starGeo, new THREE.PointsMaterial({ color: 0xc8d4ff, size: 1.6, sizeAttenuation: false, fog: false })));

  const ground = new THREE.Mesh(new THREE.PlaneGeometry(800, 800), new THREE.MeshStandardMaterial({ color: 0x222c40, roughness: 1 }));
  ground.rotation.x = -Math.PI / 2;
  scene.add(ground);
  const grid = new THREE.GridHelper(800, 160, 0x3a4a6a, 0x2a3650);
  grid.position.y = 0.01;
  scene.add(grid);

  // Runway of the fly-by: a strip with a row of lamps under the drone's line.
  const strip = new THREE.Mesh(new THREE.PlaneGeometry(360, 6), new THREE.MeshStandardMaterial({ color: 0x232c3d, roughness: 1 }));
  strip.rotation.x = -Math.PI / 2;
  strip.position.set(0, 0.02, -14);
  scene.add(strip);
  const lampGeo = new THREE.SphereGeometry(0.18, 8, 6);
  const lampMat = glow(0xffd37a, 2.2);
  const lamps: THREE.Mesh[] = [];
  for (let x = -176; x <= 176; x += 8) {
    for (const dz of [-3, 3]) {
      const lamp = new THREE.Mesh(lampGeo, lampMat);
      lamp.position.set(x, 0.2, -14 + dz);
      scene.add(lamp);
      lamps.push(lamp);
    }
  }

  // Kart loop track.
  const track = new THREE.Mesh(new THREE.RingGeometry(TRACK_RADIUS - 2.5, TRACK_RADIUS + 2.5, 96), new THREE.MeshStandardMaterial({ color: 0x2a2f3a, roughness: 0.9 }));
  track.rotation.x = -Math.PI / 2;
  track.position.set(TRACK_CENTER.x, 0.03, TRACK_CENTER.z);
  scene.add(track);
  for (const r of [TRACK_RADIUS - 2.5, TRACK_RADIUS + 2.5]) {
    const edge = new THREE.Mesh(new THREE.TorusGeometry(r, 0.12, 6, 128), glow(0xff7a3d, 0.9));
    edge.rotation.x = Math.PI / 2;
    edge.position.set(TRACK_CENTER.x, 0.12, TRACK_CENTER.z);
    scene.add(edge);
  }

  // Fly-by drone: body, four rotor discs and a blinking beacon.
  const droneObj = new THREE.Group();
  droneObj.add(new THREE.Mesh(new THREE.BoxGeometry(1.6, 0.35, 1.0), glow(0x9fe2ff, 0.6)));
  const rotorMat = new THREE.MeshStandardMaterial({ color: 0xd8f4ff, transparent: true, opacity: 0.45, emissive: 0x6fc8ff, emissiveIntensity: 0.6 });
  for (const [x, z] of [[-0.9, -0.6], [0.9, -0.6], [-0.9, 0.6], [0.9, 0.6]]) {
    const rotor = new THREE.Mesh(new THREE.CylinderGeometry(0.5, 0.5, 0.04, 20), rotorMat);
    rotor.position.set(x, 0.22, z);
    droneObj.add(rotor);
  }
  const beacon = new THREE.Mesh(new THREE.SphereGeometry(0.16, 10, 8), glow(0xff3355, 3));
  beacon.position.set(0, -0.25, 0);
  droneObj.add(beacon);
  droneObj.scale.setScalar(2.2);
  scene.add(droneObj);
  const drone = label(droneObj, 'Fly-by drone', 'vehicles · straight pass', '#7fd6ff', 1.0);

  // Kart: low box with a roll bar.
  const kartObj = new THREE.Group();
  const kartBody = new THREE.Mesh(new THREE.BoxGeometry(2.2, 0.5, 1.3), glow(0xff8a3d, 0.7));
  kartObj.add(kartBody);
  const bar = new THREE.Mesh(new THREE.TorusGeometry(0.5, 0.06, 6, 16, Math.PI), glow(0xffe0b0, 0.4));
  bar.position.set(-0.3, 0.25, 0);
  kartObj.add(bar);
  kartObj.scale.setScalar(1.6);
  scene.add(kartObj);
  const kart = label(kartObj, 'Loop kart', 'vehicles · loop track', '#ff9a55', 1.2);

  // Orb: an emissive sphere with its own point light.
  const orbObj = new THREE.Group();
  orbObj.add(new THREE.Mesh(new THREE.SphereGeometry(0.16, 20, 14), glow(0x6dffc0, 2.4)));
  orbObj.add(new THREE.PointLight(0x6dffc0, 6, 8, 2));
  scene.add(orbObj);
  const orb = label(orbObj, 'Buzz orb', 'effects · close orbit', '#6dffc0', 0.25);

  // Generator: a squat housing with a pulsing vent.
  const genObj = new THREE.Group();
  const housing = new THREE.Mesh(new THREE.BoxGeometry(3, 2, 2), new THREE.MeshStandardMaterial({ color: 0x4a4f5c, roughness: 0.7 }));
  housing.position.y = 1;
  genObj.add(housing);
  const vent = new THREE.Mesh(new THREE.BoxGeometry(2.2, 0.6, 0.05), glow(0xffe34a, 1.5));
  vent.position.set(0, 1.2, 1.03);
  genObj.add(vent);
  genObj.position.set(GENERATOR_POSITION.x, 0, GENERATOR_POSITION.z);
  scene.add(genObj);
  const generator = label(genObj, 'Hum generator', 'ambience · stationary', '#ffe34a', 2.7);

  // Music mast: a tall pole with rings (marks the non-positional music loop).
  const mastObj = new THREE.Group();
  const pole = new THREE.Mesh(new THREE.CylinderGeometry(0.12, 0.16, 9, 10), new THREE.MeshStandardMaterial({ color: 0x8890a8 }));
  pole.position.y = 4.5;
  mastObj.add(pole);
  const rings: THREE.Mesh[] = [];
  for (let i = 0; i < 3; i++) {
    const ring = new THREE.Mesh(new THREE.TorusGeometry(0.6 + i * 0.25, 0.05, 6, 24), glow(0xc58cff, 1.8));
    ring.position.y = 6.5 + i * 0.9;
    ring.rotation.x = Math.PI / 2;
    mastObj.add(ring);
    rings.push(ring);
  }
  mastObj.position.set(MUSIC_MAST_POSITION.x, 0, MUSIC_MAST_POSITION.z);
  scene.add(mastObj);
  const music = label(mastObj, 'Music loop', 'music · tone only', '#c58cff', 9.6);

  // Interface console: a small desk with a screen (marks the non-positional clicks).
  const consoleObj = new THREE.Group();
  const desk = new THREE.Mesh(new THREE.BoxGeometry(1.2, 1, 0.6), new THREE.MeshStandardMaterial({ color: 0x39404f }));
  desk.position.y = 0.5;
  consoleObj.add(desk);
  const screen = new THREE.Mesh(new THREE.PlaneGeometry(1, 0.5), glow(0xf4f4f4, 1.2));
  screen.position.set(0, 1.3, 0.05);
  consoleObj.add(screen);
  consoleObj.position.set(CONSOLE_POSITION.x, 0, CONSOLE_POSITION.z);
  scene.add(consoleObj);
  const consoleBody = label(consoleObj, 'Interface clicks', 'interface · exempt', '#f4f4f4', 1.9);

  return {
    renderer,
    labels,
    scene,
    camera,
    drone,
    kart,
    orb,
    generator,
    music,
    console: consoleBody,
    animate(t: number) {
      for (const rotor of droneObj.children.slice(1, 5)) rotor.rotation.y = t * 40;
      (beacon.material as THREE.MeshStandardMaterial).emissiveIntensity = Math.sin(t * 9) > 0.3 ? 3 : 0.2;
      (vent.material as THREE.MeshStandardMaterial).emissiveIntensity = 1.2 + 0.6 * Math.sin(t * 2 * Math.PI * 1.5);
      rings.forEach((ring, i) => ring.scale.setScalar(1 + 0.15 * Math.sin(t * 2 * Math.PI * 0.5 + i)));
      lamps.forEach((lamp, i) => lamp.scale.setScalar(((i >> 1) + Math.floor(t * 8)) % 23 === 0 ? 2 : 1));
    },
    resize(width: number, height: number) {
      renderer.setSize(width, height);
      labels.setSize(width, height);
      camera.aspect = width / Math.max(1, height);
      camera.updateProjectionMatrix();
    },
    render() {
      renderer.render(scene, camera);
      labels.render(scene, camera);
    },
  };
}
