// Generated lattice shapes: every body must be face-connected (checked by breadth-first search
// over face neighbours, the textbook graph traversal, e.g. Cormen et al., Introduction to
// Algorithms, §22.2), lie inside its box, have exactly the drawn cell count, and draw materials
// and actuator channels per cell in the given proportions (within 4.5 binomial standard
// deviations, normal approximation; Feller, vol. 1).
import { describe, expect, it } from 'vitest';

import { checkScenarioValue } from '../sim/scenario/check-scenario.ts';
import { sampleEpisode } from '../sim/scenario/sample-episode.ts';
import type { SampledEpisode } from '../sim/scenario/sampled-episode.ts';
import type { Scenario } from '../sim/scenario/scenario-types.ts';
import type { LatticeParameters } from '../sim/systems/lattice.ts';

function swimmer(dimension: 2 | 3, base: 'free' | 'clamped'): Scenario {
  const result = checkScenarioValue({
    formatVersion: 1,
    name: `korrin-eel-${dimension}d`,
    description: 'Eel-like swimmer bodies for the Korrin Bay test tank (invented demo values).',
    system: {
      kind: 'lattice',
      cellSizeM: 0.01,
      base,
      shape: {
        generator: {
          dimension,
          boundsCells: dimension === 3 ? [10, { kind: 'integer', min: 2, max: 4 }, 3] : [12, { kind: 'integer', min: 3, max: 6 }],
          cellCount: { kind: 'integer', min: 1, max: 30 },
          materialWeights: [1, 3],
          actuatedChannelCount: { kind: 'integer', min: 1, max: 4 },
        },
      },
      materials: [
        { name: 'skin', youngsModulusPa: 2e5, densityKgPerM3: 1000, dampingRatio: 0.1 },
        { name: 'actuator', youngsModulusPa: 1e5, densityKgPerM3: 1060, dampingRatio: 0.1, actuatorChannel: 0, actuationStrainMax: 0.15 },
      ],
    },
    world: { gravityMPerS2: [0, 0, 0], fluid: { densityKgPerM3: 1000, normalDragNsPerM3: 200, tangentialDragNsPerM3: 20, buoyancy: false } },
    controls: { default: { kind: 'sinusoid', amplitude: 1, frequencyHz: 1 } },
    time: { recordIntervalS: 0.01, recordedSteps: 3 },
    episodes: 400,
    seed: 2026,
  });
  if (!result.ok) throw new Error(JSON.stringify(result.problems));
  return result.scenario;
}

interface Cell {
  x: number;
  y: number;
  z: number;
  value: number;
}

function cellsOf(e: SampledEpisode): { cells: Cell[]; nx: number; ny: number; nz: number } {
  const map = (e.system.parameters as LatticeParameters).materialMap;
  const cells: Cell[] = [];
  let nx = 0;
  let nz = 1;
  const ny = map.length;
  map.forEach((layer, y) =>
    (layer as unknown[]).forEach((entry, j) => {
      if (Array.isArray(entry)) {
        nz = Math.max(nz, j + 1);
        entry.forEach((value: number, x: number) => {
          nx = Math.max(nx, x + 1);
          if (value !== 0) cells.push({ x, y, z: j, value });
        });
      } else {
        nx = Math.max(nx, j + 1);
        if (entry !== 0) cells.push({ x: j, y, z: 0, value: entry as number });
      }
    }),
  );
  return { cells, nx, ny, nz };
}

function faceConnected(cells: Cell[]): boolean {
  const key = (c: { x: number; y: number; z: number }) => `${c.x},${c.y},${c.z}`;
  const filled = new Set(cells.map(key));
  const seen = new Set([key(cells[0])]);
  const queue = [cells[0]];
  while (queue.length > 0) {
    const c = queue.shift()!;
    for (const [dx, dy, dz] of [[1, 0, 0], [-1, 0, 0], [0, 1, 0], [0, -1, 0], [0, 0, 1], [0, 0, -1]]) {
      const n = { x: c.x + dx, y: c.y + dy, z: c.z + dz };
      const k = key(n);
      if (filled.has(k) && !seen.has(k)) {
        seen.add(k);
        queue.push({ ...n, value: 0 });
      }
    }
  }
  return seen.size === filled.size;
}

for (const [dimension, base] of [[3, 'free'], [2, 'clamped']] as const) {
  describe(`generated ${dimension}-D shapes (${base} base)`, () => {
    const scenario = swimmer(dimension, base);
    const episodes = Array.from({ length: 400 }, (_, i) => sampleEpisode(scenario, i));

    it('are face-connected (BFS reaches every cell), inside the drawn box and of the drawn cell count', () => {
      for (const e of episodes) {
        const { cells, nx, ny, nz } = cellsOf(e);
        const g = '/system/shape/generator';
        const box = [e.labels[`${g}/boundsCells/0`], e.labels[`${g}/boundsCells/1`], dimension === 3 ? e.labels[`${g}/boundsCells/2`] : 1];
        expect([nx, ny, nz]).toEqual(box);
        expect(cells).toHaveLength(e.labels[`${g}/cellCount`] as number);
        expect(e.system.model.cellCount).toBe(cells.length);
        for (const c of cells) {
          expect(c.x).toBeLessThan(nx);
          expect(c.y).toBeLessThan(ny);
          expect(c.z).toBeLessThan(nz);
        }
        expect(faceConnected(cells)).toBe(true);
        if (base === 'clamped') expect(cells.some((c) => c.y === 0)).toBe(true);
      }
    });

    it('differ between episodes and repeat for the same episode', () => {
      const maps = new Set(episodes.map((e) => JSON.stringify((e.system.parameters as LatticeParameters).materialMap)));
      expect(maps.size).toBeGreaterThan(300);
      const again = sampleEpisode(scenario, 17);
      expect((again.system.parameters as LatticeParameters).materialMap).toEqual((episodes[17].system.parameters as LatticeParameters).materialMap);
    });

    it('give materials by weight 1:3 and actuated cells a uniformly drawn channel among actuatedChannelCount', () => {
      let skin = 0;
      let actuator = 0;
      const channelCounts = new Map<number, number[]>();
      for (const e of episodes) {
        const parameters = e.system.parameters as LatticeParameters;
        const count = e.labels['/system/shape/generator/actuatedChannelCount'] as number;
        expect(e.system.controlChannels).toHaveLength(count);
        const tally = channelCounts.get(count) ?? new Array<number>(count).fill(0);
        for (const c of cellsOf(e).cells) {
          const material = parameters.materials[c.value - 1];
          if (material.actuatorChannel === null) {
            expect(material.name).toBe('skin');
            skin++;
          } else {
            expect(material.name).toBe(`actuator@${material.actuatorChannel}`);
            tally[material.actuatorChannel]++;
            actuator++;
          }
        }
        channelCounts.set(count, tally);
      }
      const n = skin + actuator;
      expect(Math.abs(actuator - 0.75 * n)).toBeLessThan(4.5 * Math.sqrt(n * 0.75 * 0.25));
      for (const [count, tally] of channelCounts) {
        const total = tally.reduce((a, b) => a + b, 0);
        for (const k of tally) expect(Math.abs(k - total / count)).toBeLessThan(4.5 * Math.sqrt(total * (1 / count) * (1 - 1 / count)) + 1);
      }
    });
  });
}
