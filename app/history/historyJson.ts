import { ModelError, isPlainObject } from '../../solver/index';
import { setupToScenario, type ScenarioJson } from '../scenario/scenario';
import { readScenario } from '../scenario/scenarioFile';
import type { Setup } from '../scenario/setup';
import { HISTORY_LIMIT, type HistoryStep, type SetupHistory } from './setupHistory';

/** Longest step name kept (names are made by the app; a longer one was not). */
const LABEL_MAX = 200;

/** The scenario of each setup, made once (a history holds the same setups for many saves). */
const scenarios = new WeakMap<Setup, ScenarioJson>();

function scenarioOf(setup: Setup): ScenarioJson {
  let scenario = scenarios.get(setup);
  if (scenario === undefined) {
    scenario = setupToScenario(setup);
    scenarios.set(setup, scenario);
  }
  return scenario;
}

/**
 * The history as the autosave holds it: each step's setup as its scenario document (what the
 * link and the file hold), with its name, kind and time.
 */
export function historyToJson(history: SetupHistory): Record<string, unknown> {
  return {
    index: history.index,
    steps: history.steps.map((step) => ({
      label: step.label,
      kind: step.kind,
      at: step.at,
      ...(step.backTo !== undefined ? { backTo: step.backTo } : {}),
      scenario: scenarioOf(step.setup),
    })),
  };
}

function stepFromJson(json: unknown, k: number, count: number): HistoryStep {
  const where = `step ${k + 1}`;
  if (!isPlainObject(json)) throw new ModelError(`${where}: not an object`);
  const { label, kind, at, backTo, scenario } = json;
  if (typeof label !== 'string' || label.length > LABEL_MAX) {
    throw new ModelError(`${where}: its name is not a short text`);
  }
  if (typeof kind !== 'string' || kind.length > LABEL_MAX) {
    throw new ModelError(`${where}: its kind is not a short text`);
  }
  if (typeof at !== 'number' || !Number.isFinite(at)) {
    throw new ModelError(`${where}: its time is not a number`);
  }
  if (backTo !== undefined && !(Number.isInteger(backTo) && (backTo as number) >= 0)) {
    throw new ModelError(`${where}: backTo is not a step`);
  }
  if (typeof backTo === 'number' && backTo >= count) {
    throw new ModelError(`${where}: backTo is not a step`);
  }
  // The same validation as a file or a link (and the same fit to the browser's grid).
  const { setup } = readScenario(scenario, where);
  return { setup, label, kind, at, ...(typeof backTo === 'number' ? { backTo } : {}) };
}

/**
 * A saved history read back, every step validated as a scenario is. Throws ModelError with one
 * line naming the first problem (the caller drops the history and says so).
 */
export function historyFromJson(json: unknown): SetupHistory {
  if (!isPlainObject(json)) throw new ModelError('not an object');
  const { index, steps } = json;
  if (!Array.isArray(steps) || steps.length === 0) throw new ModelError('it has no steps');
  if (steps.length > HISTORY_LIMIT) {
    throw new ModelError(`${steps.length} steps, more than the ${HISTORY_LIMIT} kept`);
  }
  if (typeof index !== 'number' || !Number.isInteger(index) || index < 0 || index >= steps.length) {
    throw new ModelError('its current step is not one of its steps');
  }
  return { steps: steps.map((s, k) => stepFromJson(s, k, steps.length)), index };
}

/** Whether two setups write the same scenario (the same model, plane and units). */
export function sameSetup(a: Setup, b: Setup): boolean {
  return a === b || JSON.stringify(scenarioOf(a)) === JSON.stringify(scenarioOf(b));
}
