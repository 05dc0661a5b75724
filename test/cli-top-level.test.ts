// The top of the command line: `pliant` with no command is a usage error (exit 2, the help on
// stderr) and not a success; a mistyped command or option is answered with the nearest known
// name. Exit 2 for usage errors follows the convention of POSIX utilities (common practice,
// no source); the nearest name is by Levenshtein edit distance.
import { describe, expect, it } from 'vitest';

import { closestName } from '../sim/cli/closest-name.ts';
import { EXIT_CODE_BY_KIND } from '../sim/cli/exit-codes.ts';
import { runCli } from '../sim/cli/main.ts';
import { SAFETY_CAUTION } from '../sim/scenario/safety-caution.ts';

async function cli(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  let stdout = '';
  let stderr = '';
  const code = await runCli(args, { stdout: (t) => void (stdout += t), stderr: (t) => void (stderr += t), isTerminal: false, env: {}, cwd: process.cwd() });
  return { code, stdout, stderr };
}

describe('pliant with no command or a mistyped one', () => {
  it('no command: exit 2 with the command list on stderr', async () => {
    const run = await cli([]);
    expect(run.code).toBe(2);
    expect(run.stdout).toBe('');
    expect(run.stderr).toContain('Usage: pliant <command> [options]');
    expect(run.stderr).toContain('generate');
  });

  it('--help: exit 0 with the same text on stdout', async () => {
    const run = await cli(['--help']);
    expect(run.code).toBe(0);
    expect(run.stdout).toContain('Usage: pliant <command> [options]');
    // The exit statuses it states are the ones main.ts maps each kind of error to (sysexits.h's
    // EX_SOFTWARE, 70, for a bug; 1 and 2 as the command line has always used them).
    expect(run.stdout.replace(/\s+/g, ' ')).toContain(`Exit status: 0 when done; ${EXIT_CODE_BY_KIND.user} for a mistake in the command or its inputs`);
    expect([EXIT_CODE_BY_KIND.user, EXIT_CODE_BY_KIND.environment, EXIT_CODE_BY_KIND.bug]).toEqual([2, 1, 70]);
  });

  it('--help carries the one safety caution word for word (project rule), its lines wrapped to 78 columns', async () => {
    const run = await cli(['--help']);
    expect(run.stdout.replace(/\s+/g, ' ')).toContain(SAFETY_CAUTION);
    const cautionLines = run.stdout.slice(run.stdout.indexOf(SAFETY_CAUTION.split(' ')[0])).trim().split('\n');
    expect(cautionLines.length).toBeGreaterThan(1);
    for (const line of cautionLines) expect(line.length).toBeLessThanOrEqual(78);
  });

  it('a mistyped command: exit 2 and the nearest command offered', async () => {
    const run = await cli(['genrate', 'x.json']);
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(/^pliant: unknown command "genrate" \(did you mean "generate"\?\)\. Commands: /);
    const far = await cli(['frobnicate']);
    expect(far.code).toBe(2);
    expect(far.stderr).toMatch(/^pliant: unknown command "frobnicate"\. Commands: /);
  });

  it('offers a name only when it is near: one edit for short names, up to three for long ones', () => {
    // Worked by hand: "scroe" → "score" is 2 substitutions (limit 1 for 5 letters): no offer;
    // "valdate" → "validate" is 1 insertion.
    expect(closestName('valdate', ['validate', 'verify'])).toBe('validate');
    expect(closestName('scroe', ['score', 'merge'])).toBeNull();
    expect(closestName('--horizns', ['--horizons', '--out'])).toBe('--horizons');
    expect(closestName('--vpt-treshold', ['--vpt-threshold', '--split'])).toBe('--vpt-threshold');
    expect(closestName('--x', ['--out'])).toBeNull();
  });
});
