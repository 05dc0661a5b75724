// A large scenario for the responsiveness check, in the demos' setting: a 12 × 12 × 12 block of
// soft hull-patch foam clamped to the Korrin Bay tank floor, 13³ = 2,197 nodes. Invented numbers,
// for the test only; one short episode so the preview finishes quickly.

export const LARGE_LATTICE_EDGE_CELLS = 12;
export const LARGE_LATTICE_NODES = (LARGE_LATTICE_EDGE_CELLS + 1) ** 3;

export function largeLatticeScenarioText(): string {
  const n = LARGE_LATTICE_EDGE_CELLS;
  const layer = Array.from({ length: n }, () => Array.from({ length: n }, () => 1));
  const map = Array.from({ length: n }, () => layer);
  const scenario = {
    formatVersion: 1,
    name: 'korrin-hull-patch-block',
    description: 'Korrin Bay test tank: a block of soft hull-patch foam clamped to the tank floor, sagging under its own weight. Invented numbers for a responsiveness test.',
    system: {
      kind: 'lattice',
      cellSizeM: 0.01,
      shape: { maps: [map] },
      materials: [{ name: 'patch-foam', youngsModulusPa: 20000, densityKgPerM3: 1100, dampingRatio: 0.3 }],
      base: 'clamped',
    },
    time: { recordIntervalS: 0.02, recordedSteps: 60 },
    episodes: 1,
    seed: 2026,
  };
  return `${JSON.stringify(scenario, null, 1)}\n`;
}
