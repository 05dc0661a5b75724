// Splits a sub-command's arguments into positionals and options by a small declared table, so
// every command reports unknown, repeated or value-less options in the same words.
import { didYouMean } from './closest-name.ts';
import { CliUsageError } from './command.ts';

export interface OptionTable {
  /** Options that take a value (`--out DIR` or `--out=DIR`). */
  valued: readonly string[];
  /** Options that are on or off (`--resume`). */
  switches: readonly string[];
}

export interface ParsedArguments {
  positionals: string[];
  values: Map<string, string>;
  switches: Set<string>;
}

export function parseArguments(command: string, args: readonly string[], table: OptionTable): ParsedArguments {
  const parsed: ParsedArguments = { positionals: [], values: new Map(), switches: new Set() };
  const hint = `see \`pliant ${command} --help\``;
  let onlyPositionals = false;
  for (let i = 0; i < args.length; i++) {
    const arg = args[i];
    if (onlyPositionals || !arg.startsWith('--')) {
      if (!onlyPositionals && arg.startsWith('-') && arg !== '-') throw new CliUsageError(`unknown option "${arg}"; ${hint}`);
      parsed.positionals.push(arg);
      continue;
    }
    if (arg === '--') {
      onlyPositionals = true;
      continue;
    }
    const equals = arg.indexOf('=');
    const name = equals === -1 ? arg : arg.slice(0, equals);
    if (table.switches.includes(name)) {
      if (equals !== -1) throw new CliUsageError(`${name} takes no value (got "${arg}"); ${hint}`);
      parsed.switches.add(name);
      continue;
    }
    if (!table.valued.includes(name)) throw new CliUsageError(`unknown option "${name}"${didYouMean(name, [...table.valued, ...table.switches])}; ${hint}`);
    let value: string | undefined;
    if (equals !== -1) value = arg.slice(equals + 1);
    else if (i + 1 < args.length && !args[i + 1].startsWith('--')) value = args[++i];
    if (value === undefined || value === '') throw new CliUsageError(`${name} needs a value; ${hint}`);
    if (parsed.values.has(name)) throw new CliUsageError(`${name} is given twice; give it once`);
    parsed.values.set(name, value);
  }
  return parsed;
}

/** A whole number from an option, with the option named in the message. */
export function wholeNumberOption(name: string, text: string, min: number, max = Number.MAX_SAFE_INTEGER): number {
  if (!/^(0|[1-9][0-9]*)$/.test(text)) throw new CliUsageError(`${name} "${text}" is not a whole number; write for example ${name} ${Math.max(min, 1)}`);
  const value = Number(text);
  if (value < min || value > max) {
    throw new CliUsageError(`${name} ${text} is out of range; it must be from ${min} to ${max}`);
  }
  return value;
}

export function choiceOption<T extends string>(name: string, text: string, choices: readonly T[]): T {
  if (!(choices as readonly string[]).includes(text)) {
    throw new CliUsageError(`${name} "${text}" is not one of ${choices.join(', ')}`);
  }
  return text as T;
}
