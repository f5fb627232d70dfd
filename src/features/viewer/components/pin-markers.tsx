import { useFrame, useThree } from '@react-three/fiber';
import { type RefObject, useEffect, useMemo } from 'react';
import { type Plane, Vector3 } from 'three';
import type { Vec3 } from '../../../../shared/engine/vec.js';

/** A pin as the viewer draws it: where it is anchored and how it reads. */
export interface ViewerPin {
  /** Stable key (the pin's id as text). */
  readonly key: string;
  readonly number: number;
  readonly anchor: { readonly piece: string; readonly point: readonly [number, number]; readonly side: 1 | -1 };
  readonly scope: 'piece' | 'orbit';
  readonly resolved: boolean;
  readonly outdated: boolean;
  /** What the marker is announced as ("Pin 3: open, Structure, on rib-03"). */
  readonly label: string;
}

/** One projected point: a pin's own marker, a faint copy on another piece of its orbit, or the pin being placed. */
export interface MarkerPoint {
  readonly key: string;
  readonly kind: 'pin' | 'copy' | 'draft';
  readonly position: Vec3;
  readonly pin?: ViewerPin;
}

/**
 * Moves each marker's DOM element (registered under its key) to the screen position of its world
 * point, every frame the canvas draws. Markers behind the camera are hidden; markers in the part
 * the cutting plane removes are marked `data-cut` (drawn paler, still readable and clickable).
 * Only refs and styles are touched here, never React state.
 */
export function MarkerProjector({ points, registry, clip }: { points: readonly MarkerPoint[]; registry: RefObject<Map<string, HTMLElement>>; clip: Plane | null }) {
  const camera = useThree((s) => s.camera);
  const size = useThree((s) => s.size);
  const invalidate = useThree((s) => s.invalidate);
  const v = useMemo(() => new Vector3(), []);
  useEffect(() => invalidate(), [points, clip, invalidate]);
  useFrame(() => {
    const map = registry.current;
    if (!map) return;
    for (const p of points) {
      const el = map.get(p.key);
      if (!el) continue;
      v.set(p.position[0], p.position[1], p.position[2]);
      const cut = clip !== null && clip.distanceToPoint(v) < 0;
      v.project(camera);
      const visible = v.z > -1 && v.z < 1;
      el.style.visibility = visible ? 'visible' : 'hidden';
      el.style.transform = `translate(${((v.x + 1) / 2) * size.width}px, ${((1 - v.y) / 2) * size.height}px)`;
      if (cut) el.setAttribute('data-cut', '');
      else el.removeAttribute('data-cut');
    }
  });
  return null;
}
