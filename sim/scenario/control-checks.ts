// Control specs checked against the record rate (findControlSpecProblems of the controls
// module), and channel keys checked against the channels the system really has.
import { findControlSpecProblems } from '../controls/control-spec-problems.ts';
import { childPointer } from '../random/spec-problem.ts';
import type { BuiltSystem } from '../systems/built-system.ts';
import { closestName } from './closest-name.ts';
import type { ScenarioProblem } from './scenario-problem.ts';
import type { Scenario } from './scenario-types.ts';

export function findControlSpecProblemsOf(scenario: Scenario): ScenarioProblem[] {
  const interval = scenario.time.recordIntervalS;
  const specs = [
    { spec: scenario.controls.default, pointer: '/controls/default' },
    ...Object.entries(scenario.controls.channels).map(([key, spec]) => ({ spec, pointer: childPointer('/controls/channels', key) })),
  ];
  return specs.flatMap(({ spec, pointer }) =>
    findControlSpecProblems(spec, pointer, interval).map((p) => ({ pointer: p.pointer, message: `${p.message}; ${p.fix}` })),
  );
}

/** `systems` are built at both ends of every range, so names that depend on the part count are all seen. */
export function findChannelKeyProblems(scenario: Scenario, systems: readonly BuiltSystem[]): ScenarioProblem[] {
  const names = new Set<string>();
  let channelCount = 0;
  for (const system of systems) {
    for (const channel of system.controlChannels) names.add(channel.name);
    channelCount = Math.max(channelCount, system.controlChannels.length);
  }
  const known = [...names];
  const problems: ScenarioProblem[] = [];
  for (const key of Object.keys(scenario.controls.channels)) {
    if (names.has(key)) continue;
    if (/^(0|[1-9][0-9]*)$/.test(key) && Number(key) < channelCount) continue;
    const pointer = childPointer('/controls/channels', key);
    if (channelCount === 0) {
      problems.push({
        pointer,
        message: `names channel "${key}", but this system has no control channels; add force handles or a driven top (chains) or actuated materials (lattices), or remove it`,
      });
      continue;
    }
    const suggestion = closestName(key, known);
    problems.push({
      pointer,
      message: `names channel "${key}", which this system does not have; ${suggestion !== undefined ? `did you mean "${suggestion}"? ` : ''}its channels are ${known.map((n) => `"${n}"`).join(', ')} (or their indices "0" to "${channelCount - 1}")`,
    });
  }
  return problems;
}
