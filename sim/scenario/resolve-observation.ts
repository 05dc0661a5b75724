// Turns a scenario's observation block into the settings of one episode: the marker node
// indices for this episode's node count, the noise level and dropout rate drawn (and labelled)
// under their JSON pointers, and the time base in whole records. Node counts may differ between
// episodes, so a listed marker is checked against the episode's own system here.
import type { ObservationSettings } from '../episode/observe-trajectory.ts';
import { observationTiming } from './observation-timing.ts';
import type { ParameterResolver } from './parameter-resolver.ts';
import { ScenarioProblemError } from './scenario-problem.ts';
import type { MarkerSpec, ObservationSpec, TimeSpec } from './scenario-types.ts';

/** Node index of each marker of `markers` in a system of `nodeCount` nodes, or the problem at its pointer. */
export function markerNodes(markers: MarkerSpec, nodeCount: number): Int32Array {
  if ('everyNth' in markers) {
    const step = markers.everyNth;
    const nodes = new Int32Array(Math.floor((nodeCount - 1) / step) + 1);
    for (let k = 0; k < nodes.length; k++) nodes[k] = k * step;
    return nodes;
  }
  const nodes = new Int32Array(markers.nodes.length);
  markers.nodes.forEach((given, k) => {
    const node = given < 0 ? nodeCount + given : given;
    if (node < 0 || node >= nodeCount) {
      throw new ScenarioProblemError([
        {
          pointer: `/observation/markers/nodes/${k}`,
          message:
            `is node ${given}, which this episode's system does not have (it has ${nodeCount} nodes, 0 to ${nodeCount - 1}, or -1 to -${nodeCount} from the last); ` +
            'node counts can vary between episodes, so list only nodes every episode has, count from the last node with negative indices, or use {"everyNth": k}',
        },
      ]);
    }
    nodes[k] = node;
  });
  for (let k = 0; k < nodes.length; k++) {
    const earlier = nodes.indexOf(nodes[k]);
    if (earlier < k) {
      throw new ScenarioProblemError([
        { pointer: `/observation/markers/nodes/${k}`, message: `is node ${nodes[k]} in this episode, the same node as /observation/markers/nodes/${earlier}; list each node once` },
      ]);
    }
  }
  return nodes;
}

export function resolveObservation(spec: ObservationSpec, time: TimeSpec, nodeCount: number, resolver: ParameterResolver): ObservationSettings {
  const timing = observationTiming(spec, time);
  if (!timing.ok) throw new ScenarioProblemError(timing.problems);
  const positionNoiseStdM = resolver.value(spec.positionNoiseM, '/observation/positionNoiseM', 'none');
  const dropoutProbability = resolver.value(spec.dropoutProbability, '/observation/dropoutProbability', 'none');
  return {
    markerNodes: markerNodes(spec.markers, nodeCount),
    positionNoiseStdM,
    frameStride: timing.timing.frameStride,
    latencyRecords: timing.timing.latencyRecords,
    dropoutProbability,
  };
}
