import type { PersistStorage, StorageValue } from 'zustand/middleware';
import { isPlainObject } from '../../solver/index';

/** localStorage key of the autosave (the name stays; the format has its own number). */
export const STORAGE_KEY = 'fourfold.autosave.v1';

/**
 * Format of the autosave. 2: `setup` holds the scenario document with its Probe pins (what the
 * link and the file hold), `cut` the Cut. 1: the pins were a separate list of {id, x, y}.
 */
export const AUTOSAVE_VERSION = 2;

/** An autosave that cannot be used is copied under this prefix plus the time, never deleted. */
export const KEPT_KEY_PREFIX = 'fourfold.autosave.kept.';

/** What reading the autosave found wrong, one line, until the store reports it. */
let problem: string | null = null;
/** The text of the autosave last read, to keep aside if its content does not validate. */
let lastRead: string | null = null;

/**
 * Moves an unusable autosave under a key of its own (KEPT_KEY_PREFIX and the time), so that it
 * is neither lost nor read again, and records one line saying why and where. If the copy
 * cannot be made the original stays where it is (the next autosave replaces it).
 */
export function keepAutosaveAside(reason: string, text: string | null = lastRead): void {
  let where = 'it could not be kept (the browser storage refused it)';
  if (text !== null) {
    const key = `${KEPT_KEY_PREFIX}${new Date().toISOString()}`;
    try {
      localStorage.setItem(key, text);
      localStorage.removeItem(STORAGE_KEY);
      where = `it is kept in the browser storage under "${key}"`;
    } catch {
      // The storage is full or off: say so in the report.
    }
  }
  problem = `The autosave was not used (${reason}); ${where}.`;
}

/** The report of an unusable autosave (one line), once; null when there was none. */
export function takeAutosaveProblem(): string | null {
  const out = problem;
  problem = null;
  return out;
}

/** A format-1 autosave in format 2: its pins go into the scenario document. */
function fromVersion1(state: Record<string, unknown>): Record<string, unknown> {
  const { pins, ...rest } = state;
  if (!isPlainObject(rest.setup) || !Array.isArray(pins) || pins.length === 0) return rest;
  const list = pins.map((p: unknown) => (isPlainObject(p) ? [p.x, p.y] : p));
  const extra = isPlainObject(rest.setup.fourfold) ? rest.setup.fourfold : {};
  return { ...rest, setup: { ...rest.setup, fourfold: { ...extra, pins: list } } };
}

/**
 * The storage of the store's persist middleware: localStorage, read with care and written only
 * when the persisted part changed. An autosave that is not JSON, not an autosave, or of a
 * newer format is kept aside (`keepAutosaveAside`) and the store starts without it; the
 * browser refusing to read or write (storage off or full) is never an error of the page.
 */
export function autosaveStorage(): PersistStorage<unknown> {
  let last: string | null = null;
  // The parts last written: the persisted parts are made once per change of what they save
  // (PERSISTED in ./index.ts), so the same objects mean nothing to write, not even to serialise.
  let lastParts: Record<string, unknown> | null = null;
  return {
    getItem: (name): StorageValue<unknown> | null => {
      let text: string | null;
      try {
        text = localStorage.getItem(name);
      } catch {
        return null;
      }
      lastRead = text;
      // What the storage holds now is what was read (or, once kept aside, nothing), whatever
      // was written last.
      last = null;
      lastParts = null;
      if (text === null) return null;
      let json: unknown;
      try {
        json = JSON.parse(text);
      } catch {
        keepAutosaveAside(text === '' ? 'it is empty' : 'it is not valid JSON', text);
        return null;
      }
      if (!isPlainObject(json) || !isPlainObject(json.state)) {
        keepAutosaveAside('it is not an autosave of this app', text);
        return null;
      }
      const version = json.version;
      if (version === 1) return { state: fromVersion1(json.state), version: AUTOSAVE_VERSION };
      if (version !== AUTOSAVE_VERSION) {
        const newer = typeof version === 'number' && version > AUTOSAVE_VERSION;
        keepAutosaveAside(
          newer
            ? `it was written by a newer version of the app, format ${version}`
            : version === undefined
              ? 'it has no format number'
              : `its format ${JSON.stringify(version).slice(0, 20)} is unknown`,
          text,
        );
        return null;
      }
      return { state: json.state, version };
    },
    setItem: (name, value) => {
      const parts = isPlainObject(value.state) ? value.state : null;
      if (
        parts !== null &&
        lastParts !== null &&
        last !== null &&
        Object.keys(parts).length === Object.keys(lastParts).length &&
        Object.keys(parts).every((key) => parts[key] === lastParts![key])
      ) {
        return;
      }
      lastParts = parts;
      const text = JSON.stringify(value);
      if (text === last) return;
      last = text;
      try {
        localStorage.setItem(name, text);
      } catch {
        // Storage full or off: the link in the address bar still holds the setup.
      }
    },
    removeItem: (name) => {
      try {
        localStorage.removeItem(name);
      } catch {
        // Nothing to remove from a storage that is off.
      }
    },
  };
}
