import type { Boundary, Plane } from '../../solver/index';

/** A point of the plane, in axis coordinates. */
export type PlanePoint = readonly [number, number];

/** One label's region: closed loops (outer loops and holes wind oppositely; fill-rule nonzero). */
export interface RegionOutline {
  readonly label: string;
  readonly loops: PlanePoint[][];
}

/** What the outlines are built from: a Map's row-major labels and its refined boundaries. */
export interface RegionSource {
  readonly plane: Plane;
  /** labels[j nx + i] at pixel centre (x[i], y[j]); resolution from the plane. */
  readonly labels: readonly string[];
  /** Polylines whose points are the located crossings on pixel edges (Boundary of the solver). */
  readonly boundaries: readonly Boundary[];
}

export interface RegionPartition {
  /** One outline per label, in order of first appearance in the labels. */
  readonly regions: RegionOutline[];
  /**
   * A boundary polyline continued at its ends the way the regions continue: to the frame when it
   * ends in the outermost half pixel, to the meeting point when it ends next to a triple point.
   */
  extend(points: readonly PlanePoint[]): PlanePoint[];
}

/**
 * Edge id (as in the solver's Crossing: 2 p to the right neighbour, 2 p + 1 to the one above) and
 * fraction along it of every boundary point, recovered from the point's position: crossings lie
 * exactly on a grid line of pixel centres. A point within rounding of a pixel centre may belong
 * to several edges: it is given to those of them that no other point claims. Points on no edge
 * between different labels are skipped.
 */
export function boundaryCrossings(source: RegionSource): {
  fractions: Map<number, number>;
  edgesOf(px: number, py: number): [number, number][];
} {
  const { x, y, resolution } = source.plane;
  const [nx, ny] = resolution;
  const dx = (x.to - x.from) / nx;
  const dy = (y.to - y.from) / ny;
  const out = new Map<number, number>();
  const labels = source.labels;
  const ambiguous: [number, number][][] = [];
  // An edge crossed by a phase narrower than a pixel holds two points (one per transition): its
  // ends' regions meet at their midpoint, and the narrow phase shows as its two boundary lines.
  const sums = new Map<number, [number, number]>();
  for (const b of source.boundaries) {
    for (const [px, py] of b.points) {
      const edges = edgesOf(px, py);
      if (edges.length === 1) {
        const [edge, t] = edges[0]!;
        const [sum, count] = sums.get(edge) ?? [0, 0];
        sums.set(edge, [sum + t, count + 1]);
      } else if (edges.length > 1) ambiguous.push(edges);
    }
  }
  for (const [edge, [sum, count]] of sums) out.set(edge, sum / count);
  for (const edges of ambiguous) {
    for (const [edge, t] of edges) if (!out.has(edge)) out.set(edge, t);
  }
  return { fractions: out, edgesOf };

  function edgesOf(px: number, py: number): [number, number][] {
    const found: [number, number][] = [];
    const fi = (px - x.from) / dx - 0.5;
    const fj = (py - y.from) / dy - 0.5;
    const near = 1e-7;
    const candidates = (f: number): number[] =>
      [...new Set([Math.floor(f), Math.round(f) - 1, Math.round(f)])].filter(
        (c) => f - c >= -near && f - c <= 1 + near,
      );
    if (Math.abs(fj - Math.round(fj)) < near) {
      const j = Math.round(fj);
      for (const i of candidates(fi)) {
        const p = j * nx + i;
        if (j >= 0 && j < ny && i >= 0 && i + 1 < nx && labels[p] !== labels[p + 1])
          found.push([2 * p, clamp01(fi - i)]);
      }
    }
    if (Math.abs(fi - Math.round(fi)) < near) {
      const i = Math.round(fi);
      for (const j of candidates(fj)) {
        const p = j * nx + i;
        if (i >= 0 && i < nx && j >= 0 && j + 1 < ny && labels[p] !== labels[p + nx])
          found.push([2 * p + 1, clamp01(fj - j)]);
      }
    }
    return found;
  }
}

function clamp01(t: number): number {
  return Math.min(1, Math.max(0, t));
}

