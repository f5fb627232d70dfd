/**
 * The model's colours, one list for every picture of a design: the 3-D viewer
 * (src/features/viewer/palette.ts re-exports these) and the revision thumbnails
 * (shared/engine/thumbnail.ts).
 *
 * Family colours follow the usual principles for colour-blind legibility (common practice, no
 * source): hues spread over blue / orange / yellow / purple axes rather than red against green,
 * and every neighbour also differs in lightness, so the families still separate in greyscale.
 * Warm, earthy values to sit on the paper background.
 */
export const FAMILY_COLOURS = ['#c8733a', '#3d78a3', '#d8b043', '#2e8470', '#9c5a8c', '#7a6448'] as const;

/** The warm paper background of the model. */
export const PAPER = '#f4efe4';
/** Dark ink: text, outlines, the corner joint marker. */
export const INK = '#1f2a33';

/** The colour of family `index` (design order); past the list the colours repeat. */
export function familyColour(index: number): string {
  return FAMILY_COLOURS[((index % FAMILY_COLOURS.length) + FAMILY_COLOURS.length) % FAMILY_COLOURS.length];
}

/** `#rrggbb` as [r, g, b] bytes; anything else is an error (the palette only holds such values). */
export function rgbOf(hex: string): readonly [number, number, number] {
  const m = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(hex);
  if (!m) throw new Error(`not a #rrggbb colour: ${hex}`);
  return [parseInt(m[1], 16), parseInt(m[2], 16), parseInt(m[3], 16)];
}
