import { describe, expect, test } from 'vitest';
import {
  coarseLayout,
  nodeRange,
  parseMapInput,
  previewFrames,
  PREVIEW_FRAMES,
  QUICK_SEARCH,
  seededRandom,
  solveCoarseNodes,
} from '../solver/index';
import { randomMapDocument } from './fixtures';

/**
 * The first look after a small change of the setup (solver/coarseNodes.ts, `continuedNode`):
 * every node continues its previous state and its neighbours', and falls back to the search
 * when that fails its check. It is followed by the full search in the app, but what it shows
 * must already be the ground state.
 */
describe('coarse preview by continuation', () => {
  test('previewFrames gathers each node and its four neighbours (itself at the edge)', () => {
    const layout = { cols: [0, 1, 2], rows: [0, 1] };
    // Node n's frame is filled with n.
    const previous = new Float64Array(32 * 6).map((_, r) => Math.floor(r / 32));
    const out = previewFrames(layout, previous, [0, 4]);
    const firsts = (n: number) =>
      Array.from({ length: PREVIEW_FRAMES }, (_, k) => out[32 * (PREVIEW_FRAMES * n + k)]);
    // Node 0 at (0, 0): left is itself, right 1, below itself, above 3.
    expect(firsts(0)).toEqual([0, 0, 1, 0, 3]);
    // Node 4 at (1, 1): left 3, right 5, below 1, above itself.
    expect(firsts(1)).toEqual([4, 3, 5, 1, 4]);
  });

  test('random maps after a slider step, a substrate step or a pan: every node is the full search', () => {
    const random = seededRandom(2026);
    let nodes = 0;
    let searched = 0;
    for (let m = 0; m < 12; m++) {
      const document = randomMapDocument(random) as {
        zeeman: number;
        valleyZeeman: number;
        plane: { x: { from: number }; resolution: number[] };
      };
      document.plane.resolution = [20, 20];
      const step = 0.01 + 0.05 * random();
      const changed =
        m % 3 === 0
          ? { ...document, zeeman: document.zeeman + step }
          : m % 3 === 1
            ? { ...document, valleyZeeman: document.valleyZeeman - 2 * step }
            : {
                ...document,
                plane: {
                  ...document.plane,
                  x: { ...document.plane.x, from: document.plane.x.from + 4 * step },
                },
              };
      const before = parseMapInput(document);
      const after = parseMapInput(changed);
      const layout = coarseLayout(before);
      const ids = nodeRange(0, layout.cols.length * layout.rows.length);
      const previous = solveCoarseNodes(before, ids);
      const full = solveCoarseNodes(after, ids);
      const preview = solveCoarseNodes(
        after,
        ids,
        QUICK_SEARCH,
        previous.frames,
        previewFrames(layout, previous.frames, ids),
      );
      for (let n = 0; n < ids.length; n++) {
        // Energies to 1e-9 of the couplings' size (at most 2 in these documents), labels equal.
        expect(preview.energy[n]!).toBeLessThan(full.energy[n]! + 2e-9);
        expect(preview.labels[n]).toBe(full.labels[n]);
      }
      nodes += ids.length;
      searched += preview.searched;
    }
    // The continuation carries most nodes (measured: about 5 % searched over 90 such maps).
    expect(searched).toBeLessThan(0.25 * nodes);
  });
});