/**
 * Splits the plot area (the full axis ranges) into one outline per label, following the located
 * boundaries. Marching squares over the cells between pixel centres, with every label kept: a
 * cell side whose two end labels differ holds a vertex at the located crossing (at its middle
 * when none was located). A cell crossed twice is cut along the chord between its two crossings;
 * a cell crossed four times by one label pair (a saddle) is cut as the solver joins its
 * boundaries there (bottom with right, top with left); any other cell (three labels meeting, or
 * four) is cut by spokes from its crossings to their mean. The half-pixel strips between the
 * outermost pixel centres and the frame are cells of the same kind whose outer corners copy the
 * nearest pixel's label; a boundary that crosses one meets the frame where its last segment,
 * continued straight, does.
 *
 * Sides shared by two cells always lie inside one label's region, so only the chords, the spokes
 * and the frame are region outline: each label's directed outline edges (counter-clockwise in
 * grid order) are chained into loops, and collinear vertices dropped.
 */
export function regionOutlines(source: RegionSource): RegionPartition {
  const { x: ax, y: ay, resolution } = source.plane;
  const [nx, ny] = resolution;
  const labels = source.labels;
  const crossings = boundaryCrossings(source);
  const fractions = crossings.fractions;
  // Extended node grid: the frame, the pixel centres, the frame.
  const NX = nx + 2;
  const NY = ny + 2;
  const X = new Float64Array(NX);
  const Y = new Float64Array(NY);
  for (let k = 0; k < NX; k++)
    X[k] =
      k === 0 ? ax.from : k === NX - 1 ? ax.to : ax.from + ((k - 0.5) * (ax.to - ax.from)) / nx;
  for (let l = 0; l < NY; l++)
    Y[l] =
      l === 0 ? ay.from : l === NY - 1 ? ay.to : ay.from + ((l - 0.5) * (ay.to - ay.from)) / ny;
  const labelAt = (k: number, l: number): string =>
    labels[Math.min(ny - 1, Math.max(0, l - 1)) * nx + Math.min(nx - 1, Math.max(0, k - 1))]!;

  // Vertex ids: nodes, then crossings on extended edges (2 node + 0 rightwards, + 1 upwards),
  // then cell centres.
  const nodeCount = NX * NY;
  const crossingBase = nodeCount;
  const centreBase = crossingBase + 2 * nodeCount;
  const centres = new Map<number, PlanePoint>();

  // Where a boundary leaves through the outermost half pixel: its last segment continued
  // straight to the frame. Keyed by the extended frame edge (2 node + up).
  const frameFractions = new Map<number, number>();
  for (const boundary of source.boundaries) {
    const pts = boundary.points;
    if (pts.length < 2) continue;
    for (const [end, nb] of [
      [pts[0]!, pts[1]!],
      [pts[pts.length - 1]!, pts[pts.length - 2]!],
    ] as const) {
      for (const [edge] of crossings.edgesOf(end[0], end[1])) {
        const pixel = edge >> 1;
        const i = pixel % nx;
        const j = Math.floor(pixel / nx);
        const up = (edge & 1) === 1;
        const along = up ? 1 : 0;
        const across = 1 - along;
        let frame: number | undefined;
        let key: number | undefined;
        if (!up && (j === 0 || j === ny - 1)) {
          frame = j === 0 ? ay.from : ay.to;
          key = 2 * ((j === 0 ? 0 : NY - 1) * NX + i + 1);
        } else if (up && (i === 0 || i === nx - 1)) {
          frame = i === 0 ? ax.from : ax.to;
          key = 2 * ((j + 1) * NX + (i === 0 ? 0 : NX - 1)) + 1;
        }
        if (frame === undefined || key === undefined) continue;
        const run = end[across]! - nb[across]!;
        const ahead = (frame - end[across]!) / run;
        if (!(ahead > 0 && Number.isFinite(ahead))) continue;
        const value = end[along]! + ahead * (end[along]! - nb[along]!);
        const node = key >> 1;
        const lo = up ? Y[Math.floor(node / NX)]! : X[node % NX]!;
        const hi = up ? Y[Math.floor(node / NX) + 1]! : X[(node % NX) + 1]!;
        frameFractions.set(key, clamp01((value - lo) / (hi - lo)));
      }
    }
  }
  /**
   * Fraction along extended edge (k, l) -> (k + 1, l) or -> (k, l + 1): that of the real edge,
   * or on the frame where a boundary was continued to it, else that of the nearest real edge.
   */
  const fractionOf = (k: number, l: number, up: boolean): number => {
    const frame = frameFractions.get(2 * (l * NX + k) + (up ? 1 : 0));
    if (frame !== undefined) return frame;
    const p = up
      ? 2 * ((l - 1) * nx + Math.min(nx - 1, Math.max(0, k - 1))) + 1
      : 2 * (Math.min(ny - 1, Math.max(0, l - 1)) * nx + (k - 1));
    return fractions.get(p) ?? 0.5;
  };
  const point = (v: number): PlanePoint => {
    if (v < crossingBase) return [X[v % NX]!, Y[Math.floor(v / NX)]!];
    if (v < centreBase) {
      const e = v - crossingBase;
      const node = e >> 1;
      const k = node % NX;
      const l = Math.floor(node / NX);
      const up = (e & 1) === 1;
      const t = fractionOf(k, l, up);
      return up
        ? [X[k]!, Y[l]! + t * (Y[l + 1]! - Y[l]!)]
        : [X[k]! + t * (X[k + 1]! - X[k]!), Y[l]!];
    }
    return centres.get(v)!;
  };

  const edgesByLabel = new Map<string, number[]>();
  const order: string[] = [];
  for (const l of labels) {
    if (!edgesByLabel.has(l)) {
      edgesByLabel.set(l, []);
      order.push(l);
    }
  }
  const addEdge = (label: string, a: number, b: number) => edgesByLabel.get(label)!.push(a, b);
  // Partner vertices of each crossing across the cells it bounds (chord end or centre), for
  // continuing boundary polylines: crossing vertex -> partners.
  const partners = new Map<number, number[]>();
  const link = (a: number, b: number) => {
    partners.set(a, [...(partners.get(a) ?? []), b]);
    partners.set(b, [...(partners.get(b) ?? []), a]);
  };

  const corner = new Array<number>(4);
  const cornerLabel = new Array<string>(4);
  const ring: number[] = [];
  const ringLabel: (string | null)[] = [];
  for (let l = 0; l + 1 < NY; l++) {
    for (let k = 0; k + 1 < NX; k++) {
      corner[0] = l * NX + k;
      corner[1] = l * NX + k + 1;
      corner[2] = (l + 1) * NX + k + 1;
      corner[3] = (l + 1) * NX + k;
      cornerLabel[0] = labelAt(k, l);
      cornerLabel[1] = labelAt(k + 1, l);
      cornerLabel[2] = labelAt(k + 1, l + 1);
      cornerLabel[3] = labelAt(k, l + 1);
      // Sides counter-clockwise: bottom, right, top, left, each with its crossing vertex.
      const sideCrossing = [
        crossingBase + 2 * corner[0],
        crossingBase + 2 * corner[1] + 1,
        crossingBase + 2 * corner[3],
        crossingBase + 2 * corner[0] + 1,
      ];
      const onFrame = [l === 0, k + 2 === NX, l + 2 === NY, k === 0];
      ring.length = 0;
      ringLabel.length = 0;
      let crossed = 0;
      for (let s = 0; s < 4; s++) {
        ring.push(corner[s]!);
        ringLabel.push(cornerLabel[s]!);
        if (cornerLabel[s] !== cornerLabel[(s + 1) % 4]) {
          ring.push(sideCrossing[s]!);
          ringLabel.push(null);
          crossed++;
        }
      }
      // Frame sides: outline of whichever label owns each part.
      for (let n = 0; n < ring.length; n++) {
        const a = ring[n]!;
        const b = ring[(n + 1) % ring.length]!;
        const side = sideOf(n);
        if (side >= 0 && onFrame[side]) {
          const owner = ringLabel[n] ?? ringLabel[(n + 1) % ring.length]!;
          addEdge(owner, a, b);
        }
      }
      if (crossed === 0) continue;
      const crossIdx = ring.map((v, n) => (ringLabel[n] === null ? n : -1)).filter((n) => n >= 0);
      const pairs = new Set([...crossIdx.map((n) => pairKey(ringLabel, n))]);
      const chords: [number, number][] = [];
      if (crossed === 2) chords.push([crossIdx[1]!, crossIdx[0]!]);
      else if (crossed === 4 && pairs.size === 1) {
        // Saddle: bottom-right and top-left joined (the solver's boundaries do the same).
        chords.push([crossIdx[1]!, crossIdx[0]!], [crossIdx[3]!, crossIdx[2]!]);
      }
      if (chords.length > 0) {
        for (const [from, to] of chords) {
          // The piece left of from -> to (ring order) lies on the ring from `to` round to `from`.
          const a = ring[from]!;
          const b = ring[to]!;
          addEdge(ringLabel[(to + 1) % ring.length]!, a, b);
          addEdge(ringLabel[(from + 1) % ring.length]!, b, a);
          link(a, b);
        }
        continue;
      }
      // Spokes to the mean of the crossings.
      const centre = centreBase + l * NX + k;
      let cx = 0;
      let cy = 0;
      for (const n of crossIdx) {
        const [px, py] = point(ring[n]!);
        cx += px;
        cy += py;
      }
      centres.set(centre, [cx / crossIdx.length, cy / crossIdx.length]);
      for (const n of crossIdx) {
        const v = ring[n]!;
        const before = ringLabel[(n + ring.length - 1) % ring.length]!;
        const after = ringLabel[(n + 1) % ring.length]!;
        // Piece after the crossing runs ring-wise from it and returns through the centre.
        addEdge(after, centre, v);
        addEdge(before, v, centre);
        link(v, centre);
      }
    }
  }

  function sideOf(n: number): number {
    // Ring position n to n + 1 lies on the side of the last corner at or before n.
    let side = -1;
    for (let m = 0; m <= n; m++) if (ringLabel[m] !== null) side++;
    return side;
  }

  const regions: RegionOutline[] = [];
  for (const label of order) {
    const edges = edgesByLabel.get(label)!;
    const next = new Map<number, number[]>();
    for (let e = 0; e < edges.length; e += 2) {
      const list = next.get(edges[e]!);
      if (list) list.push(edges[e + 1]!);
      else next.set(edges[e]!, [edges[e + 1]!]);
    }
    const loops: PlanePoint[][] = [];
    for (const start of next.keys()) {
      while ((next.get(start)?.length ?? 0) > 0) {
        const loop: number[] = [start];
        let v = next.get(start)!.pop()!;
        for (let guard = 0; v !== start && guard <= edges.length; guard++) {
          loop.push(v);
          const out = next.get(v);
          if (!out || out.length === 0) break;
          v = out.pop()!;
        }
        loops.push(simplify(loop.map(point)));
      }
    }
    regions.push({ label, loops: loops.filter((loop) => loop.length >= 3) });
  }

  const frameVertex = (v: number): boolean => {
    if (v >= centreBase) return true;
    if (v < crossingBase) return false;
    const node = (v - crossingBase) >> 1;
    const k = node % NX;
    const l = Math.floor(node / NX);
    return k === 0 || l === 0 || k === NX - 1 || l === NY - 1;
  };
  /** Crossing vertex of a boundary point (real edge 2 (j nx + i) + up -> extended node). */
  const vertexOfPoint = (p: PlanePoint): number | undefined => {
    for (const [edge] of crossings.edgesOf(p[0], p[1])) {
      const pixel = edge >> 1;
      const node = (Math.floor(pixel / nx) + 1) * NX + (pixel % nx) + 1;
      const v = crossingBase + 2 * node + (edge & 1);
      if (partners.has(v)) return v;
    }
    return undefined;
  };
  const extend = (points: readonly PlanePoint[]): PlanePoint[] => {
    const out = points.map((p) => [p[0], p[1]] as PlanePoint);
    if (points.length === 0) return out;
    const ids = points.map(vertexOfPoint);
    const ends = (at: number, neighbour: number | undefined): PlanePoint[] => {
      const v = ids[at];
      if (v === undefined) return [];
      return (partners.get(v) ?? []).filter((w) => w !== neighbour && frameVertex(w)).map(point);
    };
    const last = points.length - 1;
    if (last === 0) {
      const both = ends(0, undefined);
      return both.length === 2 ? [both[0]!, out[0]!, both[1]!] : out;
    }
    const head = ends(0, ids[1]);
    const tail = ends(last, ids[last - 1]);
    if (head.length === 1) out.unshift(head[0]!);
    if (tail.length === 1) out.push(tail[0]!);
    return out;
  };
  return { regions, extend };
}

function pairKey(ringLabel: readonly (string | null)[], n: number): string {
  const a = ringLabel[(n + ringLabel.length - 1) % ringLabel.length]!;
  const b = ringLabel[(n + 1) % ringLabel.length]!;
  return a < b ? `${a}|${b}` : `${b}|${a}`;
}

/** Drops vertices on the straight line between their neighbours (and repeated vertices). */
function simplify(loop: PlanePoint[]): PlanePoint[] {
  const out: PlanePoint[] = [];
  const n = loop.length;
  for (let m = 0; m < n; m++) {
    const prev = out.length > 0 ? out[out.length - 1]! : loop[n - 1]!;
    const here = loop[m]!;
    const next = loop[(m + 1) % n]!;
    const ux = here[0] - prev[0];
    const uy = here[1] - prev[1];
    const vx = next[0] - here[0];
    const vy = next[1] - here[1];
    const cross = ux * vy - uy * vx;
    const scale = Math.hypot(ux, uy) * Math.hypot(vx, vy);
    if (Math.abs(cross) <= 1e-9 * scale && ux * vx + uy * vy > 0) continue;
    out.push(here);
  }
  return out;
}
