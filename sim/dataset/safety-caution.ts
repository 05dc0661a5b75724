// The caution every dataset card (and the command line's help) carries: simulated data is no
// substitute for testing on the real hardware.

export const SAFETY_CAUTION =
  'Simulated data does not replace hardware testing. These trajectories come from a lumped ' +
  'mass-spring idealisation; a controller or model trained on them must be brought up on the ' +
  'real hardware with conservative limits (force, speed, actuation range, workspace) and under ' +
  "the lab's own safety rules, with a way to stop it at once.";
