// The viewer's own colours. Family colours follow the usual principles for colour-blind
// legibility (common practice, no source): hues spread over blue / orange / yellow / purple axes
// rather than red against green, and every neighbour also differs in lightness, so the families
// still separate in greyscale. Warm, earthy values to sit on the paper background.
// Joint markers use ink, near-white and pale tints instead, so they stand out on every family.
export const FAMILY_COLOURS = ['#c8733a', '#3d78a3', '#d8b043', '#2e8470', '#9c5a8c', '#7a6448'] as const;

export const PAPER = '#f4efe4';
export const INK = '#1f2a33';
export const HOVER = '#f2e6c2';
/** A selected piece turns pale paper-white: unlike every family colour, whatever its hue. */
export const SELECTED = '#fbf3d5';
export const PROBLEM = '#b3261e';

export function familyColour(index: number): string {
  return FAMILY_COLOURS[((index % FAMILY_COLOURS.length) + FAMILY_COLOURS.length) % FAMILY_COLOURS.length];
}

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
