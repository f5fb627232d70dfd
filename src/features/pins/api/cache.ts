import type { QueryClient } from '@tanstack/react-query';
import type { Pin, RevisionPins } from '../../../../shared/api/critique.js';
import { pinKeys } from './keys.js';

/** Puts `pin` into the cached list of its revision: replacing the one with `replaces` (or its own id), else appending. */
export function putPinInCache(queryClient: QueryClient, revisionId: number, pin: Pin, replaces: number = pin.id): void {
  queryClient.setQueryData<RevisionPins>(pinKeys.list(revisionId), (data) => {
    if (!data) return data;
    const at = data.pins.findIndex((p) => p.id === replaces || p.id === pin.id);
    const pins = at < 0 ? [...data.pins, pin] : data.pins.map((p, i) => (i === at ? pin : p)).filter((p, i) => i === at || p.id !== pin.id);
    return { ...data, pins };
  });
}

/** Changes one cached pin in place (no-op when the list or the pin is not cached). */
export function patchPinInCache(queryClient: QueryClient, revisionId: number, pinId: number, change: (pin: Pin) => Pin): void {
  queryClient.setQueryData<RevisionPins>(pinKeys.list(revisionId), (data) => (data ? { ...data, pins: data.pins.map((p) => (p.id === pinId ? change(p) : p)) } : data));
}
