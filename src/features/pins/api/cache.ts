import type { QueryClient } from '@tanstack/react-query';
import type { Pin, RevisionPins } from '../../../../shared/api/critique.js';
import { pinKeys } from './keys.js';

let localEdits = 0;

/**
 * The list after a change made here rather than fetched: it gets a version of its own, so the
 * list's structural sharing (which keeps the cached answer while the server's `version` stays
 * the same) takes it, and the next answer from the server replaces it.
 */
export function withLocalChange(data: RevisionPins, pins: Pin[]): RevisionPins {
  localEdits += 1;
  return { ...data, pins, version: `${data.version.split('~')[0]}~local-${localEdits}` };
}

/** Changes the cached pins of a revision (no-op when the list is not cached). */
export function editCachedPins(queryClient: QueryClient, revisionId: number, edit: (pins: Pin[]) => Pin[]): void {
  queryClient.setQueryData<RevisionPins>(pinKeys.list(revisionId), (data) => (data ? withLocalChange(data, edit(data.pins)) : data));
}

/** Puts `pin` into the cached list of its revision: replacing the one with `replaces` (or its own id), else appending. */
export function putPinInCache(queryClient: QueryClient, revisionId: number, pin: Pin, replaces: number = pin.id): void {
  editCachedPins(queryClient, revisionId, (pins) => {
    const at = pins.findIndex((p) => p.id === replaces || p.id === pin.id);
    if (at < 0) return [...pins, pin];
    // Drop a second copy when a poll already brought the server's pin in.
    return pins.map((p, i) => (i === at ? pin : p)).filter((p, i) => i === at || p.id !== pin.id);
  });
}

/** Changes one cached pin in place (no-op when the list or the pin is not cached). */
export function patchPinInCache(queryClient: QueryClient, revisionId: number, pinId: number, change: (pin: Pin) => Pin): void {
  editCachedPins(queryClient, revisionId, (pins) => pins.map((p) => (p.id === pinId ? change(p) : p)));
}
