// The table of `pliant` sub-commands. Each lives in its own file; add new ones here.
import type { CliCommand } from './command.ts';
import { benchCommand } from './bench-command.ts';
import { validateCommand } from './validate-command.ts';
import { generateCommand } from './generate-command.ts';
import { mergeCommand } from './merge-command.ts';
import { verifyCommand } from './verify-command.ts';
import { reproduceCommand } from './reproduce-command.ts';
import { inspectCommand } from './inspect-command.ts';
import { demoCommand } from './demo-command.ts';
import { baselineCommand } from './baseline-command.ts';
import { calibrateCommand } from './calibrate-command.ts';
import { renderCommand } from './render-command.ts';
import { scoreCommand } from './score-command.ts';
import { loaderCommand } from './loader-command.ts';

export const COMMANDS: CliCommand[] = [validateCommand, generateCommand, mergeCommand, verifyCommand, reproduceCommand, inspectCommand, loaderCommand, baselineCommand, scoreCommand, calibrateCommand, renderCommand, demoCommand, benchCommand];
