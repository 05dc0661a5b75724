// One thing wrong with a value or control spec, located by JSON pointer so that the scenario
// layer can turn it into "file:line:column" for the user; and the error that carries them.
import { PliantError } from '../errors/pliant-error.ts';

export interface SpecProblem {
  /** JSON pointer (RFC 6901) of the offending member, relative to the document root. */
  pointer: string;
  /** What is wrong, with the offending value. */
  message: string;
  /** How to fix it, in words a scenario author can act on. */
  fix: string;
}

/** Thrown when a spec cannot be sampled; `problems` lists every reason found, not just the first. */
export class SpecError extends PliantError {
  readonly problems: SpecProblem[];

  constructor(problems: SpecProblem[]) {
    super('user', 'spec-invalid', problems.map((p) => `${p.pointer || '/'}: ${p.message}; ${p.fix}`).join('\n'));
    this.name = 'SpecError';
    this.problems = problems;
  }
}

/** Extends a JSON pointer by one member name or array index, escaping as RFC 6901 requires. */
export function childPointer(pointer: string, member: string | number): string {
  return `${pointer}/${String(member).replace(/~/g, '~0').replace(/\//g, '~1')}`;
}

/** The problem of a "kind" that is missing or not one of `kinds`; `what` is e.g. "distribution". */
export function unknownKindProblem(pointer: string, kind: unknown, kinds: readonly string[], what: string): SpecProblem {
  return {
    pointer: childPointer(pointer, 'kind'),
    message: `unknown ${what} kind ${JSON.stringify(kind) ?? '(missing)'}`,
    fix: `use one of ${kinds.map((k) => `"${k}"`).join(', ')}`,
  };
}

/** One problem per member of `record` outside `allowed`; `owner` names the object, e.g. 'a uniform spec'. */
export function unknownMemberProblems(record: Record<string, unknown>, allowed: readonly string[], pointer: string, owner: string): SpecProblem[] {
  return Object.keys(record)
    .filter((name) => !allowed.includes(name))
    .map((name) => ({
      pointer: childPointer(pointer, name),
      message: `"${name}" is not a member of ${owner}`,
      fix: `remove it or correct its spelling; ${owner} has ${allowed.map((m) => `"${m}"`).join(', ')}`,
    }));
}
