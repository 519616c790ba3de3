import { describe, expect, test } from 'vitest';
import { DEMO_SETUP } from '../app/scenario/demo';
import { DEFAULT_PHYSICAL, derivedSetup, physicalScales } from '../app/scenario/physical';
import { scenarioToSetup, setupToScenario } from '../app/scenario/scenario';
import { parseScenarioFile, scenarioFileText } from '../app/scenario/scenarioFile';
import { readScenarioHash, scenarioHash } from '../app/scenario/urlState';
import { coulombScaleMeV, parseModel } from '../solver/index';
import { errorOf } from './fixtures';

// The Coulomb scale of the finite-q modes rides in the scenario as the model's `coulomb`
// (public/notes.html#dispersion): typed in dimensionless units, derived in physical ones.

describe('the Coulomb scale in scenarios', () => {
  test('dimensionless: none until given; then written, read back, linked and saved', () => {
    expect(setupToScenario(DEMO_SETUP).coulomb).toBeUndefined();
    const setup = { ...DEMO_SETUP, coulomb: 2.5 };
    const scenario = setupToScenario(setup);
    expect(scenario.coulomb).toBe(2.5);
    expect(parseModel(scenario).coulomb).toBe(2.5);
    expect(scenarioToSetup(scenario).coulomb).toBe(2.5);
    expect(parseScenarioFile(scenarioFileText(setup), 'file').coulomb).toBe(2.5);
    const hash = scenarioHash(setup);
    expect(readScenarioHash(hash)?.coulomb).toBe(2.5);
  });

  test('physical: e^2/(4 pi eps0 eps_r l_B) from the field, checked when a file is read', () => {
    const physical = { ...DEFAULT_PHYSICAL, bPerpTesla: 9, epsilonR: 4.5 };
    const setup = derivedSetup({ ...DEMO_SETUP, physical });
    const scenario = setupToScenario(setup);
    expect(scenario.coulomb).toBe(coulombScaleMeV(9, 4.5));
    expect(scenario.coulomb).toBe(physicalScales(physical).coulombMeV);
    expect(scenarioToSetup(scenario).physical).toEqual(physical);
    // Left out, it follows from the field; a hand-edited value is refused.
    const without = { ...scenario };
    delete without.coulomb;
    expect(setupToScenario(scenarioToSetup(without)).coulomb).toBe(coulombScaleMeV(9, 4.5));
    const message = errorOf(() => scenarioToSetup({ ...scenario, coulomb: 1 }));
    expect(message).toContain('coulomb');
    expect(message).toContain('fourfold.physical');
  });
});
