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
  /** Outward normal of the face the marker sits on: a marker facing away from the camera is drawn paler. */
  readonly facing: Vec3;
  readonly pin?: ViewerPin;
}

/** Screen distance (px) under which two pin markers would hide each other; the later one moves aside. */
const CROWDED_PX = 20;
/** How far (px) a crowded marker moves right: about one marker wide. */
const ASIDE_PX = 30;

/**
 * Moves each marker's DOM element (registered under its key) to the screen position of its world
 * point, every frame the canvas draws. Markers behind the camera are hidden; markers in the part
 * the cutting plane removes are marked `data-cut` and those on a face turned away from the camera
 * `data-away` (both drawn paler, still readable and clickable). A pin marker that would land on
 * one drawn before it is moved aside so both numbers stay readable. Only refs and styles are
 * touched here, never React state.
 */
export function MarkerProjector({ points, registry, clip }: { points: readonly MarkerPoint[]; registry: RefObject<Map<string, HTMLElement>>; clip: Plane | null }) {
  const camera = useThree((s) => s.camera);
  const size = useThree((s) => s.size);
  const invalidate = useThree((s) => s.invalidate);
  const v = useMemo(() => new Vector3(), []);
  const placed = useMemo<number[]>(() => [], []);
  useEffect(() => invalidate(), [points, clip, invalidate]);
  useFrame(() => {
    const map = registry.current;
    if (!map) return;
    placed.length = 0;
    for (const p of points) {
      const el = map.get(p.key);
      if (!el) continue;
      v.set(p.position[0], p.position[1], p.position[2]);
      const cut = clip !== null && clip.distanceToPoint(v) < 0;
      const away =
        (camera.position.x - v.x) * p.facing[0] + (camera.position.y - v.y) * p.facing[1] + (camera.position.z - v.z) * p.facing[2] < 0;
      v.project(camera);
      const visible = v.z > -1 && v.z < 1;
      let x = ((v.x + 1) / 2) * size.width;
      const y = ((1 - v.y) / 2) * size.height;
      if (p.kind !== 'copy' && visible) {
        for (let i = 0; i < placed.length; i += 2) {
          if (Math.abs(placed[i] - x) < CROWDED_PX && Math.abs(placed[i + 1] - y) < CROWDED_PX) {
            x = placed[i] + ASIDE_PX;
            i = -2; // check the new place against every marker again
          }
        }
        placed.push(x, y);
      }
      el.style.visibility = visible ? 'visible' : 'hidden';
      el.style.transform = `translate(${x}px, ${y}px)`;
      el.toggleAttribute('data-cut', cut);
      el.toggleAttribute('data-away', away);
    }
  });
  return null;
}
