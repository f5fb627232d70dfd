// `planes --group G --family FOLD [--family FOLD …] [--json]` (FORMAT.md §6): which planes of the
// chosen families can meet at right angles.
import { PlanesError, analysePlanes } from '../../shared/engine/planes.js';
import { type CliIo, CliError, EXIT_OK, formatTable, parseArgs, parseFoldArg, parseGroupArg, singleValue, writeJson } from './io.js';

export async function run(args: string[], io: CliIo): Promise<number> {
  const parsed = parseArgs(args, { values: ['group', 'family'], booleans: ['json'] });
  const group = parseGroupArg(singleValue(parsed, 'group', true));
  const texts = parsed.values.get('family') ?? [];
  if (texts.length === 0) throw new CliError('--family is required: give a fold, e.g. --family 2 (repeat for more families)');
  const folds = texts.map((t) => parseFoldArg(group, t));
  let result;
  try {
    result = analysePlanes(group, folds);
  } catch (e) {
    if (e instanceof PlanesError) throw new CliError(e.message);
    throw e;
  }
  if (parsed.booleans.has('json')) {
    writeJson(io, result);
    return EXIT_OK;
  }
  const lines = [
    `group ${result.group} (order ${result.order}); planes at a non-zero offset`,
    '',
    formatTable(
      ['family', 'planes'],
      result.families.map((f) => [`${f.axis}-fold`, f.planes]),
    ),
    '',
    formatTable(
      ['families', 'perpendicular pairs'],
      Object.entries(result.pairsByFamily).map(([k, n]) => [k, n]),
    ),
    '',
    `perpendicular pairs: ${result.perpendicularPairs}`,
    `components (planes linked by right angles): ${result.components}`,
  ];
  io.out(lines.join('\n'));
  return EXIT_OK;
}
