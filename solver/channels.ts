/**
 * The sixteen spin-valley matrices G_ab = tau_a (x) sigma_b (public/notes.html#basis), valley
 * first, in the flavour basis |K up>, |K down>, |K' up>, |K' down>.
 *
 * A channel index is 4 a + b with a, b in 0..3 standing for the letters 0, x, y, z; index 0 is the
 * identity `00`, indices 1..15 are the 15 interaction channels. Every G_ab has exactly one
 * non-zero entry per row, so it is stored as a column index and a complex value per row.
 */

export const PAULI_LETTERS = ['0', 'x', 'y', 'z'] as const;

/** The 15 channels in index order 1..15 (index = 4 * valley + spin). */
export const CHANNELS = [
  '0x',
  '0y',
  '0z',
  'x0',
  'xx',
  'xy',
  'xz',
  'y0',
  'yx',
  'yy',
  'yz',
  'z0',
  'zx',
  'zy',
  'zz',
] as const;

export type Channel = (typeof CHANNELS)[number];

/** Number of matrices including the identity. */
export const MATRIX_COUNT = 16;

const channelIndexByName = new Map<string, number>(CHANNELS.map((name, k) => [name, k + 1]));

/** Index 1..15 of a channel name, or -1 when the name is not a channel. */
export function channelIndex(name: string): number {
  return channelIndexByName.get(name) ?? -1;
}

/** Channel name of index 1..15. */
export function channelName(index: number): Channel {
  const name = CHANNELS[index - 1];
  if (name === undefined) throw new RangeError(`no channel with index ${index}`);
  return name;
}

// Single Pauli matrices as (column, value) per row: 1, sigma_x, sigma_y, sigma_z.
const PAULI_COL = [
  [0, 1],
  [1, 0],
  [1, 0],
  [0, 1],
];
const PAULI_RE = [
  [1, 1],
  [1, 1],
  [0, 0],
  [1, -1],
];
const PAULI_IM = [
  [0, 0],
  [0, 0],
  [-1, 1],
  [0, 0],
];

/** Column of the non-zero entry of row r of G_k: `G_COL[4 k + r]`. */
export const G_COL = new Int8Array(MATRIX_COUNT * 4);
/** Real part of that entry. */
export const G_RE = new Float64Array(MATRIX_COUNT * 4);
/** Imaginary part of that entry. */
export const G_IM = new Float64Array(MATRIX_COUNT * 4);

for (let a = 0; a < 4; a++) {
  for (let b = 0; b < 4; b++) {
    const k = 4 * a + b;
    for (let v = 0; v < 2; v++) {
      for (let s = 0; s < 2; s++) {
        const row = 2 * v + s;
        const ta = PAULI_RE[a]![v]!;
        const tai = PAULI_IM[a]![v]!;
        const sb = PAULI_RE[b]![s]!;
        const sbi = PAULI_IM[b]![s]!;
        G_COL[4 * k + row] = 2 * PAULI_COL[a]![v]! + PAULI_COL[b]![s]!;
        G_RE[4 * k + row] = ta * sb - tai * sbi;
        G_IM[4 * k + row] = ta * sbi + tai * sb;
      }
    }
  }
}

function lettersAnticommute(p: number, q: number): boolean {
  return p !== 0 && q !== 0 && p !== q;
}

/**
 * `COMMUTATION_SIGN[16 k + l]` is +1 when G_k and G_l commute and -1 when they anticommute,
 * so that G_k G_l G_k = sign * G_l.
 */
export const COMMUTATION_SIGN = new Float64Array(MATRIX_COUNT * MATRIX_COUNT);
for (let k = 0; k < MATRIX_COUNT; k++) {
  for (let l = 0; l < MATRIX_COUNT; l++) {
    const flips =
      Number(lettersAnticommute(k >> 2, l >> 2)) + Number(lettersAnticommute(k & 3, l & 3));
    COMMUTATION_SIGN[16 * k + l] = flips % 2 === 0 ? 1 : -1;
  }
}

/** Index of the matrix proportional to G_k G_l (letters multiply like the Pauli group). */
export function productIndex(k: number, l: number): number {
  return (((k >> 2) ^ (l >> 2)) << 2) | ((k & 3) ^ (l & 3));
}

/** Dense 4x4 complex matrix of G_k, interleaved re/im, row-major: `[2 (4 r + c)]`. */
export function denseMatrix(k: number): Float64Array {
  const out = new Float64Array(32);
  for (let r = 0; r < 4; r++) {
    const c = G_COL[4 * k + r]!;
    out[2 * (4 * r + c)] = G_RE[4 * k + r]!;
    out[2 * (4 * r + c) + 1] = G_IM[4 * k + r]!;
  }
  return out;
}
