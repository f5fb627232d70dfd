import { InitialSchema1764633600000 } from './1764633600000-initial-schema.js';

/** Every migration in order; `openDatabase` runs the pending ones at start. */
export const MIGRATIONS = [InitialSchema1764633600000];
