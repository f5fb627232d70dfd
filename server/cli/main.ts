// Entry point of `npm run --silent cli -- <command> [options]` (FORMAT.md §6). Commands live in
// their own modules, loaded on demand, so one that is missing or broken only disables itself.
// Whatever happens, the process ends with 0, 1 or 2 and never prints a stack trace; stdout is
// written only when the command did not fail with invalid input (status 2).
import { pathToFileURL } from 'node:url';
import { type CliIo, CliError, EXIT_INVALID } from './io.js';

/** What every command module exports. */
export interface CommandModule {
  run(args: string[], io: CliIo): Promise<number>;
}

/** One row of the command table: a usage line and how to load the module. */
export interface CommandEntry {
  readonly summary: string;
  readonly load: () => Promise<unknown>;
}

// The specifier goes through a variable so the typecheck does not depend on which command
// modules exist yet; a missing one is reported when it is asked for.
const load = (specifier: string) => () => import(specifier) as Promise<unknown>;

export const COMMANDS: Readonly<Record<string, CommandEntry>> = {
  planes: {
    summary: 'planes --group G --family FOLD [--family FOLD …] [--json]   which planes can meet at right angles',
    load: load('./planes.js'),
  },
  envelope: {
    summary: 'envelope --group G --family FOLD:OFFSET [--family …] [--json]   the solid the planes bound',
    load: load('./envelope.js'),
  },
  audit: {
    summary: 'audit FILE [--sheet WxH] [--max-sheets N] [--angle-tolerance DEG] [--json]   audit a design document',
    load: load('./audit.js'),
  },
  canvas: {
    summary: 'canvas FILE --family ID --out FILE.svg   drawing template for one family',
    load: load('./canvas.js'),
  },
};

/** The usage text (also printed by `help`). */
export function usage(commands: Readonly<Record<string, CommandEntry>> = COMMANDS): string {
  return [
    'usage: npm run --silent cli -- <command> [options]',
    '',
    'commands:',
    ...Object.values(commands).map((c) => `  ${c.summary}`),
    '',
    'exit status: 0 done, no error; 1 the design has error findings; 2 invalid input or arguments',
  ].join('\n');
}

/** First line of an error's message, without a stack trace. */
function oneLine(e: unknown): string {
  const text = e instanceof Error ? e.message : String(e);
  const first = text.split('\n').find((l) => l.trim() !== '') ?? '';
  return first.trim() || (e instanceof Error ? e.name : 'unknown error');
}

function isCommandModule(m: unknown): m is CommandModule {
  return typeof m === 'object' && m !== null && typeof (m as { run?: unknown }).run === 'function';
}

/**
 * Runs one command line. `argv` is everything after the script name. Returns the exit status:
 * 0 done, 1 error findings, 2 invalid input (message on stderr, nothing on stdout). Never throws.
 * `commands` replaces the command table (tests use it to stand in broken modules).
 */
export async function main(argv: readonly string[], io: CliIo, commands: Readonly<Record<string, CommandEntry>> = COMMANDS): Promise<number> {
  const [name, ...rest] = argv;
  if (name === 'help' || name === '--help' || name === '-h') {
    io.out(usage(commands));
    return 0;
  }
  if (name === undefined || name === '') {
    io.err(`no command given\n${usage(commands)}`);
    return EXIT_INVALID;
  }
  const entry = Object.prototype.hasOwnProperty.call(commands, name) ? commands[name] : undefined;
  if (!entry) {
    io.err(`unknown command "${name}"\n${usage(commands)}`);
    return EXIT_INVALID;
  }
  let mod: unknown;
  try {
    mod = await entry.load();
  } catch (e) {
    io.err(`the ${name} command is not available: its module could not be loaded (${oneLine(e)})`);
    return EXIT_INVALID;
  }
  if (!isCommandModule(mod)) {
    io.err(`the ${name} command is not available: its module exports no run()`);
    return EXIT_INVALID;
  }
  const stdout: string[] = [];
  const buffered: CliIo = { out: (text) => stdout.push(text), err: (text) => io.err(text) };
  let code: number;
  try {
    code = await mod.run([...rest], buffered);
  } catch (e) {
    io.err(e instanceof CliError ? `${name}: ${e.message}` : `${name}: unexpected failure: ${oneLine(e)}`);
    return EXIT_INVALID;
  }
  if (code !== 0 && code !== 1 && code !== 2) {
    io.err(`${name}: the command ended with an unknown status ${String(code)}`);
    return EXIT_INVALID;
  }
  if (code !== EXIT_INVALID) for (const text of stdout) io.out(text);
  return code;
}

function processIo(): CliIo {
  const write = (stream: NodeJS.WriteStream) => (text: string) => {
    stream.write(text.endsWith('\n') ? text : `${text}\n`);
  };
  return { out: write(process.stdout), err: write(process.stderr) };
}

const invokedDirectly = process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href;
if (invokedDirectly) {
  // A closed pipe (e.g. `| head`) is not a failure of the command.
  process.stdout.on('error', () => process.exit(process.exitCode ?? 0));
  main(process.argv.slice(2), processIo()).then(
    (code) => {
      process.exitCode = code;
    },
    (e) => {
      process.stderr.write(`unexpected failure: ${oneLine(e)}\n`);
      process.exitCode = EXIT_INVALID;
    },
  );
}
