// The viewer's own colours. The family colours, the paper and the ink live in
// shared/engine/palette.ts (the revision thumbnails draw with the same list); the viewer's
// states and joint markers stay here. Joint markers use ink, near-white and pale tints, so they
// stand out on every family.
export { FAMILY_COLOURS, INK, PAPER, familyColour } from '../../../shared/engine/palette.js';

export const HOVER = '#f2e6c2';
/** A selected piece turns pale paper-white: unlike every family colour, whatever its hue. */
export const SELECTED = '#fbf3d5';
export const PROBLEM = '#b3261e';

/** Marker shapes of the joint overlay: the shape carries the kind, colour only repeats it. */
export type MarkerShape = 'square' | 'triangle' | 'cross' | 'circle' | 'bar';

export interface JointStyle {
  readonly kind: string;
  readonly label: string;
  readonly shape: MarkerShape;
  readonly shapeLabel: string;
  readonly colour: string;
}

export const JOINT_STYLES: readonly JointStyle[] = [
  { kind: 'corner', label: 'Corner', shape: 'square', shapeLabel: 'cube', colour: '#1f2a33' },
  { kind: 'mortise-and-tenon', label: 'Mortise and tenon', shape: 'triangle', shapeLabel: 'pyramid', colour: '#fffaf0' },
  { kind: 'cross-lap', label: 'Cross-lap', shape: 'cross', shapeLabel: 'cross', colour: '#9fd6e3' },
  { kind: 'through-slot', label: 'Through-slot', shape: 'circle', shapeLabel: 'ball', colour: '#d9c2f0' },
  { kind: 'locked-crossing', label: 'Locked crossing', shape: 'bar', shapeLabel: 'bar across the line', colour: PROBLEM },
];

export function jointStyle(kind: string): JointStyle | undefined {
  return JOINT_STYLES.find((s) => s.kind === kind);
}

/**
 * Connected-group colours: the largest group takes the calm blue of the family palette, every
 * loose group a warm tint (ochres, rusts, clay), each tint differing from its neighbours in
 * lightness too (common practice, no source). Past the list the warm tints repeat.
 */
export const MAIN_GROUP = '#3d78a3';
export const LOOSE_GROUP_COLOURS = ['#d9822b', '#b8452f', '#e3b23c', '#8f4a26', '#f0a37a', '#c2692f', '#e8cf8a', '#a3332a'] as const;

/** Colour of a group by its rank (0 = largest). */
export function groupColour(rank: number): string {
  if (rank <= 0) return MAIN_GROUP;
  return LOOSE_GROUP_COLOURS[(rank - 1) % LOOSE_GROUP_COLOURS.length];
}

/** How far a piece outside the shown finding fades towards the paper (0 = not at all). */
export const DIM_TOWARDS_PAPER = 0.78;
