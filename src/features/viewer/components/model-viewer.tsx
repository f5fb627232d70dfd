import { OrbitControls } from '@react-three/drei';
import { Canvas, useFrame, useThree } from '@react-three/fiber';
import { Component as ReactComponent, type KeyboardEvent, type ReactNode, type RefObject, useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { PerspectiveCamera, Plane, Vector3 } from 'three';
import type { CameraView } from '../../../../shared/api/critique.js';
import { parseDesign } from '../../../../shared/engine/design.js';
import { toFrame } from '../../../../shared/engine/frames.js';
import type { Piece } from '../../../../shared/engine/model.js';
import { buildPieces } from '../../../../shared/engine/pieces.js';
import { type PinAnchor, anchorAt, orbitAnchors, pinWorldPosition } from '../../../../shared/engine/pins.js';
import { locateInPolygon } from '../../../../shared/engine/polygons.js';
import { type Scene, type SceneInstance, type Sphere, buildScene, piecesSphere, rankGroups, usableGroups, usableJoints } from '../../../../shared/engine/scene.js';
import type { Vec2, Vec3 } from '../../../../shared/engine/vec.js';
import { Button } from '../../../components/ui/button.js';
import { EmptyState } from '../../../components/ui/empty-state.js';
import { FAMILY_COLOURS, JOINT_STYLES, LOOSE_GROUP_COLOURS, PAPER, familyColour, groupColour } from '../palette.js';
import { JointOverlay } from './joint-overlay.js';
import { PieceInstances } from './piece-instances.js';
import { PinMarkerLayer } from './pin-marker-layer.js';
import { type MarkerPoint, MarkerProjector, type ViewerPin } from './pin-markers.js';

export type { ViewerPin } from './pin-markers.js';

export interface ModelViewerProps {
  /** The design document as the revision API returns it. */
  design: unknown;
  /** The audit report's joints (each with `from` and `to`); an empty list draws no overlay. */
  joints: readonly unknown[];
  /**
   * The report's connected groups (`report.groups`, lists of piece ids), read defensively; with
   * more than one group the viewer offers to colour pieces by group.
   */
  groups?: unknown;
  /**
   * Pieces to show (a finding's): they keep their colour, every other piece is dimmed, and the
   * camera flies to frame them. `label` names what they are (a finding's code). Null: whole model.
   */
  focus?: ViewerFocus | null;
  /** Called by the Clear control next to a focus; the caller sets `focus` back to null. */
  onClearFocus?: () => void;
  /** Critics' pins drawn on the model, and placing new ones; null or absent: no pins. */
  pins?: ViewerPins | null;
  /** `beside` (default): piece details to the right of the model; `stacked`: below it. */
  layout?: 'beside' | 'stacked';
  /** A lower canvas, for pages that show more next to the model. */
  compact?: boolean;
}

/** Where a pin is being placed: its anchor, the camera it was placed through and its motif's size. */
export interface PlacedPin {
  readonly anchor: PinAnchor;
  readonly camera: CameraView;
  /** Pieces the pin would sit on as an orbit pin (1: the motif has a single piece). */
  readonly orbitSize: number;
}

/** The pins the viewer draws and what it reports back. */
export interface ViewerPins {
  readonly pins: readonly ViewerPin[];
  /** Key of the pin whose marker is highlighted, or null. */
  readonly selected: string | null;
  onSelect(key: string): void;
  /** Placing is allowed at all: Enter on a piece chosen by keyboard and the "Pin this piece" button place a pin. */
  readonly canPlace: boolean;
  /** Place-a-pin mode: the next click on a piece places a pin where it hit. */
  readonly placing: boolean;
  onPlace(placed: PlacedPin): void;
  /** The pin being written (drawn as a dashed marker), or null. */
  readonly draft: PinAnchor | null;
  /** A saved view to fly to; a new `key` flies again. */
  readonly view: { readonly key: number; readonly camera: CameraView } | null;
  /** Filled with a reader of the current camera while the model is shown (for saving a pin's view). */
  readonly cameraRef?: RefObject<(() => CameraView) | null>;
}

/** What the viewer is asked to show: some pieces and a label naming them. */
export interface ViewerFocus {
  readonly label: string;
  readonly pieces: readonly string[];
}

/** How long the camera takes to fly to a focus (ms). */
const FLIGHT_MS = 400;
const FIT_DIRECTION = new Vector3(0.62, -0.78, 0.48).normalize();

function prefersReducedMotion(): boolean {
  return typeof window !== 'undefined' && typeof window.matchMedia === 'function' && window.matchMedia('(prefers-reduced-motion: reduce)').matches;
}

type SceneResult = { ok: true; scene: Scene; pieces: readonly Piece[] } | { ok: false; message: string };

function computeScene(design: unknown, joints: readonly unknown[]): SceneResult {
  const parsed = parseDesign(design);
  if (!parsed.ok) {
    const first = parsed.errors[0];
    return { ok: false, message: `The design could not be read (${first ? `${first.path || 'document'}: ${first.message}` : 'unknown problem'}).` };
  }
  try {
    const build = buildPieces(parsed.design);
    return { ok: true, scene: buildScene(parsed.design, build, usableJoints(joints)), pieces: build.pieces };
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

interface Flight {
  readonly from: Vector3;
  readonly fromTarget: Vector3;
  readonly to: Vector3;
  readonly toTarget: Vector3;
  readonly start: number;
}

/**
 * Frames the whole model, or the `goal` sphere when one is given. "Fit to view" (`fitKey`) and
 * the first frame jump; a new goal (or clearing it) flies there over {@link FLIGHT_MS}, looking
 * from where the camera is now. The flight only mutates the camera and controls in `useFrame`.
 */
function CameraRig({ scene, fitKey, goal, view }: { scene: Scene; fitKey: number; goal: Sphere | null; view: ViewerPins['view'] }) {
  const camera = useThree((s) => s.camera);
  const controls = useThree((s) => s.controls) as unknown as { target: Vector3; update(): void } | null;
  const invalidate = useThree((s) => s.invalidate);
  const flight = useRef<Flight | null>(null);
  const lastGoal = useRef<Sphere | null | undefined>(undefined);
  const scratch = useMemo(() => new Vector3(), []);
  useEffect(() => {
    if (!(camera instanceof PerspectiveCamera)) return;
    const sphere = goal ?? scene;
    const floor = goal ? Math.max(scene.thickness * 4, scene.radius * 0.04, 1) : 1;
    const r = Math.max(sphere.radius, floor);
    const sin = Math.sin((camera.fov * Math.PI) / 360);
    const dist = (r / sin) * 1.08;
    const whole = (Math.max(scene.radius, 1) / sin) * 1.08;
    const target = new Vector3(sphere.center[0], sphere.center[1], sphere.center[2]);
    const fly = lastGoal.current !== undefined && lastGoal.current !== goal && !prefersReducedMotion();
    const dir = FIT_DIRECTION.clone();
    if (fly && controls) {
      const d = camera.position.clone().sub(controls.target);
      if (d.lengthSq() > 1e-12) dir.copy(d.normalize());
    }
    lastGoal.current = goal;
    const to = target.clone().addScaledVector(dir, dist);
    camera.up.set(0, 0, 1);
    camera.near = Math.max(0.1, Math.min(dist, whole) / 200);
    camera.far = Math.max(dist, whole) * 20;
    camera.updateProjectionMatrix();
    if (fly) {
      flight.current = { from: camera.position.clone(), fromTarget: controls ? controls.target.clone() : target.clone(), to, toTarget: target, start: performance.now() };
    } else {
      flight.current = null;
      camera.position.copy(to);
      camera.lookAt(target);
      if (controls) {
        controls.target.copy(target);
        controls.update();
      }
    }
    invalidate();
    // fitKey only re-runs the framing.
  }, [camera, controls, scene, fitKey, goal, invalidate]);
  // A saved view (a pin's camera): fly from where the camera is to exactly that position and target.
  const lastView = useRef<ViewerPins['view']>(null);
  useEffect(() => {
    // Only a new view flies (not a new scene or camera under an old one).
    if (!view || view === lastView.current || !(camera instanceof PerspectiveCamera)) return;
    lastView.current = view;
    const to = new Vector3(...view.camera.position);
    const toTarget = new Vector3(...view.camera.target);
    const dist = Math.max(to.distanceTo(toTarget), 1e-3);
    camera.near = Math.max(0.05, Math.min(camera.near, dist / 200));
    camera.far = Math.max(camera.far, dist * 20, scene.radius * 40);
    camera.updateProjectionMatrix();
    if (prefersReducedMotion()) {
      flight.current = null;
      camera.position.copy(to);
      camera.lookAt(toTarget);
      if (controls) {
        controls.target.copy(toTarget);
        controls.update();
      }
    } else {
      flight.current = { from: camera.position.clone(), fromTarget: controls ? controls.target.clone() : toTarget.clone(), to, toTarget, start: performance.now() };
    }
    invalidate();
  }, [camera, controls, view, scene, invalidate]);
  useFrame(() => {
    const f = flight.current;
    if (!f) return;
    const t = Math.min(1, (performance.now() - f.start) / FLIGHT_MS);
    const e = t < 0.5 ? 2 * t * t : 1 - (-2 * t + 2) ** 2 / 2;
    camera.position.lerpVectors(f.from, f.to, e);
    scratch.lerpVectors(f.fromTarget, f.toTarget, e);
    if (controls) {
      controls.target.copy(scratch);
      controls.update();
    } else {
      camera.lookAt(scratch);
    }
    if (t >= 1) flight.current = null;
    else invalidate();
  });
  return null;
}

/** Lets the page outside the canvas read the camera (position and orbit target) when it needs it. */
function CameraReader({ target, also }: { target: RefObject<(() => CameraView) | null>; also?: RefObject<(() => CameraView) | null> }) {
  const camera = useThree((s) => s.camera);
  const controls = useThree((s) => s.controls) as unknown as { target: Vector3 } | null;
  useEffect(() => {
    const read = (): CameraView => {
      const t = controls?.target ?? new Vector3(0, 0, 0);
      return { position: [camera.position.x, camera.position.y, camera.position.z], target: [t.x, t.y, t.z] };
    };
    target.current = read;
    if (also) also.current = read;
    return () => {
      target.current = null;
      if (also && also.current === read) also.current = null;
    };
  }, [camera, controls, target, also]);
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
export default function ModelViewer({ design, joints, groups, focus = null, onClearFocus, pins = null, layout = 'beside', compact = false }: ModelViewerProps) {
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
      <ViewerBody scene={result.scene} pieces={result.pieces} groups={groups} focus={focus} onClearFocus={onClearFocus} pins={pins} layout={layout} compact={compact} />
    </ViewerBoundary>
  );
}

const NO_PIN_POINTS: readonly MarkerPoint[] = [];

/**
 * A point on the piece for a pin placed without a pointer: the centroid when it lies on the
 * piece, else (a ring-shaped piece, a crescent) the first point found inside on the way from the
 * centroid to a corner of the outline.
 */
function pointOnPiece(piece: Piece, centroid: Vec2): Vec2 {
  if (locateInPolygon(centroid, piece.polygon, 0) === 'inside') return centroid;
  for (const t of [0.5, 0.25, 0.75, 0.1, 0.9]) {
    for (const v of piece.polygon.outer) {
      const q: Vec2 = [centroid[0] + t * (v[0] - centroid[0]), centroid[1] + t * (v[1] - centroid[1])];
      if (locateInPolygon(q, piece.polygon, 0) === 'inside') return q;
    }
  }
  return centroid;
}

interface ViewerBodyProps {
  scene: Scene;
  pieces: readonly Piece[];
  groups: unknown;
  focus: ViewerFocus | null;
  onClearFocus?: () => void;
  pins: ViewerPins | null;
  layout: 'beside' | 'stacked';
  compact: boolean;
}

function ViewerBody({ scene, pieces, groups, focus, onClearFocus, pins, layout, compact }: ViewerBodyProps) {
  const [hovered, setHovered] = useState<string | null>(null);
  const [selected, setSelected] = useState<string | null>(null);
  const [explode, setExplode] = useState(0);
  const [showJoints, setShowJoints] = useState(true);
  const [fitKey, setFitKey] = useState(0);
  const [cutOn, setCutOn] = useState(false);
  const [cut, setCut] = useState(0);
  const [byGroup, setByGroup] = useState(false);
  const frame = useRef<HTMLDivElement>(null);
  const ranking = useMemo(() => rankGroups(usableGroups(groups)), [groups]);
  const groupsShown = byGroup && ranking.sizes.length > 1;
  const focusSet = useMemo(() => (focus ? new Set(focus.pieces) : null), [focus]);
  const goal = useMemo(() => (focusSet ? piecesSphere(scene, focusSet) : null), [scene, focusSet]);
  const highlighted = goal?.count ?? 0;
  useEffect(() => {
    if (!focus) return;
    frame.current?.scrollIntoView?.({ block: 'center', behavior: prefersReducedMotion() ? 'auto' : 'smooth' });
  }, [focus]);

  const instances = useMemo(() => {
    const m = new Map<string, SceneInstance>();
    for (const mesh of scene.meshes) for (const inst of mesh.instances) m.set(inst.piece, inst);
    return m;
  }, [scene]);
  const pieceById = useMemo(() => new Map(pieces.map((p) => [p.id, p])), [pieces]);
  const pieceOrder = useMemo(() => pieces.map((p) => p.id), [pieces]);
  const cameraOf = useRef<(() => CameraView) | null>(null);
  const markerEls = useRef(new Map<string, HTMLElement>());
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
  // Joints whose pieces are both dimmed by the focus are dimmed with them.
  const dimmedJoints = useMemo(() => {
    if (!focusSet) return null;
    const out = new Set<number>();
    for (const j of scene.joints) if (!focusSet.has(j.a) && !focusSet.has(j.b) && j.a !== selected && j.b !== selected) out.add(j.index);
    return out;
  }, [focusSet, scene, selected]);
  // Pin anchors (with an orbit pin's copies) change only with the pins; positions also with the explode.
  const pinAnchors = useMemo(
    () => (pins?.pins ?? []).map((pin) => ({ pin, copies: pin.scope === 'orbit' ? orbitAnchors(pieces, pin.anchor).slice(1) : [] })),
    [pins?.pins, pieces],
  );
  const draft = pins?.draft ?? null;
  const markerPoints = useMemo(() => {
    if (!pins) return NO_PIN_POINTS;
    const at = (anchor: PinAnchor | ViewerPin['anchor']): { position: Vec3; facing: Vec3 } | null => {
      const piece = pieceById.get(anchor.piece);
      if (!piece) return null;
      const p = pinWorldPosition(piece.frame, anchor, scene.thickness);
      const e = instances.get(anchor.piece)?.explode ?? [0, 0, 0];
      const n = piece.frame.normal;
      return {
        position: [p[0] + e[0] * explodeMm, p[1] + e[1] * explodeMm, p[2] + e[2] * explodeMm],
        facing: [n[0] * anchor.side, n[1] * anchor.side, n[2] * anchor.side],
      };
    };
    const out: MarkerPoint[] = [];
    for (const { pin, copies } of pinAnchors) {
      copies.forEach((c, i) => {
        const place = at(c);
        if (place) out.push({ key: `${pin.key}~${i}`, kind: 'copy', ...place });
      });
    }
    for (const { pin } of pinAnchors) {
      const place = at(pin.anchor);
      if (place) out.push({ key: pin.key, kind: 'pin', ...place, pin });
    }
    if (draft) {
      const place = at(draft);
      if (place) out.push({ key: 'draft', kind: 'draft', ...place });
    }
    return out;
  }, [pins, pinAnchors, draft, pieceById, instances, scene.thickness, explodeMm]);
  const placePin = useCallback(
    (anchor: PinAnchor) => {
      if (!pins) return;
      const camera = cameraOf.current?.() ?? { position: [0, -1, 0], target: [0, 0, 0] };
      pins.onPlace({ anchor, camera, orbitSize: Math.max(1, orbitAnchors(pieces, anchor).length) });
    },
    [pins, pieces],
  );
  /** A pin on the chosen piece without a pointer: its centroid, on the face along the normal. */
  const placeAtCentroid = useCallback(
    (id: string) => {
      const piece = pieceById.get(id);
      const inst = instances.get(id);
      if (!piece || !inst) return;
      placePin({ piece: id, point: pointOnPiece(piece, toFrame(piece.frame, inst.centroid)), side: 1 });
    },
    [pieceById, instances, placePin],
  );
  const markerSize = Math.max(scene.thickness * 1.2, scene.radius * 0.012);
  const onHover = useCallback((p: string | null) => setHovered(p), []);
  const placing = pins?.placing ?? false;
  const onSelect = useCallback(
    (p: string, world: Vec3) => {
      setSelected(p);
      if (!placing) return;
      const piece = pieceById.get(p);
      if (!piece) return;
      // The click hit the drawn (maybe exploded) slab: undo the push before anchoring.
      const e = instances.get(p)?.explode ?? [0, 0, 0];
      placePin(anchorAt(piece, [world[0] - e[0] * explodeMm, world[1] - e[1] * explodeMm, world[2] - e[2] * explodeMm]));
    },
    [placing, pieceById, instances, explodeMm, placePin],
  );
  const step = useCallback(
    (by: number) => {
      if (pieceOrder.length === 0) return;
      const at = selected ? pieceOrder.indexOf(selected) : -1;
      const next = at < 0 ? (by > 0 ? 0 : pieceOrder.length - 1) : (at + by + pieceOrder.length) % pieceOrder.length;
      setSelected(pieceOrder[next]);
    },
    [pieceOrder, selected],
  );
  const onFrameKey = useCallback(
    (e: KeyboardEvent<HTMLDivElement>) => {
      if (e.target !== e.currentTarget) return;
      if (e.key === 'ArrowRight' || e.key === 'ArrowDown') {
        e.preventDefault();
        step(1);
      } else if (e.key === 'ArrowLeft' || e.key === 'ArrowUp') {
        e.preventDefault();
        step(-1);
      } else if (e.key === 'Enter' && selected && pins?.canPlace) {
        e.preventDefault();
        placeAtCentroid(selected);
      }
    },
    [step, selected, pins?.canPlace, placeAtCentroid],
  );
  const problemCount = scene.joints.filter((j) => !j.orthogonal || j.locked).length;
  const pointed = selected ?? hovered;

  const pointedIndex = pointed ? pieceOrder.indexOf(pointed) : -1;
  const stacked = layout === 'stacked';

  return (
    <div className={stacked ? 'space-y-4' : 'grid gap-4 lg:grid-cols-[minmax(0,1fr)_18rem]'}>
      <div className="space-y-3">
        <div aria-live="polite" data-testid="viewer-focus">
          {focus ? (
            <div className="flex flex-wrap items-center gap-3 rounded-md border border-accent bg-paper-raised px-3 py-2 text-sm">
              <span>
                {highlighted > 0 ? (
                  <>
                    Showing {highlighted} {highlighted === 1 ? 'piece' : 'pieces'} of <code className="font-mono">{focus.label}</code>; the rest of the model is dimmed.
                    {highlighted < new Set(focus.pieces).size ? ` ${new Set(focus.pieces).size - highlighted} named pieces are not in this model.` : ''}
                  </>
                ) : (
                  <>
                    None of the pieces of <code className="font-mono">{focus.label}</code> is in this model.
                  </>
                )}
              </span>
              {onClearFocus ? (
                <Button variant="secondary" size="sm" onClick={onClearFocus}>
                  Clear highlight
                </Button>
              ) : null}
            </div>
          ) : null}
        </div>
        <div
          ref={frame}
          data-testid="model-viewer"
          data-templates={scene.templateCount}
          data-pieces={scene.pieceCount}
          data-highlighted={highlighted}
          data-group-colours={groupsShown ? ranking.sizes.length : 0}
          data-placing={placing ? 'true' : undefined}
          role="group"
          aria-label={`Model viewer. Arrow keys step through the pieces${pins?.canPlace ? '; Enter places a pin on the chosen piece' : ''}.`}
          tabIndex={0}
          onKeyDown={onFrameKey}
          className={`relative isolate overflow-hidden rounded-md border bg-paper focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-accent ${compact ? 'h-80' : 'h-[28rem]'} ${placing ? 'border-accent ring-2 ring-accent/40' : 'border-rule'}`}
          style={{ cursor: placing ? 'crosshair' : hovered ? 'pointer' : 'grab' }}
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
            aria-label={`3-D model: ${scene.pieceCount} pieces in ${scene.templateCount} templates${pins && pins.pins.length ? `, ${pins.pins.length} ${pins.pins.length === 1 ? 'pin' : 'pins'}` : ''}`}
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
                highlight={focusSet}
                groupOf={groupsShown ? ranking.groupOf : null}
                onHover={onHover}
                onSelect={onSelect}
              />
            ))}
            {showJoints && explode === 0 && !cutOn && scene.joints.length ? <JointOverlay joints={scene.joints} size={markerSize} emphasis={emphasis} dimmed={dimmedJoints} /> : null}
            <OrbitControls makeDefault enableDamping={false} />
            <CameraRig scene={scene} fitKey={fitKey} goal={goal} view={pins?.view ?? null} />
            <CameraReader target={cameraOf} also={pins?.cameraRef} />
            {markerPoints.length ? <MarkerProjector points={markerPoints} registry={markerEls} clip={clip} /> : null}
            <RenderProbe target={frame} />
          </Canvas>
          {markerPoints.length ? <PinMarkerLayer points={markerPoints} registry={markerEls} selected={pins?.selected ?? null} onSelect={pins ? pins.onSelect : () => {}} passThrough={placing} /> : null}
          {pointed ? (
            <p className="pointer-events-none absolute left-2 top-2 rounded-sm border border-rule bg-paper-raised/90 px-2 py-0.5 font-mono text-xs" data-testid="piece-label">
              {pointed}
              {pointedIndex >= 0 ? <span className="text-ink-soft"> ({pointedIndex + 1} of {pieceOrder.length})</span> : null}
            </p>
          ) : null}
          {placing ? (
            <p className="pointer-events-none absolute bottom-2 left-2 rounded-sm border border-accent bg-paper-raised/95 px-2 py-0.5 text-xs">Placing a pin: click a piece (Escape cancels).</p>
          ) : null}
        </div>
        <div className="flex flex-wrap items-center gap-4 text-sm">
          <Button variant="secondary" size="sm" onClick={() => setFitKey((k) => k + 1)}>
            Fit to view
          </Button>
          <label className="flex items-center gap-2">
            <span>Piece</span>
            <select
              value={selected ?? ''}
              onChange={(e) => setSelected(e.target.value || null)}
              className="h-8 rounded-md border border-rule-strong bg-paper-raised py-1 pl-2 pr-1 font-mono text-sm focus-visible:outline-2 focus-visible:outline-offset-1 focus-visible:outline-accent"
            >
              <option value="">None chosen</option>
              {pieceOrder.map((id) => (
                <option key={id} value={id}>
                  {id}
                </option>
              ))}
            </select>
          </label>
          {pins?.canPlace && selected ? (
            <Button variant="secondary" size="sm" onClick={() => placeAtCentroid(selected)}>
              Pin this piece
            </Button>
          ) : null}
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
          {ranking.sizes.length > 1 ? (
            <label className="flex items-center gap-2">
              <input type="checkbox" checked={byGroup} onChange={(e) => setByGroup(e.target.checked)} />
              <span>Colour by connected group</span>
            </label>
          ) : null}
          <span className="text-ink-soft">
            Drag to turn, scroll to zoom, right-drag to pan; with the model focused, arrow keys step through the pieces.
            {(explode > 0 || cutOn) && showJoints ? ' Joints show when the pieces are together and uncut.' : ''}
          </span>
        </div>
      </div>
      <aside aria-label="Piece details" className={stacked ? 'grid items-start gap-4 text-sm sm:grid-cols-2' : 'space-y-4 text-sm'}>
        <PiecePanel scene={scene} piece={pointed} instance={pointed ? instances.get(pointed) : undefined} joints={pointed ? (jointsOf.get(pointed) ?? []) : []} pinned={selected !== null} />
        {groupsShown ? <GroupLegend sizes={ranking.sizes} /> : null}
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
          // Scrolls when the piece has many joints, so it takes the keyboard focus too.
          <ul className="max-h-48 space-y-1 overflow-auto focus-visible:outline-2 focus-visible:outline-accent" tabIndex={0} aria-label={`Joints of ${piece}`}>
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

function GroupLegend({ sizes }: { sizes: readonly number[] }) {
  return (
    <div className="space-y-2 rounded-md border border-rule px-3 py-3" data-testid="group-legend">
      <p className="font-semibold">Connected groups ({sizes.length})</p>
      <p className="text-ink-soft">
        The pieces fall into {sizes.length} groups that are not joined to each other. The largest is blue; every warm-coloured group floats loose from it.
      </p>
      {/* Scrolls when there are many groups, so it takes the keyboard focus too. */}
      <ul className="max-h-48 space-y-0.5 overflow-auto focus-visible:outline-2 focus-visible:outline-accent" tabIndex={0} aria-label="Connected groups and their sizes">
        {sizes.map((n, i) => (
          <li key={i} className="flex items-center gap-2">
            <span aria-hidden="true" className="inline-block size-3 rounded-sm" style={{ background: groupColour(i) }} />
            <span>
              Group {i + 1}: {n} {n === 1 ? 'piece' : 'pieces'}
              {i === 0 ? ' (largest)' : ''}
              {i > LOOSE_GROUP_COLOURS.length ? ' (colour repeats)' : ''}
            </span>
          </li>
        ))}
      </ul>
    </div>
  );
}
