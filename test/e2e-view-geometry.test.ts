// The pure parts the screens stand on, checked without a browser: what of a lattice the 3-D view
// draws as skin, how springs meet at nodes, how units are read from scenario keys, and how the
// playback clock turns wall time into frames. Each check names the outside fact it rests on.
import { describe, expect, it } from 'vitest';

import { formatDuration } from '../renderer/export/progress-words.ts';
import { PlaybackClock } from '../renderer/playback/playback-clock.ts';
import { modelTopology } from '../renderer/preview/model-topology.ts';
import { unitFromKey } from '../renderer/sweep/unit-from-key.ts';
import { nodeSpringIncidence, surfaceQuads } from '../renderer/view/body-topology.ts';
import type { LatticeMaterial } from '../sim/systems/lattice.ts';
import { buildLattice } from '../sim/systems/lattice.ts';

const foam: LatticeMaterial = { name: 'foam', youngsModulusPa: 1e4, densityKgPerM3: 1000, dampingRatio: 0.1, actuatorChannel: null, actuationStrainMax: 0 };

function block(nx: number, ny: number, nz: number) {
  const map = Array.from({ length: ny }, () => Array.from({ length: nz }, () => Array.from({ length: nx }, () => 1)));
  return modelTopology(buildLattice({ cellSizeM: 0.01, materialMap: map, materials: [foam], base: 'free', originM: [0, 0, 0] }));
}

describe('the skin drawn for a voxel body', () => {
  it('a box of a × b × c cells shows 2(ab + bc + ca) faces, its surface area in cell faces (elementary geometry)', () => {
    for (const [a, b, c] of [[1, 1, 1], [3, 2, 4], [12, 12, 12]] as const) {
      const skin = surfaceQuads(block(a, b, c));
      expect(skin.quadCount).toBe(2 * (a * b + b * c + c * a));
    }
  });

  it('every skin face lies in one of the box’s six boundary planes (elementary geometry)', () => {
    const t = block(3, 2, 4);
    const { quadNodes, quadCount } = surfaceQuads(t);
    const model = buildLattice({ cellSizeM: 0.01, materialMap: Array.from({ length: 2 }, () => Array.from({ length: 4 }, () => [1, 1, 1])), materials: [foam], base: 'free', originM: [0, 0, 0] }).model;
    const extent = [0.03, 0.02, 0.04];
    for (let f = 0; f < quadCount; f++) {
      const corners = Array.from(quadNodes.subarray(4 * f, 4 * f + 4), (n) => Array.from(model.positionM.subarray(3 * n, 3 * n + 3)));
      const onBoundary = [0, 1, 2].some((axis) => corners.every((p) => Math.abs(p[axis]) < 1e-12) || corners.every((p) => Math.abs(p[axis] - extent[axis]) < 1e-12));
      expect(onBoundary).toBe(true);
    }
  });

  it('a 2-D lattice is all skin: one face per square cell', () => {
    const t = modelTopology(buildLattice({ cellSizeM: 0.01, materialMap: [[1, 1, 0], [1, 1, 1]], materials: [foam], base: 'free', originM: [0, 0, 0] }));
    expect(surfaceQuads(t).quadCount).toBe(5);
  });
});

describe('springs meeting at nodes', () => {
  it('the degrees add up to twice the spring count (handshake lemma, Euler 1736)', () => {
    const map = Array.from({ length: 3 }, () => Array.from({ length: 3 }, () => [1, 1, 1]));
    const system = buildLattice({ cellSizeM: 0.01, materialMap: map, materials: [foam], base: 'free', originM: [0, 0, 0] });
    const t = modelTopology(system);
    const incidence = nodeSpringIncidence(t);
    expect(incidence.start[t.nodeCount]).toBe(2 * t.springCount);
    // An interior node of a cubic lattice joined along edges, face diagonals and body diagonals
    // has 6 + 12 + 8 = 26 neighbours (the 3 × 3 × 3 neighbourhood less itself).
    const x = system.model.positionM;
    let interior = -1;
    for (let i = 0; i < t.nodeCount; i++) {
      if ([0, 1, 2].every((k) => Math.abs(x[3 * i + k] - 0.01) < 1e-12)) interior = i;
    }
    expect(interior).toBeGreaterThanOrEqual(0);
    expect(incidence.start[interior + 1] - incidence.start[interior]).toBe(26);
  });
});

describe('units read from scenario keys', () => {
  // Unit symbols and their products and quotients as the SI Brochure writes them (BIPM, 9th
  // edition 2019, section 5.4; from memory): "kg/m³", "N·s/m", "m/s²".
  it.each([
    ['lengthM', 'm'],
    ['totalMassKg', 'kg'],
    ['youngsModulusPa', 'Pa'],
    ['densityKgPerM3', 'kg/m³'],
    ['gravityMPerS2', 'm/s²'],
    ['dampingNsPerM', 'N·s/m'],
    ['normalDragNsPerM3', 'N·s/m³'],
    ['airDragPerS', '1/s'],
    ['frequencyHz', 'Hz'],
    ['phaseRad', 'rad'],
  ])('%s is in %s', (key, unit) => {
    expect(unitFromKey(key)).toBe(unit);
  });

  it.each(['partCount', 'dampingRatio', 'kind', 'name', 'actuationStrainMax'])('%s names no unit', (key) => {
    expect(unitFromKey(key)).toBeNull();
  });
});

describe('the playback clock', () => {
  it('at 1× a second of wall time shows the frame one second in; at 0.5× half as far', () => {
    const clock = new PlaybackClock(0.02, 301);
    clock.toggle();
    for (let i = 0; i < 10; i++) clock.advance(0.1, 301);
    expect(clock.frame).toBe(50);
    clock.speed = 0.5;
    for (let i = 0; i < 10; i++) clock.advance(0.1, 301);
    expect(clock.frame).toBe(75);
  });

  it('holds at the newest frame while a preview is still streaming in', () => {
    const clock = new PlaybackClock(0.01, 1000);
    clock.toggle();
    clock.advance(5, 120);
    expect(clock.frame).toBe(119);
  });

  it('loops to the start once the whole episode is there', () => {
    const clock = new PlaybackClock(0.01, 100);
    clock.toggle();
    clock.advance(0.985, 100);
    expect(clock.frame).toBe(98);
    clock.advance(0.02, 100);
    expect(clock.frame).toBe(0);
  });
});

describe('durations in words', () => {
  it.each([
    [45, '45 s'],
    [200, '3 min 20 s'],
    [7500, '2 h 05 min'],
  ])('%d s reads "%s" (60 s to the minute, 3600 s to the hour)', (seconds, words) => {
    expect(formatDuration(seconds)).toBe(words);
  });
});
