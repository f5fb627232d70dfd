// Property tests run from one fixed seed, so a CI run is repeatable and a failure can be replayed
// as it happened. To explore new cases, run with FC_SEED=random (or FC_SEED=<number> to replay
// the seed a failure printed), e.g. `FC_SEED=random npx vitest run tests/engine`.
import fc from 'fast-check';

const FIXED_SEED = 20261202;
const raw = process.env.FC_SEED;
if (raw !== 'random') {
  const seed = raw === undefined || raw === '' ? FIXED_SEED : Number(raw);
  if (!Number.isInteger(seed)) throw new Error(`FC_SEED must be an integer or "random", not ${JSON.stringify(raw)}`);
  fc.configureGlobal({ seed });
}
