// The geometry commands of the command line (FORMAT.md §6): `planes` and `envelope`, and the
// contract every command keeps through main(): exit 0/1/2 exactly, `--json` prints only the JSON
// document, invalid input prints a message on stderr and nothing on stdout, never a stack trace.
// Solids checked here come from REFERENCES.md "Polyhedra" (CRC tables; Coxeter Table I; Wikipedia).
import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { type CommandEntry, main } from '../../server/cli/main.js';
import { CliError, type CliIo, formatTable, parseArgs } from '../../server/cli/io.js';

const execFileP = promisify(execFile);

interface Captured {
  code: number;
  out: string;
  err: string;
}

async function cli(args: string[], commands?: Record<string, CommandEntry>): Promise<Captured> {
  const out: string[] = [];
  const err: string[] = [];
  const io: CliIo = { out: (t) => out.push(t), err: (t) => err.push(t) };
  const code = await main(args, io, commands);
  return { code, out: out.join('\n'), err: err.join('\n') };
}

function expectInvalid(r: Captured, message: RegExp): void {
  expect(r.code).toBe(2);
  expect(r.out).toBe('');
  expect(r.err).toMatch(message);
  expect(r.err).not.toMatch(/\n\s+at /);
}

describe('planes command', () => {
  it('prints only the FORMAT.md §6 JSON with --json (I 5-, 3-, 2-fold: 2-5 120 as in FORMAT.md)', async () => {
    const r = await cli(['planes', '--group', 'I', '--family', '5', '--family', '3', '--family', '2', '--json']);
    expect(r.code).toBe(0);
    expect(r.err).toBe('');
    const doc = JSON.parse(r.out);
    expect(Object.keys(doc)).toEqual(['group', 'order', 'families', 'perpendicularPairs', 'pairsByFamily', 'components']);
    expect(doc.group).toBe('I');
    expect(doc.order).toBe(60);
    // Orbit sizes 12, 20, 30: International Tables Vol. A ch. 10.1.
    expect(doc.families).toEqual([
      { axis: 5, planes: 12 },
      { axis: 3, planes: 20 },
      { axis: 2, planes: 30 },
    ]);
    expect(doc.pairsByFamily['2-5']).toBe(120);
    expect(doc.components).toBe(1);
  });

  it('prints a readable table without --json', async () => {
    const r = await cli(['planes', '--group', 'O', '--family', '4']);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/group O \(order 24\)/);
    expect(r.out).toMatch(/4-fold\s+6/);
    expect(r.out).toMatch(/4-4\s+12/);
    expect(r.out).toMatch(/components.*: 1/);
  });

  it('accepts --flag=value', async () => {
    const r = await cli(['planes', '--group=T', '--family=2', '--json']);
    expect(JSON.parse(r.out).perpendicularPairs).toBe(12);
  });

  it.each([
    [['planes'], /--group is required/],
    [['planes', '--group', 'I'], /--family is required/],
    [['planes', '--group', 'X', '--family', '2'], /--group: unknown symmetry group "X"/],
    [['planes', '--group', 'I', '--family', '4'], /no 4-fold axis.*5, 3, 2/],
    [['planes', '--group', 'I', '--family', 'two'], /--family: "two" is not a whole number/],
    [['planes', '--group', 'I', '--family', '2', '--family', '2'], /listed twice/],
    [['planes', '--group', 'I', '--group', 'O', '--family', '2'], /--group may be given only once/],
    [['planes', '--group', 'I', '--family'], /--family needs a value/],
    [['planes', '--group', 'I', '--family', '2', '--colour', 'red'], /unknown option --colour/],
    [['planes', '--group', 'I', '--family', '2', 'extra'], /unexpected argument "extra"/],
    [['planes', '--group', 'I', '--family', '2', '--json=yes'], /--json takes no value/],
  ])('rejects %j with exit 2 and a message', async (args, message) => {
    expectInvalid(await cli(args as string[]), message);
  });
});

