import { type RefObject, useCallback } from 'react';
import type { MarkerPoint } from './pin-markers.js';

/**
 * The DOM half of the pin markers, laid over the canvas: one button per pin (its number in a
 * shape: a round head while open, a square with a tick once resolved, dashed when outdated), a
 * faint ring for each copy of an orbit pin and a dashed diamond for the pin being placed.
 * {@link MarkerProjector} moves them; until it has, they stay hidden.
 */
export function PinMarkerLayer({
  points,
  registry,
  selected,
  onSelect,
  passThrough = false,
}: {
  points: readonly MarkerPoint[];
  registry: RefObject<Map<string, HTMLElement>>;
  selected: string | null;
  onSelect(key: string): void;
  /** While a pin is being placed, clicks go through the markers to the pieces behind them. */
  passThrough?: boolean;
}) {
  const register = useCallback(
    (key: string) => (el: HTMLElement | null) => {
      const map = registry.current;
      if (!map) return;
      if (el) map.set(key, el);
      else map.delete(key);
    },
    [registry],
  );
  return (
    <div className="pointer-events-none absolute inset-0 overflow-hidden" data-testid="pin-markers">
      {points.map((p) => (
        <div
          key={p.key}
          ref={register(p.key)}
          className={`absolute left-0 top-0 h-0 w-0 [&[data-away]]:opacity-60 [&[data-cut]]:opacity-45 ${p.kind === 'copy' ? '' : p.pin && selected === p.pin.key ? 'z-30' : p.kind === 'draft' ? 'z-20' : 'z-10'}`}
          style={{ visibility: 'hidden' }}
        >
          {p.kind === 'copy' ? (
            <span aria-hidden="true" className="absolute -left-1.5 -top-1.5 block size-3 rounded-full border-2 border-accent/60 bg-paper-raised/40" />
          ) : p.kind === 'draft' ? (
            <span
              aria-hidden="true"
              data-testid="draft-marker"
              className="absolute -left-2.5 -top-2.5 block size-5 rotate-45 border-2 border-dashed border-ink bg-paper-raised/90"
            />
          ) : p.pin ? (
            <button
              type="button"
              data-pin-marker={p.pin.key}
              data-state={p.pin.resolved ? 'resolved' : 'open'}
              aria-pressed={selected === p.pin.key}
              aria-label={p.pin.label}
              title={p.pin.label}
              onClick={() => onSelect(p.pin!.key)}
              className={[
                passThrough ? 'pointer-events-none' : 'pointer-events-auto',
                'absolute flex -translate-x-1/2 -translate-y-1/2 items-center justify-center gap-0.5 border-2 font-mono text-xs font-semibold leading-none shadow-sm',
                'focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-ink',
                p.pin.resolved ? 'h-6 min-w-6 rounded-[3px] border-ink-soft bg-paper-raised px-1 text-ink' : 'size-7 rounded-full border-paper-raised bg-accent text-white',
                p.pin.outdated ? 'border-dashed' : '',
                selected === p.pin.key ? 'scale-125 ring-2 ring-ink ring-offset-1 ring-offset-paper-raised' : '',
              ].join(' ')}
            >
              {p.pin.resolved ? <span aria-hidden="true">✓</span> : null}
              {p.pin.number}
            </button>
          ) : null}
        </div>
      ))}
    </div>
  );
}
