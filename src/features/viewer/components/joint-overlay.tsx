import { useThree } from '@react-three/fiber';
import { useLayoutEffect, useMemo, useRef } from 'react';
import {
  BoxGeometry,
  BufferAttribute,
  BufferGeometry,
  Color,
  ConeGeometry,
  type InstancedMesh,
  LineBasicMaterial,
  Matrix4,
  MeshBasicMaterial,
  Quaternion,
  SphereGeometry,
  TorusGeometry,
  Vector3,
} from 'three';
import { mergeGeometries } from 'three/examples/jsm/utils/BufferGeometryUtils.js';
import type { SceneJoint } from '../../../../shared/engine/scene.js';
import { DIM_TOWARDS_PAPER, JOINT_STYLES, PAPER, PROBLEM, type MarkerShape, jointStyle } from '../palette.js';

export interface JointOverlayProps {
  joints: readonly SceneJoint[];
  /** Marker size in millimetres. */
  size: number;
  /** Joints of the selected piece are drawn larger. */
  emphasis: ReadonlySet<number>;
  /** Joints whose pieces are dimmed (a finding is shown): their lines and markers fade the same way. */
  dimmed?: ReadonlySet<number> | null;
}

function markerGeometry(shape: MarkerShape): BufferGeometry {
  switch (shape) {
    case 'square':
      return new BoxGeometry(1.3, 1.3, 1.3);
    case 'triangle':
      return new ConeGeometry(1, 1.6, 3);
    case 'cross':
      return mergeGeometries([new BoxGeometry(2.2, 0.5, 0.5), new BoxGeometry(0.5, 2.2, 0.5)]);
    case 'circle':
      return new SphereGeometry(0.85, 16, 10);
    case 'bar':
      return new BoxGeometry(3, 0.6, 0.6);
  }
}

const noRaycast = () => null;

/** Joint lines (one draw call), one instanced marker per joint kind, and a ring on every problem joint. */
export function JointOverlay({ joints, size, emphasis, dimmed = null }: JointOverlayProps) {
  const invalidate = useThree((s) => s.invalidate);
  const lines = useMemo(() => {
    const g = new BufferGeometry();
    const pos = new Float32Array(joints.length * 6);
    g.setAttribute('position', new BufferAttribute(pos, 3));
    g.setAttribute('color', new BufferAttribute(new Float32Array(joints.length * 6), 3));
    joints.forEach((j, i) => pos.set([...j.from, ...j.to], 6 * i));
    return g;
  }, [joints]);
  // Colours apart from positions, so a change of focus only rewrites the colour buffer.
  useLayoutEffect(() => {
    const attr = lines.getAttribute('color') as BufferAttribute;
    const col = attr.array as Float32Array;
    const c = new Color();
    const paper = new Color(PAPER);
    joints.forEach((j, i) => {
      c.set(!j.orthogonal || j.locked ? PROBLEM : (jointStyle(j.kind)?.colour ?? '#2a3640'));
      if (dimmed?.has(j.index)) c.lerp(paper, DIM_TOWARDS_PAPER);
      col.set([c.r, c.g, c.b, c.r, c.g, c.b], 6 * i);
    });
    attr.needsUpdate = true;
    invalidate();
  }, [lines, joints, dimmed, invalidate]);
  const lineMaterial = useMemo(() => new LineBasicMaterial({ vertexColors: true, depthTest: false, transparent: true }), []);
  const markerMaterial = useMemo(() => new MeshBasicMaterial({ depthTest: false, transparent: true, opacity: 0.95 }), []);
  const kinds = useMemo(
    () =>
      JOINT_STYLES.map((style) => ({
        style,
        geometry: markerGeometry(style.shape),
        joints: joints.filter((j) => j.kind === style.kind),
      })).filter((k) => k.joints.length > 0),
    [joints],
  );
  const problems = useMemo(() => joints.filter((j) => !j.orthogonal || j.locked), [joints]);
  const ring = useMemo(() => new TorusGeometry(2.2, 0.22, 6, 28), []);
  useLayoutEffect(
    () => () => {
      lines.dispose();
      for (const k of kinds) k.geometry.dispose();
    },
    [lines, kinds],
  );
  useLayoutEffect(
    () => () => {
      lineMaterial.dispose();
      markerMaterial.dispose();
      ring.dispose();
    },
    [lineMaterial, markerMaterial, ring],
  );

  return (
    <group>
      <lineSegments geometry={lines} material={lineMaterial} renderOrder={10} raycast={noRaycast} frustumCulled={false} />
      {kinds.map((k) => (
        <Markers key={k.style.kind} joints={k.joints} geometry={k.geometry} material={markerMaterial} size={size} emphasis={emphasis} dimmed={dimmed} colour={k.style.colour} invalidate={invalidate} />
      ))}
      {problems.length ? <Markers joints={problems} geometry={ring} material={markerMaterial} size={size} emphasis={emphasis} dimmed={dimmed} colour={PROBLEM} invalidate={invalidate} /> : null}
    </group>
  );
}

interface MarkersProps {
  joints: readonly SceneJoint[];
  geometry: BufferGeometry;
  material: MeshBasicMaterial;
  size: number;
  emphasis: ReadonlySet<number>;
  dimmed: ReadonlySet<number> | null;
  colour: string;
  invalidate(): void;
}

function Markers({ joints, geometry, material, size, emphasis, dimmed, colour, invalidate }: MarkersProps) {
  const ref = useRef<InstancedMesh>(null);
  const scratch = useMemo(() => ({ m: new Matrix4(), q: new Quaternion(), p: new Vector3(), d: new Vector3(), s: new Vector3(), z: new Vector3(0, 0, 1), c: new Color(), paper: new Color(PAPER) }), []);
  useLayoutEffect(() => {
    const im = ref.current;
    if (!im) return;
    const { m, q, p, d, s, z, c, paper } = scratch;
    joints.forEach((j, i) => {
      p.set((j.from[0] + j.to[0]) / 2, (j.from[1] + j.to[1]) / 2, (j.from[2] + j.to[2]) / 2);
      d.set(j.to[0] - j.from[0], j.to[1] - j.from[1], j.to[2] - j.from[2]);
      if (d.lengthSq() > 0) q.setFromUnitVectors(z, d.normalize());
      else q.identity();
      // Dimmed joints also shrink: a near-white marker faded towards the paper would barely change.
      const k = (emphasis.has(j.index) ? size * 1.8 : size) * (dimmed?.has(j.index) ? 0.7 : 1);
      s.set(k, k, k);
      m.compose(p, q, s);
      im.setMatrixAt(i, m);
      c.set(!j.orthogonal ? PROBLEM : colour);
      if (dimmed?.has(j.index)) c.lerp(paper, DIM_TOWARDS_PAPER);
      im.setColorAt(i, c);
    });
    im.instanceMatrix.needsUpdate = true;
    if (im.instanceColor) im.instanceColor.needsUpdate = true;
    invalidate();
  }, [joints, size, emphasis, dimmed, colour, scratch, invalidate]);
  return <instancedMesh ref={ref} args={[geometry, material, joints.length]} renderOrder={11} raycast={noRaycast} frustumCulled={false} />;
}