describe('envelope command', () => {
  it('prints only the JSON: the regular dodecahedron from I 5-fold, 20/30/12, 116.565° (CRC tables)', async () => {
    const r = await cli(['envelope', '--group', 'I', '--family', '5:120', '--json']);
    expect(r.code).toBe(0);
    expect(r.err).toBe('');
    expect(JSON.parse(r.out)).toEqual({ vertices: 20, edges: 30, faces: 12, faceSides: { 5: 12 }, dihedralDeg: [116.565] });
  });

  it('the truncated icosahedron from I 5-fold and 3-fold at its ratio: 60/90/32, 138.19° and 142.623° (Wikipedia)', async () => {
    // Inradii of the truncated icosahedron with edge 2: pentagons 4.3528…·…; the ratio d3/d5 is
    // computed here from its vertex (1, 2 + φ, 2φ) (Wikipedia coordinates, orientation with 5-fold
    // axes through (0, ±1, ±3φ)): d5 = v·(0,1,φ)/|…| maximised over the vertex set.
    const phi = (1 + Math.sqrt(5)) / 2;
    const even = (p: number[]) => [p, [p[2], p[0], p[1]], [p[1], p[2], p[0]]];
    const signsOf = (p: number[]) =>
      [0, 1, 2, 3, 4, 5, 6, 7].map((m) => p.map((x, k) => ((m >> k) & 1 ? -x : x)));
    const pts = [[0, 1, 3 * phi], [1, 2 + phi, 2 * phi], [phi, 2, phi ** 3]].flatMap(even).flatMap(signsOf);
    const support = (n: number[]) => Math.max(...pts.map((p) => (p[0] * n[0] + p[1] * n[1] + p[2] * n[2]) / Math.hypot(...n)));
    const d5 = support([0, 1, phi]);
    const d3 = support([1, 1, 1]);
    const r = await cli(['envelope', '--group', 'I', '--family', `5:${d5}`, '--family', `3:${d3}`, '--json']);
    expect(r.code).toBe(0);
    expect(JSON.parse(r.out)).toEqual({ vertices: 60, edges: 90, faces: 32, faceSides: { 5: 12, 6: 20 }, dihedralDeg: [138.19, 142.623] });
  });

  it('prints a readable table without --json', async () => {
    const r = await cli(['envelope', '--group', 'O', '--family', '4:10']);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/vertices 8, edges 12, faces 6/);
    expect(r.out).toMatch(/4-fold\s+10\s+6/);
    expect(r.out).toMatch(/dihedral angles \(°\): 90\.000/);
  });

  it.each([
    [['envelope', '--group', 'Q', '--family', '2:10'], /unknown symmetry group "Q"/],
    [['envelope', '--group', 'O', '--family', '5:10'], /no 5-fold axis/],
    [['envelope', '--group', 'O', '--family', '4'], /give FOLD:OFFSET/],
    [['envelope', '--group', 'O', '--family', '4:'], /offset is missing/],
    [['envelope', '--group', 'O', '--family', '4:-3'], /must not be negative/],
    [['envelope', '--group', 'O', '--family', '4:abc'], /"abc" is not a number/],
    [['envelope', '--group', 'O', '--family', '4:NaN'], /"NaN" is not a number/],
    [['envelope', '--group', 'O', '--family', '4:Infinity'], /not a number/],
    [['envelope', '--group', 'O', '--family', '4:1e999'], /out of range/],
    [['envelope', '--group', 'O', '--family', '4:0'], /through the centre/],
    [['envelope', '--group', 'D5', '--family', '5:10'], /does not enclose a solid: add a family/],
    [['envelope', '--group', 'C3', '--family', '3:10', '--family', '3:20'], /do not enclose a solid/],
    [['envelope', '--group', 'O'], /--family is required/],
  ])('rejects %j with exit 2 and a message', async (args, message) => {
    expectInvalid(await cli(args as string[]), message);
  });
});

