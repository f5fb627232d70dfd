// Worker entry for the audit pool: workers start as plain Node (vitest, node --import tsx alike),
// so register tsx's loader here, then load the TypeScript task.
import { register } from 'tsx/esm/api';

register();
const { default: runAudit } = await import('./worker.ts');

export default runAudit;
