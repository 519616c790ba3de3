/**
 * Fourfold's region colours: one hue per trade-name token, spaced in lightness so that the
 * regions stay distinct in greyscale and for the common colour-vision deficiencies.
 */
export const TOKEN_COLOURS: Readonly<Record<string, string>> = {
  F: '#e3c05c',
  Fxy: '#b9a36a',
  AF: '#3d5a8c',
  CAF: '#6c4a93',
  CDW: '#c25a3c',
  KD: '#3a8c79',
  SB: '#8c8c3a',
  SBxy: '#6f7f8f',
  sym: '#d9d9d9',
};

/** Colours of a label's tokens (a composite label has several: drawn as stripes). */
export function labelColours(label: string): string[] {
  return label.split('+').map((t) => TOKEN_COLOURS[t] ?? '#a0a0a0');
}
