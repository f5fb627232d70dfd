// The `audit` command (FORMAT.md §6): exit statuses, JSON only on stdout, messages naming the
// field on stderr, and a fuzz of the argument list.
import { execFile } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { main } from '../../server/cli/main.js';
import { parseSheetArg } from '../../server/cli/audit.js';
import { audit } from '../../shared/engine/audit.js';
import { parseDesign } from '../../shared/engine/design.js';

const dir = mkdtempSync(join(tmpdir(), 'planewright-cli-audit-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const cube = {
  format: 'planewright/design@1',
  title: 'Cube check',
  symmetry: 'O',
  material: { name: 'Birch plywood', thickness: 3, kerf: 0.15 },
  families: [{ id: 'face', axis: 4, offset: 50 }],
  motifs: [{ id: 'sq', family: 'face', outline: [[-50, -50], [50, -50], [50, 50], [-50, 50]] }],
};
const apart = { ...cube, families: [{ id: 'face', axis: 4, offset: 80 }] };
const invalid = { ...cube, families: [{ id: 'face', axis: 7, offset: 50 }] };

const file = (name: string, content: unknown): string => {
  const p = join(dir, name);
  writeFileSync(p, typeof content === 'string' ? content : JSON.stringify(content));
  return p;
};
const cubeFile = file('cube.json', cube);
const apartFile = file('apart.json', apart);
const invalidFile = file('invalid.json', invalid);
const brokenFile = file('broken.json', '{ "format": ');

async function runCli(argv: string[]): Promise<{ code: number; out: string; err: string }> {
  const out: string[] = [];
  const err: string[] = [];
  const code = await main(argv, { out: (t) => out.push(t), err: (t) => err.push(t) });
  return { code, out: out.join('\n'), err: err.join('\n') };
}

describe('audit command', () => {
  it('when the design has no error: exit 0 and the report as the only JSON on stdout', async () => {
    const r = await runCli(['audit', cubeFile, '--json']);
    expect(r.code).toBe(0);
    const parsed = parseDesign(cube);
    expect(parsed.ok).toBe(true);
    if (parsed.ok) expect(JSON.parse(r.out)).toEqual(JSON.parse(JSON.stringify(audit(parsed.design))));
    expect(r.err).toBe('');
  });

  it('when the design has error findings: exit 1', async () => {
    // Faces at offset 80 with 100 mm squares stop 30 mm short of each other: 6 loose pieces.
    const r = await runCli(['audit', apartFile, '--json']);
    expect(r.code).toBe(1);
    expect(JSON.parse(r.out).findings[0].code).toBe('disconnected');
  });

  it('prints a readable table without --json', async () => {
    const r = await runCli(['audit', apartFile]);
    expect(r.code).toBe(1);
    expect(r.out).toContain('NOT OK');
    expect(r.out).toMatch(/corner\s+0/);
    expect(r.out).toContain('ERROR   disconnected');
  });

  it('when the design is invalid: exit 2, the field path on stderr, nothing on stdout', async () => {
    const r = await runCli(['audit', invalidFile, '--json']);
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err).toContain('families[0].axis');
  });

  it('when the file is not JSON, missing, or the options are bad: exit 2 with a message', async () => {
    for (const argv of [
      ['audit', brokenFile],
      ['audit', join(dir, 'nope.json')],
      ['audit'],
      ['audit', cubeFile, '--sheet', '600'],
      ['audit', cubeFile, '--sheet', '0x400'],
      ['audit', cubeFile, '--max-sheets', '0'],
      ['audit', cubeFile, '--angle-tolerance', 'abc'],
      ['audit', cubeFile, '--angle-tolerance', '-1'],
      ['audit', cubeFile, '--colour'],
      ['audit', cubeFile, cubeFile],
    ]) {
      const r = await runCli(argv);
      expect(r.code, argv.join(' ')).toBe(2);
      expect(r.out, argv.join(' ')).toBe('');
      expect(r.err.length, argv.join(' ')).toBeGreaterThan(0);
    }
  });

  it('uses --sheet and --max-sheets over the file', async () => {
    const r = await runCli(['audit', cubeFile, '--sheet', '120x120', '--max-sheets', '1', '--json']);
    const report = JSON.parse(r.out);
    expect(report.sheets.size).toEqual([120, 120]);
    // Six 100 mm squares (plus gaps) cannot share one 120 × 120 sheet.
    expect(report.findings.map((f: { code: string }) => f.code)).toContain('sheet-limit-exceeded');
    expect(r.code).toBe(1);
  });

  it('never throws and keeps its exit-status promise for any argument list (fuzz)', async () => {
    const token = fc.oneof(
      fc.constantFrom('--json', '--sheet', '--max-sheets', '--angle-tolerance', '--', '-', '--sheet=600x400', '--bogus', cubeFile, apartFile, invalidFile),
      fc.constantFrom('600x400', '1e9x1', 'NaNxNaN', '3', '0.5', '-2', '1000', '1001', 'x', ''),
      fc.string({ maxLength: 8 }),
    );
    await fc.assert(
      fc.asyncProperty(fc.array(token, { maxLength: 6 }), async (rest) => {
        const r = await runCli(['audit', ...rest]);
        expect([0, 1, 2]).toContain(r.code);
        if (r.code === 2) {
          expect(r.out).toBe('');
          expect(r.err.length).toBeGreaterThan(0);
        } else if (rest.includes('--json')) {
          expect(() => JSON.parse(r.out)).not.toThrow();
        }
      }),
      { numRuns: 60 },
    );
  });
});

describe('parseSheetArg', () => {
  it('reads W×H in its spellings and refuses the rest', () => {
    expect(parseSheetArg('600x400')).toEqual([600, 400]);
    expect(parseSheetArg(' 841 × 594.5 ')).toEqual([841, 594.5]);
    expect(() => parseSheetArg('600')).toThrow(/WIDTHxHEIGHT/);
    expect(() => parseSheetArg('600x-1')).toThrow();
    expect(() => parseSheetArg('20000x100')).toThrow(/at most/);
  });
});

describe('audit command in a real process', () => {
  it('runs through npx tsx and prints the JSON report of a fixture', async () => {
    const run = promisify(execFile);
    const { stdout } = await run(
      'npx',
      ['tsx', '--tsconfig', 'tsconfig.server.json', 'server/cli/main.ts', 'audit', 'tests/fixtures/designs/o-cube-plates.json', '--json'],
      { cwd: process.cwd(), timeout: 60_000 },
    );
    const report = JSON.parse(stdout);
    expect(report.pieces).toBe(6);
    expect(report.summary.byKind.corner).toBe(12);
    expect(report.ok).toBe(true);
  }, 60_000);
});
