// One thing wrong with a scenario, located by JSON pointer and, when the scenario came from a
// file, by line and column; and the one wording the command line and the app both show.
import { PliantError } from '../errors/pliant-error.ts';

export interface ScenarioProblem {
  /** JSON pointer (RFC 6901) of the offending value; "" for the whole document. */
  pointer: string;
  /** What is wrong and how to fix it, e.g. 'must be ≥ 1 (got 0)'. */
  message: string;
  /** 1-based line in the file. */
  line?: number;
  /** 1-based column in the file, counted in UTF-16 code units as editors do. */
  column?: number;
}

/** Thrown where a scenario turns out unusable after checking (overrides, replay files). */
export class ScenarioProblemError extends PliantError {
  readonly problems: ScenarioProblem[];

  constructor(problems: ScenarioProblem[]) {
    super('user', 'scenario-invalid', problems.map((p) => `${p.pointer || '/'}: ${p.message}`).join('\n'));
    this.name = 'ScenarioProblemError';
    this.problems = problems;
  }
}

/** One line per problem: `tether.json:12:5 /system/partCount: must be ≥ 1 (got 0)`. */
export function formatProblems(problems: readonly ScenarioProblem[], fileName: string): string {
  return problems
    .map((p) => {
      const where = p.line !== undefined ? `${fileName}:${p.line}:${p.column ?? 1}` : fileName;
      return `${where} ${p.pointer || '/'}: ${p.message}`;
    })
    .join('\n');
}
