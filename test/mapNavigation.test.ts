import { describe, expect, test } from 'vitest';
import { historyFromJson, historyToJson } from '../app/history/historyJson';
import {
  HISTORY_LIMIT,
  MERGE_MS,
  moveTo,
  recordStep,
  startHistory,
} from '../app/history/setupHistory';
import {
  boxExtent,
  fractionOf,
  panBy,
  pointAt,
  wheelFactor,
  zoomAbout,
  type PlaneExtent,
} from '../app/map/planeExtent';
import { previousExtentStep } from '../app/map/previousExtent';
import { DEMO_SETUP } from '../app/scenario/demo';
import type { Setup } from '../app/scenario/setup';

const DEMO: PlaneExtent = { x: [-2, 2], y: [-2, 2] };

function withPlane(setup: Setup, x: [number, number], y: [number, number]): Setup {
  return {
    ...setup,
    x: { ...setup.x, from: x[0], to: x[1] },
    y: { ...setup.y, from: y[0], to: y[1] },
  };
}

describe('plane extents', () => {
  test('a point and its plot fraction go back and forth (y runs up, the plot down)', () => {
    expect(pointAt(DEMO, { fx: 0, fy: 0 })).toEqual([-2, 2]);
    expect(pointAt(DEMO, { fx: 0.75, fy: 0.25 })).toEqual([1, 1]);
    expect(fractionOf(DEMO, 1, 1)).toEqual({ fx: 0.75, fy: 0.25 });
  });

  test('a zoom keeps the point under the pointer where it is on the plot', () => {
    const at = { fx: 0.75, fy: 0.25 };
    const zoomed = zoomAbout(DEMO, at, 0.8);
    expect(zoomed).toEqual({ x: [-1.4, 1.8], y: [-1.4, 1.8] });
    const [px, py] = pointAt(zoomed, at);
    expect(px).toBeCloseTo(1, 14);
    expect(py).toBeCloseTo(1, 14);
    // Out again by the inverse factor comes back.
    expect(zoomAbout(zoomed, at, 1 / 0.8)).toEqual(DEMO);
  });

  test('one wheel notch (100 px towards the user) is one zoom step in', () => {
    expect(wheelFactor(-100)).toBeCloseTo(0.8, 15);
    expect(wheelFactor(100)).toBeCloseTo(1.25, 15);
    expect(wheelFactor(-200)).toBeCloseTo(0.64, 15);
  });

  test('a box, in either drag direction, is its corners; a thin box is no zoom', () => {
    const box = { x: [-1, 1], y: [0, 1] };
    expect(boxExtent(DEMO, { fx: 0.25, fy: 0.25 }, { fx: 0.75, fy: 0.5 })).toEqual(box);
    expect(boxExtent(DEMO, { fx: 0.75, fy: 0.5 }, { fx: 0.25, fy: 0.25 })).toEqual(box);
    expect(boxExtent(DEMO, { fx: 0.2, fy: 0.2 }, { fx: 0.205, fy: 0.8 })).toBeNull();
    // Dragged beyond the plot, the box stops at its edge.
    expect(boxExtent(DEMO, { fx: -0.5, fy: 0.5 }, { fx: 0.5, fy: 1.5 })).toEqual({
      x: [-2, 0],
      y: [-2, 0],
    });
  });

  test('a pan moves the plane with the pointer, an axis running backwards too', () => {
    // A quarter of the plot to the left and up: the plane moves a quarter right and down.
    expect(panBy(DEMO, { fx: 0.5, fy: 0.5 }, { fx: 0.25, fy: 0.25 })).toEqual({
      x: [-1, 3],
      y: [-3, 1],
    });
    const backwards: PlaneExtent = { x: [2, -2], y: [-2, 2] };
    expect(panBy(backwards, { fx: 0.5, fy: 0.5 }, { fx: 0.25, fy: 0.5 })).toEqual({
      x: [1, -3],
      y: [-2, 2],
    });
  });

  test('ends are tidied to about 1e-7 of the span, never collapsed', () => {
    const z = zoomAbout({ x: [0, 0.3], y: [0, 0.3] }, { fx: 1 / 3, fy: 1 / 3 }, 0.7);
    for (const v of [...z.x, ...z.y]) expect(String(v).length).toBeLessThanOrEqual(12);
    const tiny = zoomAbout({ x: [1, 1 + 1e-9], y: [1, 1 + 1e-9] }, { fx: 0.5, fy: 0.5 }, 0.5);
    expect(tiny.x[1] - tiny.x[0]).toBeGreaterThan(0);
  });
});

