// `npm test`: install if needed, make sure Chromium is there for the browser tests, then
// typecheck, lint, build the client and run every vitest project (unit, api, browser).
// Extra arguments go to vitest, e.g. `npm test -- tests/engine/groups.test.ts`.
import { existsSync, mkdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { bin, ensureClientBuilt, ensureInstalled, log, root, run, runOrExit } from './lib.mjs';

const started = Date.now();
ensureInstalled();
ensureChromium();

const extra = process.argv.slice(2);
if (extra.length === 0) {
  log('typecheck (tsc -b)…');
  runOrExit(bin('tsc'), ['-b']);
  log('lint (eslint)…');
  runOrExit(bin('eslint'), ['.', '--max-warnings', '0']);
}
ensureClientBuilt({ force: true });

mkdirSync(join(root, '.tmp'), { recursive: true });
const resultsFile = join(root, '.tmp', 'vitest-results.json');
log('tests (vitest: unit, api, browser)…');
const status = run(bin('vitest'), ['run', '--reporter=default', '--reporter=json', `--outputFile.json=${resultsFile}`, ...extra]);

if (existsSync(resultsFile)) {
  const r = JSON.parse(readFileSync(resultsFile, 'utf8'));
  const skipped = (r.numPendingTests ?? 0) + (r.numTodoTests ?? 0);
  log(`finished in ${Math.round((Date.now() - started) / 1000)} s`);
  process.stdout.write(`tests: ${r.numPassedTests} passed, ${r.numFailedTests} failed${skipped ? `, ${skipped} skipped` : ''}\n`);
}
process.exit(status);

function ensureChromium() {
  const path = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
  if (existsSync(path)) return;
  const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;
  if (isRoot && existsSync('/usr/bin/apt-get')) {
    log('installing Debian chromium for the browser tests (apt-get)…');
    runOrExit('apt-get', ['update', '-qq']);
    runOrExit('apt-get', ['install', '-y', '-qq', 'chromium'], { env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } });
    return;
  }
  log(
    `the browser tests need Chromium at ${path}. On Debian or Ubuntu run: sudo apt-get update && sudo apt-get install -y chromium ` +
      '(or set CHROMIUM_PATH to a Chromium binary), then run npm test again.',
  );
  process.exit(1);
}
