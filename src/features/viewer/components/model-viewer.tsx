import { OrbitControls } from '@react-three/drei';
import { Canvas, useFrame, useThree } from '@react-three/fiber';
import { Component as ReactComponent, type ReactNode, type RefObject, useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { PerspectiveCamera, Plane, Vector3 } from 'three';
import { parseDesign } from '../../../../shared/engine/design.js';
import { type Scene, type SceneInstance, sceneOfDesign, usableJoints } from '../../../../shared/engine/scene.js';
import { Button } from '../../../components/ui/button.js';
import { EmptyState } from '../../../components/ui/empty-state.js';
import { FAMILY_COLOURS, JOINT_STYLES, PAPER, familyColour } from '../palette.js';
import { JointOverlay } from './joint-overlay.js';
import { PieceInstances } from './piece-instances.js';

export interface ModelViewerProps {
  /** The design document as the revision API returns it. */
  design: unknown;
  /** The audit report's joints (each with `from` and `to`); an empty list draws no overlay. */
  joints: readonly unknown[];
}

type SceneResult = { ok: true; scene: Scene } | { ok: false; message: string };

function computeScene(design: unknown, joints: readonly unknown[]): SceneResult {
  const parsed = parseDesign(design);
  if (!parsed.ok) {
    const first = parsed.errors[0];
    return { ok: false, message: `The design could not be read (${first ? `${first.path || 'document'}: ${first.message}` : 'unknown problem'}).` };
  }
  try {
    return { ok: true, scene: sceneOfDesign(parsed.design, usableJoints(joints)) };
  } catch (e) {
    return { ok: false, message: `The model could not be built from this design (${e instanceof Error ? e.message : String(e)}).` };
  }
}

function webglAvailable(): boolean {
  try {
    const c = document.createElement('canvas');
    return Boolean(c.getContext('webgl2') ?? c.getContext('webgl'));
  } catch {
    return false;
  }
}

const NO_WEBGL = 'This browser cannot show the 3-D model: WebGL is turned off or not supported here. The audit, findings and downloads above and below still work.';

class ViewerBoundary extends ReactComponent<{ children: ReactNode }, { failed: boolean }> {
  override state = { failed: false };
  static getDerivedStateFromError() {
    return { failed: true };
  }
  override componentDidCatch(error: unknown) {
    console.warn('3-D viewer stopped:', error);
  }
  override render() {
    return this.state.failed ? (
      <p role="alert" className="rounded-md border border-signal-error bg-signal-error-wash px-4 py-3 text-sm text-ink">
        {NO_WEBGL}
      </p>
    ) : (
      this.props.children
    );
  }
}

/** Frames the whole model when `fitKey` changes; the camera looks along a fixed oblique direction. */
function CameraRig({ scene, fitKey }: { scene: Scene; fitKey: number }) {
  const camera = useThree((s) => s.camera);
  const controls = useThree((s) => s.controls) as unknown as { target: Vector3; update(): void } | null;
  const invalidate = useThree((s) => s.invalidate);
  useEffect(() => {
    if (!(camera instanceof PerspectiveCamera)) return;
    const r = Math.max(scene.radius, 1);
    const dist = (r / Math.sin((camera.fov * Math.PI) / 360)) * 1.08;
    const [cx, cy, cz] = scene.center;
    const dir = new Vector3(0.62, -0.78, 0.48).normalize();
    camera.up.set(0, 0, 1);
    camera.position.set(cx + dir.x * dist, cy + dir.y * dist, cz + dir.z * dist);
    camera.near = Math.max(0.1, dist / 200);
    camera.far = dist * 20;
    camera.updateProjectionMatrix();
    camera.lookAt(cx, cy, cz);
    if (controls) {
      controls.target.set(cx, cy, cz);
      controls.update();
    }
    invalidate();
  }, [camera, controls, scene, fitKey, invalidate]);
  return null;
}

/** Renders each frame itself so it can read the renderer's counters after drawing. */
function RenderProbe({ target }: { target: RefObject<HTMLDivElement | null> }) {
  useFrame((state) => {
    state.gl.render(state.scene, state.camera);
    target.current?.setAttribute('data-draw-calls', String(state.gl.info.render.calls));
  }, 1);
  return null;
}

/**
 * The 3-D model of a revision: every piece as a slab of the material, one instanced mesh per
 * template, coloured by family, with the audit's joints drawn by kind (shape and colour).
 */
export default function ModelViewer({ design, joints }: ModelViewerProps) {
  const result = useMemo(() => computeScene(design, joints), [design, joints]);
  const [webgl] = useState(webglAvailable);
  if (!result.ok) {
    return (
      <p role="alert" className="rounded-md border border-signal-error bg-signal-error-wash px-4 py-3 text-sm text-ink">
        {result.message}
      </p>
    );
  }
  if (result.scene.pieceCount === 0) {
    return <EmptyState title="Nothing to show yet">This design has no pieces: add a motif to one of its families to see the model.</EmptyState>;
  }
  if (!webgl) {
    return (
      <p role="alert" className="rounded-md border border-signal-error bg-signal-error-wash px-4 py-3 text-sm text-ink">
        {NO_WEBGL}
      </p>
    );
  }
  return (
    <ViewerBoundary>
      <ViewerBody scene={result.scene} />
    </ViewerBoundary>
  );
}

function ViewerBody({ scene }: { scene: Scene }) {
  const [hovered, setHovered] = useState<string | null>(null);
  const [selected, setSelected] = useState<string | null>(null);
  const [explode, setExplode] = useState(0);
  const [showJoints, setShowJoints] = useState(true);
  const [fitKey, setFitKey] = useState(0);
  const [cutOn, setCutOn] = useState(false);
  const [cut, setCut] = useState(0);
  const frame = useRef<HTMLDivElement>(null);

  const instances = useMemo(() => {
    const m = new Map<string, SceneInstance>();
    for (const mesh of scene.meshes) for (const inst of mesh.instances) m.set(inst.piece, inst);
    return m;
  }, [scene]);
  const jointsOf = useMemo(() => {
    const m = new Map<string, number[]>();
    for (const j of scene.joints) {
      for (const id of [j.a, j.b]) {
        const list = m.get(id);
        if (list) list.push(j.index);
        else m.set(id, [j.index]);
      }
    }
    return m;
  }, [scene]);
  const emphasis = useMemo(() => new Set(selected ? (jointsOf.get(selected) ?? []) : []), [selected, jointsOf]);
  // A horizontal cutting plane: everything above the chosen height is cut away.
  const clip = useMemo(() => (cutOn ? new Plane(new Vector3(0, 0, -1), scene.center[2] + cut * scene.radius) : null), [cutOn, cut, scene]);
  const explodeMm = explode * scene.radius * 0.4;
  const markerSize = Math.max(scene.thickness * 1.2, scene.radius * 0.012);
  const onHover = useCallback((p: string | null) => setHovered(p), []);
  const onSelect = useCallback((p: string) => setSelected(p), []);
  const problemCount = scene.joints.filter((j) => !j.orthogonal || j.locked).length;
  const focus = selected ?? hovered;

  return (
    <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_18rem]">
      <div className="space-y-3">
        <div
          ref={frame}
          data-testid="model-viewer"
          data-templates={scene.templateCount}
          data-pieces={scene.pieceCount}
          className="relative h-[28rem] overflow-hidden rounded-md border border-rule bg-paper"
          style={{ cursor: hovered ? 'pointer' : 'grab' }}
        >
          <Canvas
            gl={{ preserveDrawingBuffer: true, antialias: true }}
            frameloop="demand"
            dpr={[1, 2]}
            camera={{ fov: 35, position: [0, -1, 0] }}
            onCreated={({ gl }) => {
              gl.localClippingEnabled = true;
            }}
            onPointerMissed={() => setSelected(null)}
            role="img"
            aria-label={`3-D model: ${scene.pieceCount} pieces in ${scene.templateCount} templates`}
          >
            <color attach="background" args={[PAPER]} />
            <hemisphereLight args={['#fffaf0', '#b8a98c', 1.6]} />
            <directionalLight position={[scene.center[0] + scene.radius, scene.center[1] - scene.radius, scene.center[2] + 2 * scene.radius]} intensity={1.6} />
            {scene.meshes.map((mesh, i) => (
              <PieceInstances
                key={`${mesh.template}-${i}`}
                mesh={mesh}
                explode={explodeMm}
                clip={clip}
                hovered={hovered}
                selected={selected}
                onHover={onHover}
                onSelect={onSelect}
              />
            ))}
            {showJoints && explode === 0 && !cutOn && scene.joints.length ? <JointOverlay joints={scene.joints} size={markerSize} emphasis={emphasis} /> : null}
            <OrbitControls makeDefault enableDamping={false} />
            <CameraRig scene={scene} fitKey={fitKey} />
            <RenderProbe target={frame} />
          </Canvas>
        </div>
        <div className="flex flex-wrap items-center gap-4 text-sm">
          <Button variant="secondary" size="sm" onClick={() => setFitKey((k) => k + 1)}>
            Fit to view
          </Button>
          <label className="flex items-center gap-2">
            <span>Exploded view</span>
            <input type="range" min={0} max={1} step={0.01} value={explode} onChange={(e) => setExplode(Number(e.target.value))} className="w-40 accent-[#1b5e73]" />
          </label>
          <label className="flex items-center gap-2">
            <input type="checkbox" checked={cutOn} onChange={(e) => setCutOn(e.target.checked)} />
            <span>Cut through</span>
          </label>
          <label className="flex items-center gap-2">
            <span>Cut height</span>
            <input type="range" min={-1} max={1} step={0.01} value={cut} disabled={!cutOn} onChange={(e) => setCut(Number(e.target.value))} className="w-32 accent-[#1b5e73]" />
          </label>
          <label className="flex items-center gap-2">
            <input type="checkbox" checked={showJoints} onChange={(e) => setShowJoints(e.target.checked)} />
            <span>Show joints</span>
          </label>
          <span className="text-ink-soft">
            Drag to turn, scroll to zoom, right-drag to pan.{(explode > 0 || cutOn) && showJoints ? ' Joints show when the pieces are together and uncut.' : ''}
          </span>
        </div>
      </div>
      <aside aria-label="Piece details" className="space-y-4 text-sm">
        <PiecePanel scene={scene} piece={focus} instance={focus ? instances.get(focus) : undefined} joints={focus ? (jointsOf.get(focus) ?? []) : []} pinned={selected !== null} />
        <Legend scene={scene} problemCount={problemCount} />
      </aside>
    </div>
  );
}

