/**
 * A localStorage in memory for the unit tests (Node has none), installed when this module is
 * loaded: import it before the store module, which autosaves as it is created.
 */
export const storedItems = new Map<string, string>();

Object.assign(globalThis, {
  localStorage: {
    getItem: (key: string) => storedItems.get(key) ?? null,
    setItem: (key: string, value: string) => void storedItems.set(key, value),
    removeItem: (key: string) => void storedItems.delete(key),
  },
});
