// Lattice builders expose actuators but no force handles; checks of Newton's second law on a
// lattice need external forces on chosen nodes. This returns the same model with extra handle
// nodes whose three axes read new control channels after the model's own, so the real
// simulator applies the forces through its ordinary handle path.
import type { Model } from '../../sim/core/model.ts';

export function withForceHandles(model: Model, nodes: readonly number[]): { model: Model; firstChannel: number } {
  const firstChannel = model.controlChannelCount;
  const handleNodes = Uint32Array.from([...model.handleNodes, ...nodes]);
  const channels = Int32Array.from([
    ...model.handleForceChannel,
    ...nodes.flatMap((_, j) => [firstChannel + 3 * j, firstChannel + 3 * j + 1, firstChannel + 3 * j + 2]),
  ]);
  return {
    model: { ...model, handleNodes, handleForceChannel: channels, controlChannelCount: firstChannel + 3 * nodes.length },
    firstChannel,
  };
}
