import { storedItems } from './memoryStorage';
import { afterEach, beforeEach, describe, expect, test, vi } from 'vitest';
import { DEMO_SETUP } from '../app/scenario/demo';
import { setupToScenario } from '../app/scenario/scenario';
import { AUTOSAVE_VERSION, KEPT_KEY_PREFIX, STORAGE_KEY } from '../app/store/autosave';
import { useFourfold } from '../app/store/index';

function kept(): string[] {
  return [...storedItems.entries()]
    .filter(([k]) => k.startsWith(KEPT_KEY_PREFIX))
    .map(([, v]) => v);
}

/** Puts `text` in the autosave and reads it back as a start of the app does. */
async function startWith(text: string): Promise<void> {
  storedItems.set(STORAGE_KEY, text);
  await useFourfold.persist.rehydrate();
}

const errors = vi.spyOn(console, 'error');

beforeEach(() => {
  for (const key of [...storedItems.keys()]) storedItems.delete(key);
  useFourfold.getState().replaceSetup(DEMO_SETUP);
  useFourfold.getState().replacePins([]);
  useFourfold.getState().setNotice(null);
  errors.mockClear();
});

afterEach(() => {
  expect(errors).not.toHaveBeenCalled();
});

describe('an autosave that cannot be used is kept aside and reported in one line', () => {
  test.each([
    ['not json {', 'it is not valid JSON'],
    ['', 'it is empty'],
    ['[1, 2]', 'it is not an autosave of this app'],
    [JSON.stringify({ state: { setup: {} }, version: 99 }), 'written by a newer version'],
    [JSON.stringify({ state: { setup: {} } }), 'it has no format number'],
  ])('%j', async (text, reason) => {
    await startWith(text);
    const notice = useFourfold.getState().view.notice!;
    expect(notice.kind).toBe('error');
    expect(notice.text).toContain(reason);
    expect(notice.text).toContain(KEPT_KEY_PREFIX);
    expect(notice.text).not.toContain('\n');
    expect(kept()).toEqual([text]);
    expect(useFourfold.getState().setup).toEqual(DEMO_SETUP);
    // It was moved under its own key; the next change of the store autosaves afresh.
    expect(storedItems.has(STORAGE_KEY)).toBe(false);
    useFourfold.getState().setHover({ i: 1, j: 2 });
    expect(JSON.parse(storedItems.get(STORAGE_KEY)!).version).toBe(AUTOSAVE_VERSION);
  });

  test('a stored scenario that does not validate, naming the field', async () => {
    const bad = { ...setupToScenario(DEMO_SETUP), channels: { q9: 1 } };
    const text = JSON.stringify({ state: { setup: bad, cut: null }, version: AUTOSAVE_VERSION });
    await startWith(text);
    const notice = useFourfold.getState().view.notice!;
    expect(notice.text).toMatch(/^The autosave was not used \(autosave: channels\.q9: unknown/);
    expect(kept()).toEqual([text]);
  });
});

describe('a usable autosave', () => {
  test('is read by the same reader as a file or a link: a grid beyond the browser is cut, and said', async () => {
    const big = setupToScenario({ ...DEMO_SETUP, zeeman: 0.8, resolution: [2048, 2048] });
    await startWith(
      JSON.stringify({ state: { setup: big, cut: null }, version: AUTOSAVE_VERSION }),
    );
    const { setup, view } = useFourfold.getState();
    expect(setup.resolution).toEqual([512, 512]);
    expect(setup.zeeman).toBe(0.8);
    expect(view.notice).toEqual({
      kind: 'info',
      text: 'Setup from the autosave: resolution 2048 × 2048 reduced to 512 × 512, the most the browser maps (npm run map takes the full grid).',
    });
    expect(kept()).toEqual([]);
  });

  test('of format 1 (pins kept apart) is read with its pins', async () => {
    const v1 = {
      state: {
        setup: setupToScenario({ ...DEMO_SETUP, zeeman: 0.7 }),
        pins: [
          { id: 4, x: 0.5, y: 1 },
          { id: 9, x: -1, y: 0.25 },
        ],
        cut: { spec: null, n: 300 },
      },
      version: 1,
    };
    await startWith(JSON.stringify(v1));
    const state = useFourfold.getState();
    expect(state.setup.zeeman).toBe(0.7);
    expect(state.probe.pins).toEqual([
      { id: 1, x: 0.5, y: 1 },
      { id: 2, x: -1, y: 0.25 },
    ]);
    expect(state.cut.n).toBe(300);
    expect(state.view.notice).toBeNull();
    // Written back in the current format, pins inside the scenario.
    useFourfold.getState().setHover({ i: 1, j: 2 });
    const stored = JSON.parse(storedItems.get(STORAGE_KEY)!);
    expect(stored.version).toBe(AUTOSAVE_VERSION);
    expect(stored.state.setup.fourfold.pins).toEqual([
      [0.5, 1],
      [-1, 0.25],
    ]);
  });
});
