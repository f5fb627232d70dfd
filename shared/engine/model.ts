/**
 * The engine's vocabulary: what a design becomes once it is validated (families resolved to
 * normals, motifs flattened to polygons) and what the audit returns (FORMAT.md §2–§5).
 */
import type { PlaneFrame } from './frames.js';
import type { Mat2 } from './orbits.js';
import type { Vec2, Vec3 } from './vec.js';

/** A closed ring of 2-D points, implicitly closed (last point ≠ first). */
export type Ring = readonly Vec2[];

/** A polygon with holes, in a plane's 2-D frame. Outer ring counter-clockwise, holes clockwise. */
export interface Polygon2 {
  readonly outer: Ring;
  readonly holes: readonly Ring[];
}

export type JointKind = 'corner' | 'mortise-and-tenon' | 'cross-lap' | 'through-slot' | 'locked-crossing';
export const JOINT_KINDS: readonly JointKind[] = ['corner', 'mortise-and-tenon', 'cross-lap', 'through-slot', 'locked-crossing'];

export type Severity = 'error' | 'warning' | 'info';

export type FindingCode =
  | 'non-orthogonal-contact'
  | 'locked-crossing'
  | 'disconnected'
  | 'slab-clash'
  | 'mortise-splits-piece'
  | 'piece-exceeds-sheet'
  | 'sheet-limit-exceeded'
  | 'short-joint'
  | 'slot-near-edge'
  | 'thin-feature'
  | 'coplanar-merge'
  | 'group-not-allowed'
  | 'family-not-allowed'
  | (string & {});

/** A design after validation: every family has a unit normal, every motif polygons. */
export interface ResolvedFamily {
  readonly id: string;
  /** The fold when the family was given by `axis`, else null. */
  readonly axis: number | null;
  readonly normal: Vec3;
  readonly offset: number;
}

export interface ResolvedMotif {
  readonly id: string;
  readonly family: string;
  /** The motif in its family's representative frame; one polygon (outline plus holes). */
  readonly polygon: Polygon2;
}

export interface Material {
  readonly name: string;
  readonly thickness: number;
  readonly kerf: number;
}

export interface Constraints {
  readonly sheet?: readonly [number, number];
  readonly maxSheets?: number;
  readonly angleToleranceDeg?: number;
  readonly minJointLength?: number;
}

export interface ResolvedDesign {
  readonly title: string;
  readonly symmetry: string;
  readonly material: Material;
  readonly families: readonly ResolvedFamily[];
  readonly motifs: readonly ResolvedMotif[];
  readonly constraints: Constraints;
}

/** One cut part: a connected region of the union of a motif's images on one plane. */
export interface Piece {
  /** Stable id: `<motif>-<nn>`, numbered from 01 in orbit-plane order, then region order. */
  readonly id: string;
  readonly motif: string;
  readonly family: string;
  /** Index of the plane in the family's orbit. */
  readonly plane: number;
  readonly frame: PlaneFrame;
  /** The region in the plane's frame. */
  readonly polygon: Polygon2;
  /** Group elements whose image of the motif contributes to this piece. */
  readonly elements: readonly number[];
  /** Map from the motif's frame into this piece's frame, for the first contributing element. */
  readonly map: Mat2;
  /** Index into the templates list. */
  readonly template: number;
}

export interface Template {
  readonly index: number;
  /** The piece whose outline is the cutting shape. */
  readonly representative: string;
  readonly pieces: readonly string[];
  readonly count: number;
}

export interface Joint {
  readonly a: string;
  readonly b: string;
  readonly kind: JointKind;
  readonly angleDeg: number;
  readonly length: number;
  readonly orthogonal: boolean;
  /** End points of the joint segment in world coordinates. */
  readonly from: Vec3;
  readonly to: Vec3;
  /** For mortise-and-tenon: the piece carrying the tenon. */
  readonly tenon?: string;
  /**
   * Where material must be removed to make the joint, one entry per slotted piece, as a
   * segment on the joint line (world coordinates); the slot is as wide as the mating piece is
   * thick. mortise-and-tenon: the mortise piece over the whole segment; cross-lap: each piece
   * from its own end of the segment to the midpoint; through-slot: the outer piece over the whole
   * segment; corner and locked-crossing: none.
   */
  readonly slots: readonly JointSlot[];
}

export interface JointSlot {
  readonly piece: string;
  readonly from: Vec3;
  readonly to: Vec3;
}

export interface Finding {
  readonly code: FindingCode;
  readonly severity: Severity;
  readonly message: string;
  readonly pieces: readonly string[];
}

export interface SheetEstimate {
  readonly size: readonly [number, number];
  readonly count: number;
  readonly utilization: number;
}

/** The audit report of FORMAT.md §5; extra keys may be added, these keep their meaning. */
export interface AuditReport {
  readonly ok: boolean;
  readonly group: string;
  readonly order: number;
  readonly pieces: number;
  readonly templates: number;
  readonly joints: readonly Joint[];
  readonly summary: {
    readonly joints: number;
    readonly orthogonal: number;
    readonly nonOrthogonal: number;
    readonly byKind: Readonly<Record<JointKind, number>>;
  };
  readonly components: number;
  readonly findings: readonly Finding[];
  readonly sheets?: SheetEstimate;
}
