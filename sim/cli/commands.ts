// The table of `pliant` sub-commands. Each lives in its own file; add new ones here.
import type { CliCommand } from './command.ts';
import { benchCommand } from './bench-command.ts';

export const COMMANDS: CliCommand[] = [benchCommand];
