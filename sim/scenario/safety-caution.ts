// The one wording of the caution that every dataset card, the command line, the scenario schema,
// the app's Export screen and the web-mode start-up message carry: simulated data is no
// substitute for testing on the real hardware. Environment-free, so the page can import it.

export const SAFETY_CAUTION =
  'Simulated data does not replace hardware testing. These trajectories come from a lumped ' +
  'mass-spring idealisation; a controller or model trained on them must be brought up on the ' +
  'real hardware with conservative limits (force, speed, actuation range, workspace) and under ' +
  "the lab's own safety rules, with a way to stop it at once.";
