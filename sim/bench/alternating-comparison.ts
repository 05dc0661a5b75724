// Throughputs of several builds of one computation measured alternately (A, B, C, A, B, C, …)
// so that other load on a shared machine falls on all of them alike; each build's median and
// the ratios of the medians are reported, and whether every run ended on the same checksum bit
// for bit (same roundings, so the comparison is between code generators, not computations).
// Rates come twice: per wall-clock second (spring_updates_per_s) and per CPU second of the
// measured process (cpu_spring_updates_per_s). On a machine shared with other work the wall
// clock also counts the time others held the core, so the CPU-time ratios are the steadier.
import { median } from './median.ts';

export interface ComparedBuild {
  /** Key prefix in the bench line, e.g. "js", "wasm", "native". */
  name: string;
  run(): { springUpdatesPerS: number; seconds: number; cpuSeconds: number; checksum: number };
}

/** `ratios` names the pairs [numerator, denominator] to report as `<a>_over_<b>`. */
export function compareAlternately(builds: readonly ComparedBuild[], ratios: readonly [string, string][], runs: number): Record<string, number | string> {
  const rates = builds.map(() => [] as number[]);
  const cpuRates = builds.map(() => [] as number[]);
  const checksums = new Set<number>();
  for (let r = 0; r < runs; r++) {
    builds.forEach((build, b) => {
      const result = build.run();
      rates[b].push(result.springUpdatesPerS);
      // Same updates per run, so rate × wall seconds / CPU seconds is the rate per CPU second.
      cpuRates[b].push((result.springUpdatesPerS * result.seconds) / result.cpuSeconds);
      checksums.add(result.checksum);
    });
  }
  const medians = rates.map(median);
  const cpuMedians = cpuRates.map(median);
  const line: Record<string, number | string> = {};
  builds.forEach((build, b) => (line[`${build.name}_spring_updates_per_s`] = Math.round(medians[b])));
  const at = (name: string) => builds.findIndex((b) => b.name === name);
  for (const [a, b] of ratios) line[`${a}_over_${b}`] = Number((medians[at(a)] / medians[at(b)]).toFixed(3));
  builds.forEach((build, b) => (line[`${build.name}_cpu_spring_updates_per_s`] = Math.round(cpuMedians[b])));
  for (const [a, b] of ratios) line[`cpu_${a}_over_${b}`] = Number((cpuMedians[at(a)] / cpuMedians[at(b)]).toFixed(3));
  line.runs = runs;
  line.statistic = 'median';
  line.same_checksum = checksums.size === 1 ? 'yes' : 'no';
  return line;
}