describe('undo history', () => {
  const a = DEMO_SETUP;
  const b = { ...a, zeeman: 0.8 };
  const c = { ...b, zeeman: 0.9 };
  const d = withPlane(c, [-1, 1], [-1, 1]);

  test('each change is a named step; one kind within MERGE_MS merges, later it does not', () => {
    let h = startHistory(a);
    h = recordStep(h, b, 1000);
    expect(h.steps.map((s) => s.label)).toEqual(['Start', 'E_Z 0.6 → 0.8']);
    h = recordStep(h, c, 1000 + MERGE_MS);
    expect(h.steps.map((s) => s.label)).toEqual(['Start', 'E_Z 0.6 → 0.9']);
    h = recordStep(h, d, 1000 + 2 * MERGE_MS + 1);
    expect(h.steps).toHaveLength(3);
    expect(h.steps[2]!.kind).toBe('extent');
    h = recordStep(h, { ...d, zeeman: 0.5 }, 1000 + 4 * MERGE_MS, { label: 'x', kind: 'zeeman' });
    expect(h.steps).toHaveLength(4);
  });

  test('a step named by its maker keeps the name; some kinds never merge', () => {
    let h = startHistory(a);
    h = recordStep(h, b, 10, { label: 'Zoom to box', kind: 'zoom-box' });
    h = recordStep(h, c, 20, { label: 'Zoom to box', kind: 'zoom-box' });
    expect(h.steps.map((s) => s.label)).toEqual(['Start', 'Zoom to box', 'Zoom to box']);
  });

  test('undo moves back, a new change drops the steps undone; the list is bounded', () => {
    let h = startHistory(a);
    h = recordStep(h, b, 10);
    h = recordStep(h, d, 5000);
    h = moveTo(h, 1)!;
    expect(h.index).toBe(1);
    expect(moveTo(h, 1)).toBeNull();
    expect(moveTo(h, 3)).toBeNull();
    h = recordStep(h, c, 9000);
    expect(h.steps.map((s) => s.setup)).toEqual([a, b, c]);
    let long = startHistory(a);
    for (let k = 1; k <= HISTORY_LIMIT + 5; k++) {
      long = recordStep(long, { ...a, zeeman: k }, k * 10 * MERGE_MS);
    }
    expect(long.steps).toHaveLength(HISTORY_LIMIT);
    expect(long.steps[0]!.setup.zeeman).toBe(6);
    expect(long.index).toBe(HISTORY_LIMIT - 1);
  });

  test('the previous extent walks back through the extents of the history', () => {
    const e1 = withPlane(a, [-1, 1], [-1, 1]);
    const e2 = withPlane(a, [0, 1], [0, 1]);
    let h = startHistory(a);
    h = recordStep(h, e1, 10, { label: 'Zoom in', kind: 'zoom-in' });
    h = recordStep(h, e2, 20, { label: 'Zoom to box', kind: 'zoom-box' });
    const first = previousExtentStep(h, e2)!;
    expect(first).toEqual({ extent: { x: [-1, 1], y: [-1, 1] }, step: 1 });
    h = recordStep(h, e1, 30, { label: 'Back', kind: 'extent-back', backTo: first.step });
    expect(previousExtentStep(h, e1)).toEqual({ extent: DEMO, step: 0 });
  });

  test('saved and read back, it is the same history; a bad one is named in one line', () => {
    let h = startHistory(a);
    h = recordStep(h, b, 10);
    h = recordStep(h, d, 5000, { label: 'Zoom in', kind: 'zoom-in' });
    const json = JSON.parse(JSON.stringify(historyToJson(h)));
    const back = historyFromJson(json);
    expect(back.index).toBe(2);
    expect(back.steps.map((s) => [s.label, s.kind, s.setup.zeeman, s.setup.x.from])).toEqual([
      ['Start', 'start', 0.6, -2],
      ['E_Z 0.6 → 0.8', 'zeeman', 0.8, -2],
      ['Zoom in', 'zoom-in', 0.9, -1],
    ]);
    expect(() => historyFromJson({ ...json, index: 3 })).toThrow(/current step/);
    expect(() => historyFromJson({ ...json, steps: [] })).toThrow(/no steps/);
    const broken = structuredClone(json);
    broken.steps[1].scenario = { nonsense: true };
    expect(() => historyFromJson(broken)).toThrow(/^step 2/);
  });
});
