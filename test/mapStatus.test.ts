import { describe, expect, test } from 'vitest';
import { createStore } from 'zustand/vanilla';
import { workerNotice } from '../app/status/workerNotice';
import { createMapSlice, type MapPhase, type MapSlice } from '../app/store/mapSlice';

/** The store's map slice alone. */
function mapStore() {
  return createStore<MapSlice>()((...a) =>
    createMapSlice(...(a as unknown as Parameters<typeof createMapSlice>)),
  );
}

describe('the Map status line (app/store/mapSlice.ts, app/status/workerNotice.ts)', () => {
  test('the phase of one job only moves forward; a new job starts over', () => {
    const store = mapStore();
    const shown: MapPhase[] = [];
    const set = (patch: Parameters<MapSlice['setMap']>[0]) => {
      store.getState().setMap(patch);
      shown.push(store.getState().map.phase);
    };
    // What the scheduler reports in one job: the remaining coarse nodes arrive after the first
    // coarse frame has moved the status on to refining.
    set({ job: 1, phase: 'coarse' });
    set({ phase: 'refining' });
    set({ phase: 'coarse' });
    set({ phase: 'refining' });
    set({ phase: 'boundaries' });
    set({ phase: 'refining' });
    set({ phase: 'done' });
    set({ problem: 'late news' });
    expect(shown).toEqual([
      'coarse',
      'refining',
      'refining',
      'refining',
      'boundaries',
      'boundaries',
      'done',
      'done',
    ]);
    // The next job (a setup change) begins at its own start, and the same job number again
    // does not.
    set({ job: 2, phase: 'coarse' });
    set({ job: 2, phase: 'idle' });
    expect(shown.slice(-2)).toEqual(['coarse', 'coarse']);
  });

  test('news of the workers is one sentence that names the reason', () => {
    expect(workerNotice({ kind: 'replaced', reason: 'the worker gave no answer for 2 s' }, 1)).toBe(
      'A map worker was replaced (the worker gave no answer for 2 s); its tasks were run again.',
    );
    expect(workerNotice({ kind: 'replaced', reason: 'the worker failed to load' }, 3)).toBe(
      '3 map workers were replaced so far (the last one: the worker failed to load); their tasks were run again.',
    );
    expect(workerNotice({ kind: 'fallback', reason: 'the worker failed to load' }, 0)).toMatch(
      /^The map workers could not start \(the worker failed to load\): maps are computed on this page instead/,
    );
  });
});
