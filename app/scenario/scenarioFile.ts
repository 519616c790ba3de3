import { ModelError, SOFTWARE_VERSION, errorLine, isPlainObject } from '../../solver/index';
import { scenarioToSetup, setupToScenario } from './scenario';
import type { Setup } from './setup';
import { downloadText } from '../download';
import type { Pin } from '../store/probeSlice';
import { withPins } from './scenarioPins';

export const SCENARIO_FILE_NAME = 'fourfold-scenario.json';

/** A scenario is a few kilobytes; anything far larger is not one. */
export const SCENARIO_FILE_MAX_BYTES = 1_000_000;

/**
 * The scenario file: the CLI's model file with its plane (what `npm run map -- --model FILE`
 * reads), pretty-printed, plus the accepted extra field `fourfold` with the software version (and
 * the physical units, interaction ranges and Probe pins, when set).
 */
export function scenarioFileText(setup: Setup, pins: readonly Pin[] = []): string {
  const scenario = withPins(setupToScenario(setup), pins);
  const extra = isPlainObject(scenario.fourfold) ? scenario.fourfold : {};
  const document = { ...scenario, fourfold: { version: SOFTWARE_VERSION, ...extra } };
  return `${JSON.stringify(document, null, 2)}\n`;
}

/**
 * The setup of a scenario document's text (a file's, or a link's once decoded). Throws
 * ModelError with one line that starts with `source` (the file name, or "link") and names the
 * problem: bad JSON, or the field that fails validation.
 */
export function parseScenarioFile(text: string, source: string): Setup {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (error) {
    throw new ModelError(`${source}: not valid JSON (${errorLine(error)})`);
  }
  try {
    return scenarioToSetup(json);
  } catch (error) {
    if (error instanceof ModelError) throw new ModelError(`${source}: ${error.message}`);
    throw error;
  }
}

/** Starts the browser download of the scenario file. */
export function downloadScenarioFile(setup: Setup, pins: readonly Pin[] = []): void {
  downloadText(SCENARIO_FILE_NAME, scenarioFileText(setup, pins), 'application/json');
}
