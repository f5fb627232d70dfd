// `audit FILE [--sheet WxH] [--max-sheets N] [--angle-tolerance DEG] [--json]` (FORMAT.md §6):
// audits a design document. Exit 0 when no finding is an error, 1 when some are, 2 for invalid
// arguments or an invalid design (messages on stderr naming the field path, nothing on stdout).
import { readFile, stat } from 'node:fs/promises';
import { type AuditOptions, type FullAuditReport, audit } from '../../shared/engine/audit.js';
import { MAX_COORDINATE, MAX_DESIGN_BYTES, parseDesignText } from '../../shared/engine/design.js';
import { JOINT_KINDS } from '../../shared/engine/model.js';
import { type CliIo, CliError, EXIT_FINDINGS, EXIT_INVALID, EXIT_OK, formatTable, parseArgs, parseInteger, parseNumber, singleValue, writeJson } from './io.js';

/** Largest --max-sheets accepted (the design schema's limit too). */
const MAX_SHEETS = 1000;
/** Largest --angle-tolerance accepted, in degrees (the design schema's limit too). */
const MAX_ANGLE_TOLERANCE = 10;

/** Parses `WxH` (also `W×H`, `W*H`, spaces allowed) into two positive sizes in mm. */
export function parseSheetArg(text: string): [number, number] {
  const m = /^\s*([^xX×*\s]+)\s*[xX×*]\s*([^xX×*\s]+)\s*$/.exec(text);
  if (!m) throw new CliError(`--sheet: "${text}" must be WIDTHxHEIGHT in mm, e.g. 600x400`);
  const w = parseNumber(m[1], '--sheet width');
  const h = parseNumber(m[2], '--sheet height');
  for (const [v, what] of [[w, 'width'], [h, 'height']] as const) {
    if (!(v > 0)) throw new CliError(`--sheet ${what}: ${v} must be greater than 0 mm`);
    if (v > MAX_COORDINATE) throw new CliError(`--sheet ${what}: ${v} may be at most ${MAX_COORDINATE} mm`);
  }
  return [w, h];
}

/** The audit options given on the command line; throws {@link CliError} on a bad value. */
export function parseAuditOptions(values: { sheet?: string; maxSheets?: string; angleTolerance?: string }): AuditOptions {
  const options: { -readonly [K in keyof AuditOptions]: AuditOptions[K] } = {};
  if (values.sheet !== undefined) options.sheet = parseSheetArg(values.sheet);
  if (values.maxSheets !== undefined) {
    const n = parseInteger(values.maxSheets, '--max-sheets', 1);
    if (n > MAX_SHEETS) throw new CliError(`--max-sheets: ${n} may be at most ${MAX_SHEETS}`);
    options.maxSheets = n;
  }
  if (values.angleTolerance !== undefined) {
    const deg = parseNumber(values.angleTolerance, '--angle-tolerance');
    if (!(deg > 0)) throw new CliError(`--angle-tolerance: ${deg} must be greater than 0 degrees (use a small value such as 0.01)`);
    if (deg > MAX_ANGLE_TOLERANCE) throw new CliError(`--angle-tolerance: ${deg} may be at most ${MAX_ANGLE_TOLERANCE} degrees`);
    options.angleToleranceDeg = deg;
  }
  return options;
}

async function readDesignFile(file: string): Promise<string> {
  let size: number;
  try {
    const s = await stat(file);
    if (!s.isFile()) throw new CliError(`${file}: not a file`);
    size = s.size;
  } catch (e) {
    if (e instanceof CliError) throw e;
    const code = (e as NodeJS.ErrnoException).code;
    throw new CliError(`${file}: ${code === 'ENOENT' ? 'no such file' : code === 'EACCES' ? 'permission denied' : 'cannot be read'}`);
  }
  if (size > MAX_DESIGN_BYTES + 3) throw new CliError(`${file}: larger than 2 MB (${size} bytes); designs are far smaller — check it is the right file`);
  try {
    return await readFile(file, 'utf8');
  } catch {
    throw new CliError(`${file}: cannot be read`);
  }
}

const pct = (x: number): string => `${Math.round(x * 100)}%`;

/** The readable form of a report: summary, joints by kind, findings. */
export function formatReport(title: string, report: FullAuditReport): string {
  const errors = report.findings.filter((f) => f.severity === 'error').length;
  const warnings = report.findings.filter((f) => f.severity === 'warning').length;
  const infos = report.findings.length - errors - warnings;
  const summaryRows: (string | number)[][] = [
    ['group', `${report.group} (order ${report.order})`],
    ['pieces', String(report.pieces)],
    ['templates', String(report.templates)],
    ['joints', `${report.summary.joints} (${report.summary.orthogonal} at 90°, ${report.summary.nonOrthogonal} not)`],
    ['components', String(report.components)],
  ];
  if (report.sheets) {
    const s = report.sheets;
    summaryRows.push(['sheets', `${s.count} of ${s.size[0]} × ${s.size[1]} mm, ${pct(s.utilization)} used`]);
  }
  const lines = [
    `${title} — ${report.ok ? 'OK: no errors' : `NOT OK: ${errors} error${errors === 1 ? '' : 's'}`}` +
      `, ${warnings} warning${warnings === 1 ? '' : 's'}, ${infos} note${infos === 1 ? '' : 's'}`,
    '',
    formatTable(['', ''], summaryRows).split('\n').slice(2).join('\n'),
    '',
    formatTable(['joint kind', 'count'], JOINT_KINDS.map((k) => [k, report.summary.byKind[k]])),
  ];
  if (report.findings.length > 0) {
    lines.push('', 'findings:');
    for (const f of report.findings) {
      const n = f.pieces.length;
      lines.push(`  ${f.severity.toUpperCase().padEnd(7)} ${f.code}${n ? ` (${n} piece${n === 1 ? '' : 's'})` : ''}`, `          ${f.message}`);
    }
  } else {
    lines.push('', 'findings: none');
  }
  return lines.join('\n');
}

/** Runs the audit command; see the file comment for the exit statuses. */
export async function run(args: string[], io: CliIo): Promise<number> {
  const parsed = parseArgs(args, { values: ['sheet', 'max-sheets', 'angle-tolerance'], booleans: ['json'], maxPositional: 1 });
  const file = parsed.positional[0];
  if (file === undefined || file === '') throw new CliError('a design FILE is required: audit FILE [--sheet WxH] [--max-sheets N] [--angle-tolerance DEG] [--json]');
  const options = parseAuditOptions({
    sheet: singleValue(parsed, 'sheet'),
    maxSheets: singleValue(parsed, 'max-sheets'),
    angleTolerance: singleValue(parsed, 'angle-tolerance'),
  });
  const text = await readDesignFile(file);
  const result = parseDesignText(text);
  if (!result.ok) {
    io.err(`${file} is not a valid design:\n${result.errors.map((e) => `  ${e.path || '(document)'}: ${e.message}`).join('\n')}`);
    return EXIT_INVALID;
  }
  const report = audit(result.design, options);
  if (parsed.booleans.has('json')) writeJson(io, report);
  else io.out(formatReport(result.design.title, report));
  return report.ok ? EXIT_OK : EXIT_FINDINGS;
}