function PiecePanel({ scene, piece, instance, joints, pinned }: { scene: Scene; piece: string | null; instance: SceneInstance | undefined; joints: readonly number[]; pinned: boolean }) {
  if (!piece || !instance) {
    return (
      <div className="rounded-md border border-dashed border-rule-strong px-3 py-3 text-ink-soft" data-testid="piece-panel">
        Point at a piece to name it; click to keep it selected.
      </div>
    );
  }
  const cut = scene.meshes.filter((m) => m.template === instance.template).reduce((s, m) => s + m.instances.length, 0);
  return (
    <div className="space-y-2 rounded-md border border-rule bg-paper px-3 py-3" data-testid="piece-panel" aria-live="polite">
      <p className="font-semibold">
        {pinned ? 'Selected piece ' : 'Piece '}
        <span className="font-mono" data-testid="piece-id">
          {piece}
        </span>
      </p>
      <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1">
        <dt className="text-ink-soft">Motif</dt>
        <dd className="font-mono">{instance.motif}</dd>
        <dt className="text-ink-soft">Family</dt>
        <dd className="flex items-center gap-2">
          <span aria-hidden="true" className="inline-block size-3 rounded-sm" style={{ background: familyColour(instance.family) }} />
          <span className="font-mono">{scene.families[instance.family]}</span>
        </dd>
        <dt className="text-ink-soft">Template</dt>
        <dd>
          T{instance.template + 1} (cut {cut} {cut === 1 ? 'time' : 'times'})
        </dd>
      </dl>
      <div>
        <p className="font-semibold">Joints ({joints.length})</p>
        {joints.length === 0 ? (
          <p className="text-ink-soft">No joint with another piece.</p>
        ) : (
          <ul className="max-h-48 space-y-1 overflow-auto">
            {joints.map((k) => {
              const j = scene.joints[k];
              const other = j.a === piece ? j.b : j.a;
              const style = JOINT_STYLES.find((s) => s.kind === j.kind);
              return (
                <li key={k} className="flex flex-wrap gap-x-2">
                  <span className="font-mono">{other}</span>
                  <span>{style?.label ?? j.kind}</span>
                  <span className="text-ink-soft">{j.length.toFixed(1)} mm</span>
                  {j.angleDeg !== null ? <span className="text-ink-soft">{j.angleDeg.toFixed(2)}°</span> : null}
                  {!j.orthogonal ? <strong className="text-signal-error">not square</strong> : null}
                  {j.locked ? <strong className="text-signal-error">cannot be assembled</strong> : null}
                </li>
              );
            })}
          </ul>
        )}
      </div>
    </div>
  );
}

