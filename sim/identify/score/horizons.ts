// Horizons at which errors are reported, as the user writes them: whole steps ("10") or seconds
// ("0.5s"), turned into steps per episode with its record interval (rounded to the nearest step).
import { DatasetRequestError } from '../../dataset/formats/dataset-request-error.ts';

export interface HorizonSpec {
  /** As written, e.g. "10" or "0.5s"; the key in score.json. */
  text: string;
  steps: number | null;
  seconds: number | null;
}

export const DEFAULT_HORIZONS = '10,50';

export function parseHorizons(text: string): HorizonSpec[] {
  const specs: HorizonSpec[] = [];
  for (const raw of text.split(',')) {
    const token = raw.trim();
    let spec: HorizonSpec | null = null;
    if (/^[1-9][0-9]*$/.test(token)) spec = { text: token, steps: Number(token), seconds: null };
    else if (/^([0-9]+(\.[0-9]+)?|\.[0-9]+)s$/.test(token) && Number(token.slice(0, -1)) > 0) spec = { text: token, steps: null, seconds: Number(token.slice(0, -1)) };
    if (!spec) throw new DatasetRequestError(`--horizons: "${token}" is neither a whole number of steps (10) nor seconds (0.5s); write for example --horizons 1,10,0.5s`);
    if (specs.some((s) => s.text === spec.text)) throw new DatasetRequestError(`--horizons: "${token}" is given twice; give each horizon once`);
    specs.push(spec);
  }
  return specs;
}

/** The horizon in steps for an episode with `recordedSteps` steps every `recordIntervalS`. */
export function horizonSteps(spec: HorizonSpec, recordIntervalS: number, recordedSteps: number, episodeId: string): number {
  const steps = spec.steps ?? Math.round(spec.seconds! / recordIntervalS);
  if (steps < 1 || steps > recordedSteps) {
    const asked = spec.steps === null ? `${spec.text} (${steps} steps of ${recordIntervalS} s)` : `${steps} steps`;
    throw new DatasetRequestError(`--horizons: ${asked} lies outside episode ${episodeId}, which has ${recordedSteps} recorded steps of ${recordIntervalS} s; give horizons from 1 to ${recordedSteps} steps (or up to ${recordedSteps * recordIntervalS} s)`);
  }
  return steps;
}

/** The default horizons that fit in every episode, always ending with the full rollout (one step is reported on its own). */
export function defaultHorizons(shortestRecordedSteps: number): HorizonSpec[] {
  const steps = [10, 50].filter((s) => s < shortestRecordedSteps);
  steps.push(shortestRecordedSteps);
  return steps.map((s) => ({ text: String(s), steps: s, seconds: null }));
}
