import { useThree, type ThreeEvent } from '@react-three/fiber';
import { useLayoutEffect, useMemo, useRef } from 'react';
import { BufferAttribute, BufferGeometry, Color, DoubleSide, type InstancedMesh, Matrix4, MeshStandardMaterial, type Plane } from 'three';
import type { SceneMesh } from '../../../../shared/engine/scene.js';
import type { Vec3 } from '../../../../shared/engine/vec.js';
import { DIM_TOWARDS_PAPER, HOVER, PAPER, SELECTED, familyColour, groupColour } from '../palette.js';

export interface PieceInstancesProps {
  mesh: SceneMesh;
  /** Exploded-view push, in millimetres, along each piece's centroid direction. */
  explode: number;
  /** The cutting plane (the side its normal points to is cut away), or null. */
  clip: Plane | null;
  hovered: string | null;
  selected: string | null;
  /** The pieces of the finding shown on the model (all others are dimmed), or null. */
  highlight: ReadonlySet<string> | null;
  /** Rank of each piece's connected group when colouring by group, else null (family colours). */
  groupOf: ReadonlyMap<string, number> | null;
  onHover(piece: string | null): void;
  /** A click on a piece, with the world point it hit (on the drawn, possibly exploded slab). */
  onSelect(piece: string, point: Vec3): void;
}

/** One template's slab drawn once for all its pieces (one draw call). */
export function PieceInstances({ mesh, explode, clip, hovered, selected, highlight, groupOf, onHover, onSelect }: PieceInstancesProps) {
  const ref = useRef<InstancedMesh>(null);
  const invalidate = useThree((s) => s.invalidate);
  const geometry = useMemo(() => {
    const g = new BufferGeometry();
    g.setAttribute('position', new BufferAttribute(mesh.geometry.positions, 3));
    g.setAttribute('normal', new BufferAttribute(mesh.geometry.normals, 3));
    g.setIndex(new BufferAttribute(mesh.geometry.indices, 1));
    g.computeBoundingSphere();
    return g;
  }, [mesh]);
  // Both sides are drawn so a cut slab shows its inside instead of vanishing.
  const material = useMemo(() => new MeshStandardMaterial({ roughness: 0.85, metalness: 0, side: DoubleSide }), []);
  useLayoutEffect(() => {
    material.clippingPlanes = clip ? [clip] : [];
    material.needsUpdate = true;
    invalidate();
  }, [material, clip, invalidate]);
  useLayoutEffect(() => () => geometry.dispose(), [geometry]);
  useLayoutEffect(() => () => material.dispose(), [material]);
  // Scratch objects, allocated once per mesh component.
  const scratch = useMemo(() => ({ m: new Matrix4(), t: new Matrix4(), c: new Color(), hover: new Color(HOVER), paper: new Color(PAPER) }), []);
  useLayoutEffect(() => {
    const im = ref.current;
    if (!im) return;
    const { m, t } = scratch;
    mesh.instances.forEach((inst, i) => {
      m.fromArray(inst.matrix);
      const p = inst.explode;
      t.makeTranslation(p[0] * explode, p[1] * explode, p[2] * explode);
      m.premultiply(t);
      im.setMatrixAt(i, m);
    });
    im.instanceMatrix.needsUpdate = true;
    im.computeBoundingSphere();
    im.computeBoundingBox();
    invalidate();
  }, [mesh, explode, scratch, invalidate]);

  useLayoutEffect(() => {
    const im = ref.current;
    if (!im) return;
    const { c, hover, paper } = scratch;
    mesh.instances.forEach((inst, i) => {
      const base = groupOf ? groupColour(groupOf.get(inst.piece) ?? 0) : familyColour(inst.family);
      c.set(inst.piece === selected ? SELECTED : base);
      if (highlight && !highlight.has(inst.piece) && inst.piece !== selected) c.lerp(paper, DIM_TOWARDS_PAPER);
      if (inst.piece === hovered && inst.piece !== selected) c.lerp(hover, 0.55);
      im.setColorAt(i, c);
    });
    if (im.instanceColor) im.instanceColor.needsUpdate = true;
    invalidate();
  }, [mesh, hovered, selected, highlight, groupOf, scratch, invalidate]);

  const pieceAt = (e: ThreeEvent<PointerEvent | MouseEvent>) => (e.instanceId === undefined ? null : (mesh.instances[e.instanceId]?.piece ?? null));

  return (
    <instancedMesh
      ref={ref}
      args={[geometry, material, mesh.instances.length]}
      frustumCulled={false}
      onPointerMove={(e) => {
        // Raycasts ignore clipping: a hit on the cut-away part passes on to what lies behind.
        if (clip && clip.distanceToPoint(e.point) < 0) return;
        e.stopPropagation();
        const p = pieceAt(e);
        if (p !== hovered) onHover(p);
      }}
      onPointerOut={() => onHover(null)}
      onClick={(e) => {
        if (clip && clip.distanceToPoint(e.point) < 0) return;
        e.stopPropagation();
        const p = pieceAt(e);
        if (p) onSelect(p, [e.point.x, e.point.y, e.point.z]);
      }}
    />
  );
}
