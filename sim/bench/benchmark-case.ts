// One benchmark case: a name and a function that runs it and returns its measurements.
export interface BenchmarkCase {
  name: string;
  run(): Promise<Record<string, number | string>>;
}