describe('main', () => {
  it('with no command prints the usage on stderr and exits 2', async () => {
    expectInvalid(await cli([]), /no command given[\s\S]*usage:/);
  });

  it('with an unknown command prints the usage on stderr and exits 2', async () => {
    expectInvalid(await cli(['cut']), /unknown command "cut"[\s\S]*planes/);
    expectInvalid(await cli(['__proto__']), /unknown command/);
    expectInvalid(await cli(['toString']), /unknown command/);
  });

  it('help prints the usage on stdout and exits 0', async () => {
    const r = await cli(['help']);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/envelope --group G --family FOLD:OFFSET/);
  });

  const fake = (run: (args: string[], io: CliIo) => Promise<number>): Record<string, CommandEntry> => ({
    fake: { summary: 'fake', load: async () => ({ run }) },
  });

  it('when a module fails to load, says the command is not available and exits 2', async () => {
    const r = await cli(['broken'], { broken: { summary: 'broken', load: () => Promise.reject(new Error('Cannot find module ./broken.js\n    at x')) } });
    expectInvalid(r, /the broken command is not available: its module could not be loaded \(Cannot find module \.\/broken\.js\)/);
  });

  it('when a module exports no run(), exits 2', async () => {
    expectInvalid(await cli(['odd'], { odd: { summary: 'odd', load: async () => ({}) } }), /exports no run/);
  });

  it('when a command throws unexpectedly, prints one line and no stack, exits 2, and drops what it printed', async () => {
    const r = await cli(['fake'], fake(async (_a, io) => {
      io.out('partial output');
      throw new TypeError('cannot read properties of undefined\n    at somewhere (file.ts:1:1)');
    }));
    expectInvalid(r, /^fake: unexpected failure: cannot read properties of undefined$/);
  });

  it('when a command throws CliError after printing, stdout stays empty', async () => {
    const r = await cli(['fake'], fake(async (_a, io) => {
      io.out('{"half": ');
      throw new CliError('--thing: bad');
    }));
    expectInvalid(r, /^fake: --thing: bad$/);
  });

  it('passes exit 1 through with its output, and maps an unknown status to 2', async () => {
    const one = await cli(['fake'], fake(async (_a, io) => (io.out('{"ok": false}'), 1)));
    expect(one).toEqual({ code: 1, out: '{"ok": false}', err: '' });
    expectInvalid(await cli(['fake'], fake(async () => 7)), /unknown status 7/);
    expectInvalid(await cli(['fake'], fake(async () => Number.NaN)), /unknown status/);
  });

  it('when a command throws something that is not an Error, still prints one line', async () => {
    expectInvalid(await cli(['fake'], fake(async () => Promise.reject('plain string'))), /fake: unexpected failure: plain string/);
  });

  describe('fuzzed argument vectors (fast-check)', () => {
    const token = fc.oneof(
      fc.constantFrom('--group', '--family', '--json', '--', '-', '--x', '--group=', '--family=2:3', ''),
      fc.constantFrom('I', 'O', 'T', 'D2', 'D7', 'D120', 'C1', 'C120', 'Q', 'I2'),
      fc.constantFrom('2', '3', '4', '5', '7', '0', '-1', '2:10', '5:0.5', '3:-2', '4:1e308', '2:abc', ':', '5:', ':5', '3:1e-9', '2:0x10'),
      fc.string({ maxLength: 8 }),
      fc.double().map(String),
      fc.integer({ min: -10, max: 200 }).map((n) => `${n}:${Math.abs(n) + 1}`),
    );
    const argv = fc.tuple(fc.constantFrom('planes', 'envelope', 'nope', 'help', ''), fc.array(token, { maxLength: 10 })).map(([c, rest]) => [c, ...rest]);

    it('always exits 0, 1 or 2, prints no stack trace, writes nothing to stdout on 2, and finishes', async () => {
      await fc.assert(
        fc.asyncProperty(argv, async (args) => {
          let timer: ReturnType<typeof setTimeout> | undefined;
          const hang = new Promise<never>((_, reject) => {
            timer = setTimeout(() => reject(new Error(`hung on ${JSON.stringify(args)}`)), 10_000);
          });
          const r = await Promise.race([cli(args), hang]).finally(() => clearTimeout(timer));
          expect([0, 1, 2]).toContain(r.code);
          expect(r.err).not.toMatch(/\n\s+at /);
          expect(r.err).not.toMatch(/unexpected failure/);
          if (r.code === 2) {
            expect(r.out).toBe('');
            expect(r.err.length).toBeGreaterThan(0);
          }
          if (r.code === 0 && args.includes('--json') && args[0] !== 'help') expect(() => JSON.parse(r.out)).not.toThrow();
        }),
        { numRuns: 300 },
      );
    });
  });
});

describe('cli/io', () => {
  it('parseArgs collects repeated flags in order and stops at --', () => {
    const p = parseArgs(['--family', '2', '--family=3', '--json', '--', '--family'], { values: ['family'], booleans: ['json'], maxPositional: 1 });
    expect(p.values.get('family')).toEqual(['2', '3']);
    expect(p.booleans.has('json')).toBe(true);
    expect(p.positional).toEqual(['--family']);
  });

  it('formatTable pads columns and right-aligns numbers', () => {
    expect(formatTable(['name', 'n'], [['a', 5], ['bbb', 12]])).toBe('name   n\n----  --\na      5\nbbb   12');
  });
});

describe('the real process (npm run cli runs this file under tsx)', () => {
  const tsx = ['node_modules/.bin/tsx', ['--tsconfig', 'tsconfig.server.json', 'server/cli/main.ts']] as const;
  const runReal = async (args: string[]) => {
    try {
      const { stdout, stderr } = await execFileP(tsx[0], [...tsx[1], ...args], { timeout: 60_000 });
      return { code: 0, out: stdout, err: stderr };
    } catch (e) {
      const x = e as { code?: number; stdout?: string; stderr?: string };
      return { code: x.code ?? -1, out: x.stdout ?? '', err: x.stderr ?? '' };
    }
  };

  it('exits 0 with only JSON on stdout', async () => {
    const r = await runReal(['envelope', '--group', 'O', '--family', '3:10', '--json']);
    expect(r.code).toBe(0);
    expect(r.err).toBe('');
    // Octahedron 6/12/8, arccos(−1/3) = 109.4712206° (CRC tables).
    expect(JSON.parse(r.out)).toEqual({ vertices: 6, edges: 12, faces: 8, faceSides: { 3: 8 }, dihedralDeg: [109.471] });
  });

  it('exits 2 with a message on stderr and nothing on stdout', async () => {
    const r = await runReal(['planes', '--group', 'I', '--family', '4', '--json']);
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err).toMatch(/^planes: --family 4: group I has no 4-fold axis \(it has 5, 3, 2\)\n$/);
  });
});
