import { InitialSchema1764633600000 } from './1764633600000-initial-schema.js';
import { StudioWorkflow1764806400000 } from './1764806400000-studio-workflow.js';
import { Critique1765065600000 } from './1765065600000-critique.js';

/** Every migration in order; `openDatabase` runs the pending ones at start. */
export const MIGRATIONS = [InitialSchema1764633600000, StudioWorkflow1764806400000, Critique1765065600000];
