import { RATIO_CHANNELS, type FreeRatio } from './fitPlane';
import { ModelError, isPlainObject } from './model';
import { observationsFromJson, observationsToJson, type Observation } from './observations';
import { DEFAULT_FIT_OPTIONS, type FitOptions } from './rowPredictions';

/** A sample's observations with the fit's options, as a scenario document carries them. */
export interface ObservationSet {
  readonly rows: readonly Observation[];
  readonly options: FitOptions;
}

/**
 * The scenario document's block `fourfold.observations`:
 *   { "rows": [{ "bPerp_T": 6, "tilt_deg": 0, "valleyZeeman_meV": null, "kind": "phase",
 *                "value": "CAF", "sigma": null }, ...],
 *     "fitGaps": false, "freeRatio": null }
 */
export function observationSetToJson(set: ObservationSet): Record<string, unknown> {
  return {
    rows: observationsToJson(set.rows),
    fitGaps: set.options.fitGaps,
    freeRatio: set.options.freeRatio,
  };
}

const FIELDS = ['rows', 'fitGaps', 'freeRatio'];

/** The fit's options of a `fourfold.observations` block (its rows aside). */
export function fitOptionsFromJson(json: Record<string, unknown>, field: string): FitOptions {
  const fitGaps = json.fitGaps ?? DEFAULT_FIT_OPTIONS.fitGaps;
  if (typeof fitGaps !== 'boolean')
    throw new ModelError(`${field}.fitGaps: expected true or false`);
  const freeRatio = json.freeRatio ?? null;
  if (freeRatio !== null && !Object.hasOwn(RATIO_CHANNELS, freeRatio as string)) {
    throw new ModelError(
      `${field}.freeRatio: expected null, ${Object.keys(RATIO_CHANNELS).join(' or ')}`,
    );
  }
  return { fitGaps, freeRatio: freeRatio as FreeRatio | null };
}

/**
 * The observations of a scenario document, or null when it has none. Throws ModelError with
 * one line naming the field (and the row and column of a bad row).
 */
export function observationSetOfDocument(json: unknown, source: string): ObservationSet | null {
  if (!isPlainObject(json) || !isPlainObject(json.fourfold)) return null;
  const block = json.fourfold.observations;
  if (block === undefined) return null;
  const field = `${source}: fourfold.observations`;
  if (!isPlainObject(block)) throw new ModelError(`${field}: expected an object`);
  for (const key of Object.keys(block)) {
    if (!FIELDS.includes(key)) {
      throw new ModelError(`${field}: unknown field; it has ${FIELDS.join(', ')}`);
    }
  }
  return {
    rows: observationsFromJson(block.rows ?? [], `${field}.rows`),
    options: fitOptionsFromJson(block, field),
  };
}
