import type { Crossing } from './crossings';

/** A boundary polyline between two labelled regions (the `map` output). */
export interface Boundary {
  readonly between: [string, string];
  readonly order: 'first' | 'continuous';
  readonly points: [number, number][];
}

function pairKey(c: Crossing): string {
  return c.near < c.far ? `${c.near}|${c.far}` : `${c.far}|${c.near}`;
}

/**
 * The grid cells (four pixel centres; cell p = j nx + i has pixel p at its lower left) with a
 * crossing on a side, ascending: the only cells that can link two crossings, so that a large
 * grid is not scanned cell by cell. A horizontal edge (2p) is the bottom of cell p and the top
 * of the cell below it; a vertical edge (2p + 1) the left of cell p and the right of the cell to
 * its left.
 */
function cellsWithCrossings(crossings: readonly Crossing[], nx: number, ny: number): number[] {
  const cells = new Set<number>();
  for (const { edge } of crossings) {
    const p = edge >> 1;
    const i = p % nx;
    const j = (p - i) / nx;
    if (edge % 2 === 0) {
      if (j + 1 < ny) cells.add(p);
      if (j > 0) cells.add(p - nx);
    } else {
      if (i + 1 < nx) cells.add(p);
      if (i > 0) cells.add(p - 1);
    }
  }
  return [...cells].sort((a, b) => a - b);
}

/**
 * Joins edge crossings into polylines, marching-squares style: inside each grid cell (four pixel
 * centres) the crossings of the same label pair are linked, two by two around the cell; chains of
 * links become polylines, split where the transition order changes. Polylines end next to triple
 * points, where a cell holds one crossing of a pair.
 */
export function joinBoundaries(crossings: readonly Crossing[], nx: number, ny: number): Boundary[] {
  // An edge may hold several crossings (a phase narrower than a pixel between its ends).
  const byEdge = new Map<number, number[]>();
  crossings.forEach((c, index) => byEdge.set(c.edge, [...(byEdge.get(c.edge) ?? []), index]));
  const links: number[][] = crossings.map(() => []);
  for (const p of cellsWithCrossings(crossings, nx, ny)) {
    // Around the cell: bottom, right, top, left.
    const around = [2 * p, 2 * (p + 1) + 1, 2 * (p + nx), 2 * p + 1].flatMap(
      (edge) => byEdge.get(edge) ?? [],
    );
    if (around.length < 2) continue;
    const groups = new Map<string, number[]>();
    for (const k of around) {
      const key = pairKey(crossings[k]!);
      groups.set(key, [...(groups.get(key) ?? []), k]);
    }
    for (const members of groups.values()) {
      for (let m = 0; m + 1 < members.length; m += 2) {
        links[members[m]!]!.push(members[m + 1]!);
        links[members[m + 1]!]!.push(members[m]!);
      }
    }
  }
  const visited = new Uint8Array(crossings.length);
  const chains: number[][] = [];
  const walk = (start: number): number[] => {
    const chain = [start];
    visited[start] = 1;
    let current = start;
    for (;;) {
      const next = links[current]!.find((k) => visited[k] === 0);
      if (next === undefined) break;
      visited[next] = 1;
      chain.push(next);
      current = next;
    }
    return chain;
  };
  // Open chains first (from an end), then closed loops.
  crossings.forEach((_, k) => {
    if (visited[k] === 0 && links[k]!.length <= 1) chains.push(walk(k));
  });
  crossings.forEach((_, k) => {
    if (visited[k] === 0) {
      const loop = walk(k);
      if (links[loop[loop.length - 1]!]!.includes(k) && loop.length > 2) loop.push(k);
      chains.push(loop);
    }
  });
  const out: Boundary[] = [];
  for (const chain of chains) {
    // A single crossing typed unlike both its neighbours along the chain takes their type: it
    // sits where the line passes (within rounding) through a pixel centre, whose own state is
    // then already on the transition and shows no jump; the line's type is its neighbours'.
    const order = chain.map((k) => crossings[k]!.order);
    for (let m = 1; m + 1 < chain.length; m++) {
      if (order[m - 1] === order[m + 1] && order[m] !== order[m - 1]) order[m] = order[m - 1]!;
    }
    const orderOf = new Map(chain.map((k, m) => [k, order[m]!]));
    let run: number[] = [chain[0]!];
    const flush = () => {
      const first = crossings[run[0]!]!;
      const [a, b] = pairKey(first).split('|') as [string, string];
      const firstOrder = run.filter((k) => orderOf.get(k) === 'first').length;
      out.push({
        between: [a, b],
        order: firstOrder * 2 >= run.length ? 'first' : 'continuous',
        points: run.map((k) => [crossings[k]!.x, crossings[k]!.y]),
      });
    };
    for (let m = 1; m < chain.length; m++) {
      const k = chain[m]!;
      if (orderOf.get(k) !== orderOf.get(run[run.length - 1]!) && run.length > 1) {
        flush();
        run = [run[run.length - 1]!];
      }
      run.push(k);
    }
    flush();
  }
  return out;
}
