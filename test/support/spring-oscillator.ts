// The textbook mass on a spring as a Model: node 0 pinned at the origin, node 1 free on the
// x axis at the spring's rest length plus an initial displacement. Motion stays on the axis,
// where the spring force −k·(x − L0) is exactly linear, so the run is the one-degree-of-
// freedom oscillator x'' = −(k/m)·x.
import type { Model } from '../../sim/core/model.ts';
import { NODE_PINNED, RELATION_STRUCTURAL } from '../../sim/core/model.ts';
import { ModelBuilder } from '../../sim/core/model-builder.ts';

export interface SpringOscillatorSpec {
  massKg: number;
  stiffnessNPerM: number;
  restLengthM: number;
  initialDisplacementM: number;
  dampingNsPerM?: number;
}

export function buildSpringOscillator(spec: SpringOscillatorSpec): Model {
  const builder = new ModelBuilder(8, 2, 0);
  builder.addNode({ positionM: [0, 0, 0], massKg: 1, flags: NODE_PINNED });
  builder.addNode({ positionM: [spec.restLengthM + spec.initialDisplacementM, 0, 0], massKg: spec.massKg });
  builder.addSpring(0, 1, spec.stiffnessNPerM, spec.dampingNsPerM ?? 0, RELATION_STRUCTURAL, spec.restLengthM);
  return builder.build();
}
