import { ForbiddenError, UnauthenticatedError } from '../http/errors.js';
import { decide, type Action, type Actor, type Resource } from './policy.js';

/** Throws 401/403 with the policy's message unless `actor` may perform `action`. */
export function assertCan(actor: Actor | null, action: Action, resource?: Resource): void {
  const d = decide(actor, action, resource);
  if (d.allowed) return;
  throw d.status === 401 ? new UnauthenticatedError(d.message) : new ForbiddenError(d.message);
}
