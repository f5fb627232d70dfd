// `canvas FILE --family ID --out FILE.svg [--json]` (FORMAT.md §6): writes the drawing template
// of one family. The SVG goes to a temporary name beside the target and is renamed when complete,
// so a half-written template never replaces a good one. Invalid input → CliError (exit 2).
import { randomBytes } from 'node:crypto';
import { readFile, rename, rm, stat, writeFile } from 'node:fs/promises';
import { basename, dirname, join } from 'node:path';
import { CanvasError, drawingTemplate } from '../../shared/engine/canvas.js';
import { MAX_DESIGN_BYTES, parseDesignText } from '../../shared/engine/design.js';
import { type CliIo, CliError, EXIT_OK, parseArgs, singleValue, writeJson } from './io.js';

export async function run(args: string[], io: CliIo): Promise<number> {
  const parsed = parseArgs(args, { values: ['family', 'out'], booleans: ['json'], maxPositional: 1 });
  const file = parsed.positional[0];
  if (file === undefined) throw new CliError('give the design file: canvas FILE --family ID --out FILE.svg');
  const familyId = singleValue(parsed, 'family', true);
  const out = singleValue(parsed, 'out', true);
  if (out.trim() === '') throw new CliError('--out needs a file name');

  let text: string;
  try {
    const st = await stat(file);
    if (!st.isFile()) throw new CliError(`${file} is not a file`);
    if (st.size > MAX_DESIGN_BYTES) throw new CliError(`${file}: the design file is larger than 2 MB`);
    text = await readFile(file, 'utf8');
  } catch (e) {
    if (e instanceof CliError) throw e;
    throw new CliError(`cannot read ${file}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
  }
  const r = parseDesignText(text);
  if (!r.ok) throw new CliError(`${file} is not a valid design:\n${r.errors.map((e) => `  ${e.path || '(document)'}: ${e.message}`).join('\n')}`);

  let svg: string;
  try {
    svg = drawingTemplate(r.design, familyId);
  } catch (e) {
    if (e instanceof CanvasError) throw new CliError(`--family: ${e.message}`);
    throw e;
  }

  const tmp = join(dirname(out), `.${basename(out)}.${randomBytes(6).toString('hex')}.tmp`);
  try {
    await writeFile(tmp, svg, { encoding: 'utf8', flag: 'wx' });
    await rename(tmp, out);
  } catch (e) {
    await rm(tmp, { force: true }).catch(() => undefined);
    throw new CliError(`cannot write ${out}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
  }
  if (parsed.booleans.has('json')) writeJson(io, { out, family: familyId });
  else io.err(`wrote the drawing template of family "${familyId}" to ${out}`);
  return EXIT_OK;
}
