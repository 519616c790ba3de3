import { ModelError, isPlainObject } from '../../solver/index';
import { MAX_PINS, type Pin } from '../store/probeSlice';

/**
 * Probe pins in a scenario document: `"fourfold": { "pins": [[x, y], ...] }`, plane coordinates
 * in pin order. They ride in the scenario file and the link, never in the model the workers
 * solve, so pinning a point does not restart the Map.
 */
export function pinsToScenario(pins: readonly Pin[]): [number, number][] {
  return pins.map((p) => [p.x, p.y]);
}

/** Adds the pins to a scenario document's `fourfold` block (nothing when there are none). */
export function withPins<T extends Record<string, unknown>>(document: T, pins: readonly Pin[]): T {
  if (pins.length === 0) return document;
  const extra = isPlainObject(document.fourfold) ? document.fourfold : {};
  return { ...document, fourfold: { ...extra, pins: pinsToScenario(pins) } };
}

/**
 * The pins of a scenario document's text, numbered from 1; null when it holds none. Throws
 * ModelError with one line starting with `source` that names the bad entry.
 */
export function pinsOfScenarioText(text: string, source: string): Pin[] | null {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch {
    throw new ModelError(`${source}: not valid JSON`);
  }
  return pinsOfScenario(json, source);
}

/** The pins of a scenario document, as `pinsOfScenarioText`. */
export function pinsOfScenario(json: unknown, source: string): Pin[] | null {
  if (!isPlainObject(json) || !isPlainObject(json.fourfold) || json.fourfold.pins === undefined) {
    return null;
  }
  const list = json.fourfold.pins;
  if (!Array.isArray(list)) {
    throw new ModelError(`${source}: fourfold.pins: expected a list of [x, y] points`);
  }
  if (list.length > MAX_PINS) {
    throw new ModelError(`${source}: fourfold.pins: ${list.length} points; at most ${MAX_PINS}`);
  }
  return list.map((point: unknown, k) => {
    if (
      !Array.isArray(point) ||
      point.length !== 2 ||
      !point.every((v) => typeof v === 'number' && Number.isFinite(v))
    ) {
      throw new ModelError(
        `${source}: fourfold.pins[${k}]: expected [x, y] with two finite numbers`,
      );
    }
    return { id: k + 1, x: point[0] as number, y: point[1] as number };
  });
}
