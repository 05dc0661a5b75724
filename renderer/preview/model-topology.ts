// The view's topology of a freshly built system: copied out of the Model so it can be
// transferred to the page while the worker keeps simulating the Model itself.
import type { Model } from '../../sim/core/model.ts';
import { NODE_DRIVEN, NODE_PINNED } from '../../sim/core/model.ts';
import type { BuiltSystem } from '../../sim/systems/built-system.ts';
import type { LatticeParameters } from '../../sim/systems/lattice.ts';
import type { BodyTopology } from '../view/body-topology.ts';

export function modelTopology(system: BuiltSystem): BodyTopology {
  const model: Model = system.model;
  const nodeFixed = new Uint8Array(model.nodeCount);
  for (let i = 0; i < model.nodeCount; i++) nodeFixed[i] = model.nodeFlags[i] & (NODE_PINNED | NODE_DRIVEN) ? 1 : 0;
  const springNodes = new Uint32Array(2 * model.springCount);
  for (let s = 0; s < model.springCount; s++) {
    springNodes[2 * s] = model.springNodeA[s];
    springNodes[2 * s + 1] = model.springNodeB[s];
  }
  const materialNames = system.kind === 'lattice' ? (system.parameters as LatticeParameters).materials.map((m) => m.name) : [];
  return {
    nodeCount: model.nodeCount,
    nodeMaterial: model.nodeMaterial.slice(),
    nodeChannel: model.nodeChannel.slice(),
    nodeFixed,
    springCount: model.springCount,
    springNodes,
    springRestLengthM: model.baseRestLengthM.slice(),
    cellCornerCount: model.cellCount > 0 ? model.cellCornerCount : 0,
    cellCount: model.cellCount,
    cellCorners: model.cellCorners.slice(),
    cellMaterial: model.cellMaterial.slice(),
    cellChannel: model.cellChannel.slice(),
    materialNames,
  };
}

/** Every buffer of a topology, for postMessage's transfer list. */
export function topologyBuffers(t: BodyTopology): ArrayBuffer[] {
  return [t.nodeMaterial, t.nodeChannel, t.nodeFixed, t.springNodes, t.springRestLengthM, t.cellCorners, t.cellMaterial, t.cellChannel].map(
    (a) => a.buffer as ArrayBuffer,
  );
}
