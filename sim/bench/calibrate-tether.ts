// The calibrate-tether case: wall time of `pliant calibrate`'s fit of the Korrin Bay tether
// scenario to its invented bench measurement (scenarios/bench/korrin-tether-bench.json), with the
// five parameters the bench does not know left free: length, axial stiffness, damping ratio,
// gravity and normal drag. Reading the files is outside the timed part.
import { fileURLToPath } from 'node:url';

import { calibrate } from '../identify/calibration/calibrate.ts';
import { readMeasurement } from '../identify/calibration/read-measurement.ts';
import type { BenchmarkCase } from './benchmark-case.ts';
import { loadDemoScenario } from './demo-scenario.ts';

export const calibrateTetherCase: BenchmarkCase = {
  name: 'calibrate-tether',
  async run() {
    const scenario = loadDemoScenario('korrin-tether');
    const measurementPath = fileURLToPath(new URL('../../scenarios/bench/korrin-tether-bench.json', import.meta.url));
    const measurement = await readMeasurement(measurementPath, process.cwd());
    const start = performance.now();
    const result = calibrate(scenario, measurement);
    const seconds = (performance.now() - start) / 1000;
    return {
      freeParameters: result.parameters.length,
      identifiable: result.parameters.filter((p) => p.identifiable).length,
      frames: measurement.frameCount,
      markers: measurement.markers.length,
      substepsPerFrame: result.substeps,
      iterations: result.iterations,
      simulations: result.simulations,
      wallSeconds: Number(seconds.toFixed(3)),
      millisecondsPerSimulation: Number(((1000 * seconds) / result.simulations).toFixed(3)),
      residualRmsM: Number(result.rmsM.toExponential(4)),
    };
  },
};
