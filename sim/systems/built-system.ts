// What a system builder returns: the model to simulate, the resolved physical parameters that
// produced it (the ground-truth labels) and the description of its control channels.
import type { Model } from '../core/model.ts';
import type { ControlChannelInfo } from './control-channel.ts';

export interface BuiltSystem<P = unknown> {
  kind: 'chain' | 'lattice';
  model: Model;
  parameters: P;
  controlChannels: ControlChannelInfo[];
}