function Legend({ scene, problemCount }: { scene: Scene; problemCount: number }) {
  return (
    <div className="space-y-3 rounded-md border border-rule px-3 py-3">
      <div>
        <p className="font-semibold">Families</p>
        <ul className="mt-1 space-y-0.5">
          {scene.families.map((f, i) => (
            <li key={f} className="flex items-center gap-2">
              <span aria-hidden="true" className="inline-block size-3 rounded-sm" style={{ background: familyColour(i) }} />
              <span className="font-mono">{f}</span>
              {i >= FAMILY_COLOURS.length ? <span className="text-ink-soft">(colour repeats)</span> : null}
            </li>
          ))}
        </ul>
      </div>
      <div>
        <p className="font-semibold">Joint markers</p>
        <ul className="mt-1 space-y-0.5">
          {JOINT_STYLES.map((s) => (
            <li key={s.kind} className="flex items-center gap-2">
              <span aria-hidden="true" className="inline-block size-3 rounded-sm border border-ink-faint" style={{ background: s.colour }} />
              <span>
                {s.label}: {s.shapeLabel}
              </span>
            </li>
          ))}
          <li>A red ring marks a joint that is not square or cannot be assembled{problemCount ? ` (${problemCount} here)` : ' (none here)'}.</li>
        </ul>
      </div>
    </div>
  );
}
