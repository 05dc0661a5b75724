import { checkScenarioText } from './check-scenario.ts';
import { formatProblems } from './scenario-problem.ts';
import { sampleEpisode } from './sample-episode.ts';
const text = `{
  "formatVersion": 1,
  "name": "korrin-tether-sweep",
  "system": {
    "kind": "chain",
    "partCount": {"kind": "integer", "min": 10, "max": 40},
    "lengthM": {"kind": "uniform", "min": 2, "max": 5},
    "totalMassKg": 0.8,
    "axialStiffnessN": {"kind": "log-uniform", "min": 1000, "max": 20000},
    "bendingStiffnessRatio": 0.05,
    "dampingRatio": 0.1,
    "diameterM": 0.012,
    "anchor": "top-driven",
    "drivenAxes": ["x", "z"],
    "forceHandles": [-1],
    "forceAxes": ["y"]
  },
  "world": { "fluid": {"densityKgPerM3": 1000, "normalDragNsPerM3": 50, "tangentialDragNsPerM3": 5} },
  "controls": { "default": {"kind": "sinusoid", "amplitude": {"kind": "uniform", "min": 0.05, "max": 0.2}, "frequencyHz": 0.5} },
  "time": { "recordIntervalS": 0.02, "recordedSteps": 200 },
  "initialState": {"positionNoiseM": 0.001},
  "episodes": 100,
  "seed": 42,
  "splits": {"heldOut": [{"parameter": "/system/partCount", "above": 35}]}
}`;
const r = checkScenarioText(text, 'tether.json');
if (!r.ok) console.log(formatProblems(r.problems, 'tether.json'));
else {
  const e = sampleEpisode(r.scenario, 3);
  console.log(e.split, e.system.model.nodeCount, e.system.controlChannels.map(c=>c.name), e.labels, e.controls.length);
  console.log(JSON.stringify(r.scenario.time), JSON.stringify(r.scenario.splits));
}
