import { EMPTY_COLOUR, labelColours } from '../figure/palette';
import { gridColumn, gridRow } from './plotPixels';

/** An RGBA buffer in device pixels, as in the DOM's ImageData (byteOffset a multiple of 4). */
export interface RegionImage {
  readonly data: Uint8ClampedArray;
  readonly width: number;
  readonly height: number;
}

/** What drawRegions reads from a Map grid: row-major labels, row j = 0 at the bottom. */
export interface RegionGrid {
  readonly nx: number;
  readonly ny: number;
  /** labels[j nx + i]; '' for a pixel not computed yet. */
  readonly labels: readonly string[];
}

export interface RegionPalette {
  /** '#rrggbb' colours of a label's tokens: one for a plain label, several for a composite. */
  coloursOf(label: string): readonly string[];
  /** Colour of a pixel not computed yet. */
  readonly empty: string;
}

export const REGION_PALETTE: RegionPalette = { coloursOf: labelColours, empty: EMPTY_COLOUR };

export interface RegionDrawOptions {
  readonly palette?: RegionPalette;
  /**
   * Width of one stripe of a composite label, in device pixels along a canvas row (default 4).
   * Stripes run diagonally (bottom-left to top-right) through canvas coordinates, so they stay
   * crisp at any grid resolution; a two-token label repeats every 2 stripeWidth.
   */
  readonly stripeWidth?: number;
}

const LITTLE_ENDIAN = new Uint8Array(new Uint32Array([1]).buffer)[0] === 1;

/** '#rgb' or '#rrggbb' as one opaque RGBA pixel in the platform's byte order. */
function packedColour(hex: string): number {
  const h = hex.length === 4 ? hex.replace(/[0-9a-f]/gi, (c) => c + c) : hex;
  const r = parseInt(h.slice(1, 3), 16);
  const g = parseInt(h.slice(3, 5), 16);
  const b = parseInt(h.slice(5, 7), 16);
  if (!(r >= 0 && g >= 0 && b >= 0)) throw new Error(`drawRegions: not a colour: ${hex}`);
  return LITTLE_ENDIAN
    ? ((255 << 24) | (b << 16) | (g << 8) | r) >>> 0
    : ((r << 24) | (g << 16) | (b << 8) | 255) >>> 0;
}

/**
 * Fills `image` with the Map's regions: canvas pixel (px, py) shows grid pixel
 * i = floor(px nx / width), j = ny - 1 - floor(py ny / height). Plain labels are flat colours,
 * composite labels ('CDW+SBxy') diagonal stripes of their tokens' colours, pixels not computed
 * yet the palette's empty colour. One table lookup per grid pixel where the label changes along
 * the grid, none per canvas pixel; a canvas row that shows the same grid row as the one above,
 * without stripes, is a copy of it.
 */
export function drawRegions(
  image: RegionImage,
  grid: RegionGrid,
  options: RegionDrawOptions = {},
): void {
  const { width, height } = image;
  const { nx, ny, labels } = grid;
  const palette = options.palette ?? REGION_PALETTE;
  const stripeWidth = Math.max(1, Math.round(options.stripeWidth ?? 4));

  // Each distinct label becomes a style: a run of `count` colours starting at `first`.
  const styleOfLabel = new Map<string, number>();
  const first: number[] = [];
  const count: number[] = [];
  const colours: number[] = [];
  const styleOf = new Int32Array(nx * ny);
  // Grid rows holding a composite label: their canvas rows differ along the stripes.
  const striped = new Uint8Array(ny);
  let previous: string | undefined;
  let style = -1;
  for (let p = 0; p < nx * ny; p++) {
    const label = labels[p] ?? '';
    if (label !== previous) {
      previous = label;
      const known = styleOfLabel.get(label);
      if (known === undefined) {
        const hexes = label === '' ? [palette.empty] : palette.coloursOf(label);
        style = first.length;
        styleOfLabel.set(label, style);
        first.push(colours.length);
        count.push(hexes.length);
        for (const hex of hexes) colours.push(packedColour(hex));
      } else style = known;
    }
    styleOf[p] = style;
    if (count[style]! > 1) striped[Math.floor(p / nx)] = 1;
  }
  const firstOf = Int32Array.from(first);
  const countOf = Int32Array.from(count);
  const colourAt = Uint32Array.from(colours);

  // Canvas columns [spanStart[i], spanStart[i + 1]) show grid column i.
  const spanStart = new Int32Array(nx + 1);
  for (let px = 0, i = 0; px <= width; px++) {
    const column = px === width ? nx : gridColumn(px, width, nx);
    while (i <= column) spanStart[i++] = px;
  }

  const out = new Uint32Array(image.data.buffer, image.data.byteOffset, width * height);
  let shownRow = -1;
  for (let py = 0, o = 0; py < height; py++, o += width) {
    const row = gridRow(py, height, ny);
    if (row === shownRow && striped[row] === 0) {
      out.copyWithin(o, o - width, o);
      continue;
    }
    shownRow = row;
    const rowStart = row * nx;
    // Runs of grid pixels with one style: a fill for a flat colour, stripes pixel by pixel.
    for (let i = 0; i < nx;) {
      const s = styleOf[rowStart + i]!;
      let end = i + 1;
      while (end < nx && styleOf[rowStart + end] === s) end++;
      const from = spanStart[i]!;
      const to = spanStart[end]!;
      const n = countOf[s]!;
      if (n === 1) out.fill(colourAt[firstOf[s]!]!, o + from, o + to);
      else {
        for (let px = from; px < to; px++) {
          out[o + px] = colourAt[firstOf[s]! + (Math.floor((px + py) / stripeWidth) % n)]!;
        }
      }
      i = end;
    }
  }
}
