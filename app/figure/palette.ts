/**
 * Fourfold's region colours: one calm hue per label token, each on its own CIE 1976 lightness
 * step (L* about 31 to 92, 7.5 apart), so that every region stays distinct in greyscale print
 * and under simulated protanopia and deuteranopia (checked in test/mapDrawing.test.ts).
 * Lightness, darkest first: AF, CAF, SBxy, CDW, KD, SB, Fxy, F, sym.
 */
export const TOKEN_COLOURS: Readonly<Record<string, string>> = {
  F: '#f5ca98',
  Fxy: '#dbb4a7',
  AF: '#374d5b',
  CAF: '#415a98',
  CDW: '#b76e5d',
  KD: '#5ba09e',
  SB: '#b9a863',
  SBxy: '#33768f',
  sym: '#e7e7e7',
};

/** A token outside TOKEN_COLOURS (a label from a newer solver): a mid grey. */
export const UNKNOWN_TOKEN_COLOUR = '#a0a0a0';

/** A pixel not computed yet: a near-white neutral, lighter than every token colour. */
export const EMPTY_COLOUR = '#fcfbf9';

/** Colours of a label's tokens (a composite label has several: drawn as stripes). */
export function labelColours(label: string): string[] {
  return label.split('+').map((t) => TOKEN_COLOURS[t] ?? UNKNOWN_TOKEN_COLOUR);
}
