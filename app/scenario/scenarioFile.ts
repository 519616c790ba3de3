import { ModelError, SOFTWARE_VERSION, errorLine, isPlainObject } from '../../solver/index';
import { scenarioToSetup, setupToScenario } from './scenario';
import type { Setup } from './setup';
import { downloadText } from '../download';
import type { Pin } from '../store/probeSlice';
import { pinsOfScenario, withPins } from './scenarioPins';
import { fitSetupToApp } from './setupCheck';

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

/** The JSON of a scenario's text; ModelError "source: not valid JSON (...)" when it is not. */
export function scenarioJson(text: string, source: string): unknown {
  try {
    return JSON.parse(text);
  } catch (error) {
    throw new ModelError(`${source}: not valid JSON (${errorLine(error)})`);
  }
}

/** The setup of a scenario document; ModelError with one line that starts with `source`. */
function setupOf(json: unknown, source: string): Setup {
  try {
    return scenarioToSetup(json);
  } catch (error) {
    if (error instanceof ModelError) throw new ModelError(`${source}: ${error.message}`);
    throw error;
  }
}

/**
 * The setup of a scenario document's text (a file's, or a link's once decoded). Throws
 * ModelError with one line that starts with `source` (the file name, or "link") and names the
 * problem: bad JSON, or the field that fails validation.
 */
export function parseScenarioFile(text: string, source: string): Setup {
  return setupOf(scenarioJson(text, source), source);
}

/** A scenario as the app takes it in: the setup fitted to the browser, the pins, and a note. */
export interface LoadedScenario {
  readonly setup: Setup;
  /** The Probe pins it carries (null when none). */
  readonly pins: Pin[] | null;
  /** What was changed to fit the browser (the grid), or null. */
  readonly note: string | null;
}

/**
 * The one way a scenario document comes in, from a file, the link or the autosave: validated
 * in full (setup and pins; ModelError with one line starting with `source` when it is not
 * valid, nothing partial), then fitted to the browser (`fitSetupToApp`).
 */
export function readScenario(json: unknown, source: string): LoadedScenario {
  const setup = setupOf(json, source);
  const pins = pinsOfScenario(json, source);
  const fitted = fitSetupToApp(setup);
  return { setup: fitted.setup, pins, note: fitted.note };
}

/** Starts the browser download of the scenario file. */
export function downloadScenarioFile(setup: Setup, pins: readonly Pin[] = []): void {
  downloadText(SCENARIO_FILE_NAME, scenarioFileText(setup, pins), 'application/json');
}
