// `envelope --group G --family FOLD:OFFSET [--family …] [--json]` (FORMAT.md §6): the solid bounded
// by the half-spaces of the families' planes.
import { EnvelopeError, envelopeOfFamilies } from '../../shared/engine/envelope.js';
import { canonicalNormal } from '../../shared/engine/groups.js';
import { type CliIo, CliError, EXIT_OK, formatTable, parseArgs, parseFoldArg, parseGroupArg, parseNumber, singleValue, writeJson } from './io.js';

export async function run(args: string[], io: CliIo): Promise<number> {
  const parsed = parseArgs(args, { values: ['group', 'family'], booleans: ['json'] });
  const group = parseGroupArg(singleValue(parsed, 'group', true));
  const texts = parsed.values.get('family') ?? [];
  if (texts.length === 0) throw new CliError('--family is required: give FOLD:OFFSET, e.g. --family 5:120 (repeat for more families)');
  const families = texts.map((text) => {
    const m = /^([^:]*):(.*)$/.exec(text);
    if (!m) throw new CliError(`--family ${text}: give FOLD:OFFSET with the offset in mm, e.g. ${text.trim() || '5'}:120`);
    const fold = parseFoldArg(group, m[1], `--family ${text}: fold`);
    if (m[2].trim() === '') throw new CliError(`--family ${text}: the offset is missing; give FOLD:OFFSET, e.g. ${fold}:120`);
    const offset = parseNumber(m[2], `--family ${text}: offset`);
    if (offset < 0) throw new CliError(`--family ${text}: the offset must not be negative`);
    return { fold, offset, id: text.trim(), normal: canonicalNormal(group, fold) };
  });
  let env;
  try {
    env = envelopeOfFamilies(group, families);
  } catch (e) {
    if (e instanceof EnvelopeError) throw new CliError(e.message);
    throw e;
  }
  const doc = {
    vertices: env.vertices.length,
    edges: env.edges.length,
    faces: env.faces.length,
    faceSides: env.faceSides,
    dihedralDeg: env.dihedralDeg,
  };
  if (parsed.booleans.has('json')) {
    writeJson(io, doc);
    return EXIT_OK;
  }
  const byFamily = families.map((f, k) => [`${f.fold}-fold`, f.offset, env.faces.filter((face) => face.family === k).length]);
  const lines = [
    `envelope of group ${group.name} (order ${group.order})`,
    '',
    formatTable(['family', 'offset (mm)', 'faces'], byFamily),
    '',
    `vertices ${doc.vertices}, edges ${doc.edges}, faces ${doc.faces}`,
    '',
    formatTable(
      ['sides', 'faces'],
      Object.entries(doc.faceSides)
        .sort((a, b) => Number(a[0]) - Number(b[0]))
        .map(([k, n]) => [Number(k), n]),
    ),
    '',
    `dihedral angles (°): ${doc.dihedralDeg.map((a) => a.toFixed(3)).join(', ')}`,
  ];
  io.out(lines.join('\n'));
  return EXIT_OK;
}
