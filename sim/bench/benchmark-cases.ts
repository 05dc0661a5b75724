// Every case `pliant bench` runs, in order.
import type { BenchmarkCase } from './benchmark-case.ts';
import { chain1024Case } from './chain-1024.ts';

export const BENCHMARK_CASES: BenchmarkCase[] = [chain1024Case];
