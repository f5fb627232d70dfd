// Shared plumbing of the command line: the output sink every command writes to, the error that
// means "invalid input or arguments" (exit 2, FORMAT.md §6), a small argument parser and a
// plain-text table printer.
import { AxisFoldError, GroupNameError, type RotationGroup, canonicalNormal, getGroup } from '../../shared/engine/groups.js';

/**
 * Where a command writes. Each call writes one block of text and ends it with a newline unless it
 * already ends with one. `out` is stdout (the JSON document or the table), `err` is stderr.
 */
export interface CliIo {
  out(text: string): void;
  err(text: string): void;
}

/** Invalid input or arguments: main prints the message on stderr and exits with status 2. */
export class CliError extends Error {
  override readonly name = 'CliError';
}

/** Exit statuses of FORMAT.md §6. */
export const EXIT_OK = 0;
export const EXIT_FINDINGS = 1;
export const EXIT_INVALID = 2;

/** What a command accepts: flags that take a value and flags that stand alone. */
export interface ArgSpec {
  /** Flag names without the dashes that take a value, e.g. `['group', 'family']`. */
  readonly values?: readonly string[];
  /** Flag names that take no value, e.g. `['json']`. */
  readonly booleans?: readonly string[];
  /** Largest number of positional arguments (default 0). */
  readonly maxPositional?: number;
}

/** Parsed arguments. */
export interface ParsedArgs {
  readonly positional: string[];
  /** Every value of each value flag, in order (repeated flags collect). */
  readonly values: ReadonlyMap<string, readonly string[]>;
  readonly booleans: ReadonlySet<string>;
}

/**
 * Parses `--flag value`, `--flag=value`, repeated flags and boolean flags against `spec`.
 * Throws {@link CliError} for an unknown flag, a value flag without a value, a value given to a
 * boolean flag, or more positional arguments than allowed. `--` ends the flags.
 */
export function parseArgs(args: readonly string[], spec: ArgSpec): ParsedArgs {
  const valueFlags = new Set(spec.values ?? []);
  const boolFlags = new Set(spec.booleans ?? []);
  const values = new Map<string, string[]>();
  const booleans = new Set<string>();
  const positional: string[] = [];
  let flagsDone = false;
  for (let i = 0; i < args.length; i++) {
    const arg = String(args[i]);
    if (flagsDone || !arg.startsWith('--') || arg === '-') {
      positional.push(arg);
      continue;
    }
    if (arg === '--') {
      flagsDone = true;
      continue;
    }
    const eq = arg.indexOf('=');
    const name = eq >= 0 ? arg.slice(2, eq) : arg.slice(2);
    if (boolFlags.has(name)) {
      if (eq >= 0) throw new CliError(`--${name} takes no value`);
      booleans.add(name);
      continue;
    }
    if (!valueFlags.has(name)) {
      const known = [...valueFlags, ...boolFlags].map((f) => `--${f}`).join(', ');
      throw new CliError(`unknown option --${name}` + (known ? ` (this command takes ${known})` : ''));
    }
    let value: string;
    if (eq >= 0) value = arg.slice(eq + 1);
    else {
      const nextArg = args[i + 1];
      if (nextArg === undefined || (nextArg.startsWith('--') && nextArg.length > 2)) throw new CliError(`--${name} needs a value`);
      value = nextArg;
      i++;
    }
    const list = values.get(name);
    if (list) list.push(value);
    else values.set(name, [value]);
  }
  const max = spec.maxPositional ?? 0;
  if (positional.length > max) {
    throw new CliError(
      max === 0 ? `unexpected argument "${positional[0]}"` : `unexpected argument "${positional[max]}" (at most ${max} expected)`,
    );
  }
  return { positional, values, booleans };
}

/** The one value of a flag; throws {@link CliError} when it is given more than once, or is missing and `required`. */
export function singleValue(parsed: ParsedArgs, name: string, required: true): string;
export function singleValue(parsed: ParsedArgs, name: string, required?: false): string | undefined;
export function singleValue(parsed: ParsedArgs, name: string, required = false): string | undefined {
  const list = parsed.values.get(name) ?? [];
  if (list.length > 1) throw new CliError(`--${name} may be given only once`);
  if (list.length === 0 && required) throw new CliError(`--${name} is required`);
  return list[0];
}

/**
 * Parses a finite decimal number (no hex, no blanks, no "Infinity"). Throws {@link CliError}
 * naming `what` when the text is not one.
 */
export function parseNumber(text: string, what: string): number {
  const t = text.trim();
  if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(t)) throw new CliError(`${what}: "${text}" is not a number`);
  const n = Number(t);
  if (!Number.isFinite(n)) throw new CliError(`${what}: "${text}" is out of range`);
  return n;
}

/** Parses a whole number ≥ `min`; throws {@link CliError} naming `what` otherwise. */
export function parseInteger(text: string, what: string, min = 0): number {
  if (!/^[+-]?\d+$/.test(text.trim())) throw new CliError(`${what}: "${text}" is not a whole number`);
  const n = Number(text.trim());
  if (!Number.isSafeInteger(n) || n < min) throw new CliError(`${what}: ${text} must be a whole number ≥ ${min}`);
  return n;
}

/**
 * A plain-text table: columns padded to their widest cell, numbers right-aligned, a rule under
 * the header. Cells are converted with String().
 */
export function formatTable(headers: readonly string[], rows: readonly (readonly (string | number)[])[]): string {
  const cells = rows.map((r) => headers.map((_, k) => (r[k] === undefined ? '' : String(r[k]))));
  const numeric = headers.map((_, k) => rows.length > 0 && rows.every((r) => typeof r[k] === 'number'));
  const widths = headers.map((h, k) => Math.max(h.length, ...cells.map((r) => r[k].length)));
  const line = (r: readonly string[]) =>
    r.map((c, k) => (numeric[k] ? c.padStart(widths[k]) : c.padEnd(widths[k]))).join('  ').trimEnd();
  return [line(headers), widths.map((w) => '-'.repeat(w)).join('  '), ...cells.map(line)].join('\n');
}

/** Writes `value` as the only JSON document on stdout (two-space indentation). */
export function writeJson(io: CliIo, value: unknown): void {
  io.out(JSON.stringify(value, null, 2));
}

/** The rotation group named by `--group`; throws {@link CliError} with the accepted names. */
export function parseGroupArg(text: string | undefined): RotationGroup {
  if (text === undefined) throw new CliError('--group is required (C<n>, D<n>, T, O or I)');
  try {
    return getGroup(text.trim());
  } catch (e) {
    if (e instanceof GroupNameError) throw new CliError(`--group: ${e.message}`);
    throw e;
  }
}

/**
 * A fold given on the command line, checked against the group: throws {@link CliError} for text
 * that is not a whole number and for a fold the group has no axis of (naming the folds it has).
 */
export function parseFoldArg(group: RotationGroup, text: string, what = '--family'): number {
  const fold = parseInteger(text, what, 1);
  try {
    canonicalNormal(group, fold);
  } catch (e) {
    if (e instanceof AxisFoldError) throw new CliError(`${what} ${text}: ${e.message}`);
    throw e;
  }
  return fold;
}
